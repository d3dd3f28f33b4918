import 'server-only';
// next-auth configuration: one credentials provider (e-mail + password), a JWT
// session carrying user id, shop id and role, and our own sign-in page. The session
// lasts one long shift; requireRole re-reads the user on every request, so a
// disabled user or a changed role takes effect at once, not when the token expires.
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { env } from '@/lib/env';
import { SIGN_IN_FAILED_MESSAGE, SIGN_IN_RATE_LIMITED_MESSAGE } from './messages';
import { clientIp, verifyCredentials } from './verify-credentials';
import './session-user';

// next-auth v4 builds its callback URLs from NEXTAUTH_URL; Kerfcast names it APP_URL.
process.env.NEXTAUTH_URL ??= env.APP_URL;

export const SESSION_MAX_AGE_S = 12 * 60 * 60;

export const authOptions: NextAuthOptions = {
  secret: env.AUTH_SECRET,
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_S },
  pages: { signIn: '/sign-in', error: '/sign-in' },
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
          clientIp(req?.headers as Record<string, string | undefined> | undefined),
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
    async jwt({ token, user }) {
      if (user) {
        token.uid = Number(user.id);
        token.shopId = user.shopId;
        token.role = user.role;
      }
      return token;
    },
    async session({ session, token }) {
      if (token.uid !== undefined && token.shopId !== undefined && token.role !== undefined) {
        session.user = {
          id: token.uid,
          shopId: token.shopId,
          role: token.role,
          name: token.name ?? '',
          email: token.email ?? '',
        };
      }
      return session;
    },
  },
};
