// The cross-site write check of every state-changing route handler (POST, PUT, PATCH,
// DELETE; lib/http/route.ts runs it before the handler). SameSite=Lax cookies do not
// stop a page on a sibling site, and a plain HTML form may post text/plain, so
// (ASVS 4.0.3 V13.2.5, V4.2.2):
// - Sec-Fetch-Site, when the browser sends it, must be "same-origin";
// - Origin, when sent, must be the app's own: APP_URL's origin, or the request's own
//   host when that host is a loopback address (localhost and 127.0.0.1 are the same app);
// - a body must be application/json or multipart/form-data (uploads): the two types a
//   cross-site form cannot send without the browser asking first (CORS preflight).
// A request with neither header is not from a browser (scripts, the CLI, tests): no
// cookie of a visitor rides on it, so it is left to the usual session check.
import { AppError } from '@/lib/errors';

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
const BODY_TYPES = new Set(['application/json', 'multipart/form-data']);

function isLoopbackHostHeader(host: string): boolean {
  const name = host.replace(/:\d+$/, '').replace(/^\[|\]$/g, '').toLowerCase();
  return name === 'localhost' || name === '::1' || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(name);
}

/** The AppError to answer with, or null when the request may go on. */
export function crossSiteWriteError(request: Request, appUrl: string): AppError | null {
  if (!STATE_CHANGING.has(request.method.toUpperCase())) return null;
  const app = new URL(appUrl);
  const own = new Set([app.origin]);
  const host = request.headers.get('host');
  if (host && isLoopbackHostHeader(host)) own.add(`${app.protocol}//${host.toLowerCase()}`);

  const site = request.headers.get('sec-fetch-site');
  const origin = request.headers.get('origin');
  if ((site !== null && site !== 'same-origin') || (origin !== null && !own.has(origin.toLowerCase()))) {
    return new AppError('forbidden:origin', 'This change was sent from another site, so it was refused. Make it on Kerfcast itself.');
  }

  const type = (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
  const length = request.headers.get('content-length');
  const hasBody = type !== '' || (length !== null && length.trim() !== '0') || request.headers.has('transfer-encoding');
  if (hasBody && !BODY_TYPES.has(type)) {
    return new AppError('unsupported:content-type', 'Send the body as application/json (or multipart/form-data for an upload).');
  }
  return null;
}
