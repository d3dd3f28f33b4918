// The signed-in user as the session gives it, plus the next-auth type augmentation that
// puts those fields on the session and the token.
import type { Role } from '@/lib/validation/enums';

export interface SessionUser {
  id: number;
  shopId: number;
  role: Role;
  name: string;
  email: string;
  /** signed in with a one-time password: only choosing a new one is allowed */
  mustChangePassword: boolean;
}

declare module 'next-auth' {
  interface Session {
    user: SessionUser;
  }
  interface User {
    shopId: number;
    role: Role;
    mustChangePassword: boolean;
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    uid?: number;
    shopId?: number;
    role?: Role;
    /** the user_sessions row of this sign-in */
    sid?: string;
  }
}
