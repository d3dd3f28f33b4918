// Next 16 proxy (formerly middleware): the optimistic sign-in check in front of every
// page and API route. Signed-out page visits go to /sign-in (returning afterwards);
// signed-out API calls get 401 JSON. Real authorization happens in requireRole on the
// server, which also re-reads the user; this only keeps strangers on the sign-in page.
import { NextResponse, type NextRequest } from 'next/server';
import { getToken } from 'next-auth/jwt';
import { env } from '@/lib/env';

const PUBLIC_PREFIXES = ['/sign-in', '/api/auth/'];

export async function proxy(request: NextRequest) {
  const { pathname, search } = request.nextUrl;
  const isPublic = PUBLIC_PREFIXES.some((p) => pathname === p || pathname.startsWith(p));
  const token = await getToken({ req: request, secret: env.AUTH_SECRET, secureCookie: env.APP_URL.startsWith('https://') });

  // /sign-in is not redirected away for a token holder: the token may belong to a user
  // disabled since, whom the page guard sends back here (a redirect would loop).
  if (token || isPublic) return NextResponse.next();

  if (pathname.startsWith('/api/')) {
    return NextResponse.json({ error: { code: 'unauthorized', message: 'Sign in to continue.' } }, { status: 401 });
  }
  const signIn = new URL('/sign-in', request.url);
  if (pathname !== '/') signIn.searchParams.set('callbackUrl', `${pathname}${search}`);
  return NextResponse.redirect(signIn);
}

export const config = {
  // Static assets, shipped fonts and the favicon need no session.
  matcher: ['/((?!_next/static|_next/image|fonts/|favicon.ico|icon.svg|robots.txt).*)'],
};
