import 'server-only';
// next-auth configuration: one credentials provider (e-mail + password), a signed JWT
// carrying user id, shop id and the id of a user_sessions row, and our own sign-in page.
// The session callback, which every server-side read (getServerSession, so currentUser)
// and /api/auth/session go through, reads the session row and the user row together:
// an ended session (sign-out, disable, role or password change), one idle past
// SESSION_IDLE_MINUTES or older than SESSION_MAX_HOURS, or a disabled user gives no
// user at all (ASVS 4.0.3 V3.3.1, V3.3.2, V3.3.4).
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { createSession, endSession, readLiveSession } from '@/db/queries/sessions';
import { env } from '@/lib/env';
import { clientAddressFrom } from '@/lib/http/client-address';
import { startAuthHousekeeping } from './housekeeping';
import { safeCallbackPath, SIGN_IN_FAILED_MESSAGE, SIGN_IN_RATE_LIMITED_MESSAGE } from './messages';
import { sessionLimits } from './session-limits';
import { verifyCredentials } from './verify-credentials';
import './session-user';

// next-auth v4 builds its callback URLs from NEXTAUTH_URL; Kerfcast names it APP_URL.
process.env.NEXTAUTH_URL ??= env.APP_URL;

/** The token's own expiry; the session row holds the real limits. */
export const SESSION_MAX_AGE_S = sessionLimits.maxS;

startAuthHousekeeping();

/** Error codes only: next-auth's metadata can carry the failed query of a database error. */
function logCode(level: 'error' | 'warn', code: string, metadata?: unknown): void {
  const cause = (metadata as { error?: { code?: unknown; name?: unknown } } | undefined)?.error;
  const detail = cause ? String(cause.code ?? cause.name ?? '') : '';
  console[level](`[kerfcast] next-auth ${level}: ${code}${detail ? ` (${detail})` : ''}`);
}

export const authOptions: NextAuthOptions = {
  secret: env.AUTH_SECRET,
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_S },
  pages: { signIn: '/sign-in', error: '/sign-in' },
  logger: {
    error: (code, metadata) => logCode('error', code, metadata),
    warn: (code) => logCode('warn', code),
    debug: () => {},
  },
  providers: [
    CredentialsProvider({
      name: 'E-mail and password',
      credentials: {
        email: { label: 'E-mail', type: 'email' },
        password: { label: 'Password', type: 'password' },
      },
      async authorize(credentials, req) {
        const result = await verifyCredentials(
          { email: credentials?.email, password: credentials?.password },
          clientAddressFrom(req?.headers as Record<string, string | undefined> | undefined),
        );
        if (result.ok) {
          const { id, ...rest } = result.user;
          return { id: String(id), ...rest };
        }
        // A thrown message reaches the sign-in page as ?error=…; both are generic.
        throw new Error(result.reason === 'rate-limited' ? SIGN_IN_RATE_LIMITED_MESSAGE : SIGN_IN_FAILED_MESSAGE);
      },
    }),
  ],
  callbacks: {
    // Where next-auth sends the browser after sign-in and sign-out: this origin's app paths only.
    redirect({ url, baseUrl }) {
      let path: string | null = null;
      try {
        const target = new URL(url, baseUrl);
        if (target.origin === new URL(baseUrl).origin) path = url.startsWith('/') ? url : `${target.pathname}${target.search}`;
      } catch {
        path = null;
      }
      // Sign-out returns to the sign-in page, which safeCallbackPath keeps out of sign-in callbacks.
      if (path === '/sign-in') return new URL('/sign-in', baseUrl).toString();
      return new URL(safeCallbackPath(path), baseUrl).toString();
    },
    async jwt({ token, user }) {
      if (user) {
        token.uid = Number(user.id);
        token.shopId = user.shopId;
        token.role = user.role;
        token.sid = await createSession(user.shopId, Number(user.id));
      }
      return token;
    },
    async session({ session, token }) {
      const live =
        typeof token.uid === 'number' && typeof token.shopId === 'number' && typeof token.sid === 'string'
          ? await readLiveSession(token.sid, token.shopId, token.uid, sessionLimits)
          : null;
      if (!live) {
        // next-auth answers what this returns: a session without a user is a signed-out one.
        return { expires: session.expires } as typeof session;
      }
      session.user = live;
      return session;
    },
  },
  events: {
    async signOut({ token }) {
      if (typeof token?.sid === 'string') await endSession(token.sid);
    },
  },
};
