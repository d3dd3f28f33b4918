// Request checks of the local fakes (issue 18 finding 10; OWASP ASVS 4.0.3 V14.1). The
// fakes listen on loopback, but a web page in the developer's browser can still reach
// loopback: with a form post (no CORS preflight), or through DNS rebinding, where a name
// the page controls is pointed at 127.0.0.1 and its own script then reads the answer.
// So the fakes answer only:
// - a Host header naming loopback and their own port (a rebound name fails this);
// - requests without a browser's marks (Origin, Sec-Fetch-Site), since their clients are
//   the AWS SDK, nodemailer, scripts and tests, never a page;
// - for the S3 fake, writes (PUT, POST, DELETE) only when signed (an Authorization
//   header or a presigned URL's signature), and no form-encoded POST (S3's browser-upload
//   form); a plain read from a script (the service test lists the buckets) still works.
import type { IncomingHttpHeaders } from 'node:http';

const LOOPBACK_NAMES = ['127.0.0.1', 'localhost', '[::1]'];

export function hostIsLocal(host: string | undefined, port: number): boolean {
  if (!host) return false;
  return LOOPBACK_NAMES.some((name) => host.toLowerCase() === `${name}:${port}`);
}

/** Origin or Sec-Fetch-Site: a browser sends one of them; Node's fetch sends Sec-Fetch-Mode alone, so that one proves nothing. */
export function fromBrowser(headers: IncomingHttpHeaders): boolean {
  return headers.origin !== undefined || headers['sec-fetch-site'] !== undefined;
}

export interface FakeRequest {
  method?: string;
  url?: string;
  headers: IncomingHttpHeaders;
}

/** Why the mail capture's JSON API refuses the request, or null. */
export function mailApiRefusal(req: FakeRequest, port: number): string | null {
  if (!hostIsLocal(req.headers.host, port)) return 'host not allowed: use 127.0.0.1 or localhost with this port';
  if (fromBrowser(req.headers)) return 'browser requests are not served';
  return null;
}

const FORM_TYPES = ['multipart/form-data', 'application/x-www-form-urlencoded', 'text/plain'];

/** Why the S3 fake refuses the request, or null. */
export function s3Refusal(req: FakeRequest, port: number): string | null {
  const refusal = mailApiRefusal(req, port);
  if (refusal) return refusal;
  const type = String(req.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
  const auth = String(req.headers.authorization ?? '');
  const headerSigned = /^(AWS4-HMAC-SHA256|AWS) \S/.test(auth);
  // No S3 call the app makes posts a form body, so those two types are always refused. A
  // text/plain POST is the SDK's own when it carries an Authorization header, which a form
  // cannot: CreateMultipartUpload names the object's type (text/plain for a program). A form
  // may carry a query signature, and the fake's keys are public, so that does not count.
  const post = (req.method ?? 'GET').toUpperCase() === 'POST';
  if (post && FORM_TYPES.includes(type) && (type !== 'text/plain' || !headerSigned)) return 'form uploads are not served';
  if (['GET', 'HEAD'].includes((req.method ?? 'GET').toUpperCase())) return null;
  const query = new URL(req.url ?? '/', 'http://fake.invalid').searchParams;
  const signed = headerSigned || query.has('X-Amz-Signature') || query.has('Signature');
  if (!signed) return 'unsigned writes are not served';
  return null;
}
