// next-auth's endpoints (csrf, credentials callback, session, sign-out).
import NextAuth from 'next-auth';
import { authOptions } from '@/lib/auth/options';

const handler = NextAuth(authOptions);

export { handler as GET, handler as POST };
