// The signed-in user as the JWT session carries it, plus the next-auth type
// augmentation that puts those fields on the session and the token.
import type { Role } from '@/lib/validation/enums';

export interface SessionUser {
  id: number;
  shopId: number;
  role: Role;
  name: string;
  email: string;
}

declare module 'next-auth' {
  interface Session {
    user: SessionUser;
  }
  interface User {
    shopId: number;
    role: Role;
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    uid?: number;
    shopId?: number;
    role?: Role;
  }
}
