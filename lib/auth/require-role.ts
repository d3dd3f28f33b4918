import 'server-only';
// The one guard at the top of every route handler and server action. It reads the
// JWT session, then the user row itself (so a disabled account or a changed role
// counts at once), and returns the user or throws the typed error: unauthorized
// (401) when signed out or disabled, forbidden:<what> (403) for a role the table in
// roles.ts does not allow.
import { getServerSession } from 'next-auth';
import { getUser } from '@/db/queries/users';
import { AppError } from '@/lib/errors';
import type { Role } from '@/lib/validation/enums';
import { authOptions } from './options';
import { ACTIONS, type Action } from './roles';
import type { SessionUser } from './session-user';

export async function currentUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  const claimed = session?.user;
  if (!claimed || typeof claimed.id !== 'number' || typeof claimed.shopId !== 'number') return null;
  const row = await getUser(claimed.shopId, claimed.id);
  if (!row || row.disabled) return null;
  return { id: row.id, shopId: row.shopId, role: row.role, name: row.name, email: row.email };
}

export async function requireRole(roles: readonly Role[], what = 'page'): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw new AppError('unauthorized', 'Sign in to continue.');
  if (!roles.includes(user.role)) throw new AppError(`forbidden:${what}`, 'Your role does not allow this.');
  return user;
}

const SUBJECT: Record<string, string> = { jobs: 'job', machines: 'machine', customers: 'customer', users: 'user', programs: 'program', estimates: 'estimate', materials: 'material' };

/** requireRole with the roles looked up in the table, e.g. requireAction('jobs:write'). */
export function requireAction(action: Action): Promise<SessionUser> {
  const resource = action.split(':')[0];
  return requireRole(ACTIONS[action], SUBJECT[resource] ?? resource);
}
