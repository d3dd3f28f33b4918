import 'server-only';
// The one guard at the top of every route handler and server action. It reads the
// session, which the next-auth session callback (options.ts) has checked against the
// session row and the user row, so a disabled account, an ended session or a changed
// role counts at once; then it returns the user or throws the typed error:
// unauthorized (401) when signed out, forbidden:password-change (403) while a one-time
// password has not been replaced yet, forbidden:<what> (403) for a role the table in
// roles.ts does not allow.
import { cookies } from 'next/headers';
import { getServerSession } from 'next-auth';
import { decode } from 'next-auth/jwt';
import { env } from '@/lib/env';
import { AppError } from '@/lib/errors';
import type { Role } from '@/lib/validation/enums';
import { authOptions } from './options';
import { ACTIONS, type Action } from './roles';
import type { SessionUser } from './session-user';

export async function currentUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  const user = session?.user;
  if (!user || typeof user.id !== 'number' || typeof user.shopId !== 'number') return null;
  return user;
}

/** The id of the user_sessions row behind this request's token (to keep it when others end). */
export async function currentSessionId(): Promise<string | null> {
  const jar = await cookies();
  const token = jar.get('__Secure-next-auth.session-token')?.value ?? jar.get('next-auth.session-token')?.value;
  if (!token) return null;
  const decoded = await decode({ token, secret: env.AUTH_SECRET }).catch(() => null);
  return typeof decoded?.sid === 'string' ? decoded.sid : null;
}

export const PASSWORD_CHANGE_FIRST = 'Choose a new password before going on: your password was set by an admin for one sign-in.';

export interface GuardOptions {
  /** the password change itself: open to a user who must still replace a one-time password */
  duringPasswordChange?: boolean;
}

export async function requireRole(roles: readonly Role[], what = 'page', options: GuardOptions = {}): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw new AppError('unauthorized', 'Sign in to continue.');
  if (user.mustChangePassword && !options.duringPasswordChange) throw new AppError('forbidden:password-change', PASSWORD_CHANGE_FIRST);
  if (!roles.includes(user.role)) throw new AppError(`forbidden:${what}`, 'Your role does not allow this.');
  return user;
}

/**
 * The subject of an action's forbidden:<subject> code, derived from the action's name: its
 * resource in the singular ('jobs:write' → 'job', 'shop:write' → 'shop'), so a new resource in
 * the table needs no second edit here.
 */
function subjectOf(action: Action): string {
  const resource = action.slice(0, action.indexOf(':'));
  return resource.endsWith('s') ? resource.slice(0, -1) : resource;
}

/** requireRole with the roles looked up in the table, e.g. requireAction('jobs:write'). */
export function requireAction(action: Action): Promise<SessionUser> {
  return requireRole(ACTIONS[action], subjectOf(action));
}
