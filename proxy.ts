// Next 16 proxy (formerly middleware), in front of every page (not the API, not static
// files; see the matcher). Two jobs:
// - The optimistic sign-in check: signed-out page visits go to /sign-in (returning
//   afterwards). Real authorization happens in requireRole on the server, which also
//   re-reads the user; this only keeps strangers on the sign-in page.
// - The per-request CSP nonce: a fresh random nonce goes into the Content-Security-Policy
//   of the request, where Next.js finds it and puts it on the inline scripts it writes
//   for hydration, and of the response (lib/http/security-headers.mjs), so no
//   'unsafe-inline' is needed. Pages must therefore render per request (app/layout.tsx).
import { NextResponse, type NextRequest } from 'next/server';
import { getToken } from 'next-auth/jwt';
import { env } from '@/lib/env';
import { isHttpsUrl, securityHeaders } from '@/lib/http/security-headers.mjs';

// /q/: the customer's quote page, opened from the e-mailed link without an account
const PUBLIC_PREFIXES = ['/sign-in', '/q/'];

// 128 random bits, base64: CSP Level 3 (its security considerations on nonces) asks for
// at least 128 bits from a secure generator, new for every response.
function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}

function withHeaders(response: NextResponse, headers: [string, string][]): NextResponse {
  for (const [name, value] of headers) response.headers.set(name, value);
  return response;
}

export async function proxy(request: NextRequest) {
  const { pathname, search } = request.nextUrl;
  const https = isHttpsUrl(env.APP_URL);
  const headers = securityHeaders({ nonce: newNonce(), https, dev: env.NODE_ENV === 'development' });
  const isPublic = PUBLIC_PREFIXES.some((p) => pathname === p || pathname.startsWith(p));
  const token = await getToken({ req: request, secret: env.AUTH_SECRET, secureCookie: https });

  // /sign-in is not redirected away for a token holder: the token may belong to a user
  // disabled since, whom the page guard sends back here (a redirect would loop).
  if (token || isPublic) {
    const requestHeaders = new Headers(request.headers);
    requestHeaders.set('content-security-policy', headers[0][1]);
    return withHeaders(NextResponse.next({ request: { headers: requestHeaders } }), headers);
  }

  const signIn = new URL('/sign-in', request.url);
  if (pathname !== '/') signIn.searchParams.set('callbackUrl', `${pathname}${search}`);
  return withHeaders(NextResponse.redirect(signIn), headers);
}

export const config = {
  // Not the API: Next.js reads and buffers the whole request body of every POST the
  // proxy sees (up to 10 MB, cutting off the rest), which would defeat the streamed
  // body limit of lib/http/route.ts and truncate large uploads. Route handlers guard
  // themselves with requireRole (401 JSON when signed out); next-auth's own routes are
  // public. Static assets, shipped fonts and the favicon need neither a session nor a
  // nonce. All of these still get the security headers, from next.config.mjs.
  matcher: ['/((?!api/|_next/static|_next/image|fonts/|favicon.ico|icon.svg|robots.txt).*)'],
};
