import 'server-only';
// Users of a shop. Every function takes the shop id and filters by it, except the
// sign-in lookup: the shop is not known until the user is found. An e-mail is unique
// within a shop, not across Kerfcast, so an admin never learns that an address has an
// account elsewhere (issue 18, finding 9). Password hashes never leave this module
// except to the sign-in check.
//
// Changes that could leave a shop without an enabled admin (a role change, a disable)
// run in one transaction that first locks the shop's enabled admins with a locking read
// (SELECT … FOR UPDATE): two admins demoting each other at once are then counted one
// after the other, and the second change sees the first (ASVS 4.0.3 V4.1.3). Every such
// change, and a new password, ends the user's open sessions.
import { and, asc, eq } from 'drizzle-orm';
import bcrypt from 'bcryptjs';
import { db } from '@/db/client';
import { users, type Role } from '@/db/schema';
import { BCRYPT_ROUNDS, DUMMY_HASH } from '@/lib/auth/password-hashing';
import { assertUncommonPassword } from '@/lib/auth/password-policy';
import { AppError } from '@/lib/errors';
import type { CreateUserInput } from '@/lib/validation/users';
import { endUserSessions, type Executor } from './sessions';

const publicColumns = {
  id: users.id,
  shopId: users.shopId,
  email: users.email,
  name: users.name,
  role: users.role,
  disabled: users.disabled,
  mustChangePassword: users.mustChangePassword,
  createdAt: users.createdAt,
};

export type ShopUser = {
  id: number;
  shopId: number;
  email: string;
  name: string;
  role: Role;
  disabled: boolean;
  mustChangePassword: boolean;
  createdAt: Date;
};

/** sign-in compares the password with each account of the address; a handful at most */
const MAX_ACCOUNTS_PER_EMAIL = 10;

/** Every account of an e-mail, oldest first (one per shop at most). */
export async function findUsersForSignIn(email: string) {
  return db
    .select({ ...publicColumns, passwordHash: users.passwordHash })
    .from(users)
    .where(eq(users.email, email.trim().toLowerCase()))
    .orderBy(asc(users.id))
    .limit(MAX_ACCOUNTS_PER_EMAIL);
}

export async function getUser(shopId: number, userId: number): Promise<ShopUser | null> {
  const rows = await db
    .select(publicColumns)
    .from(users)
    .where(and(eq(users.shopId, shopId), eq(users.id, userId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function listUsers(shopId: number): Promise<ShopUser[]> {
  return db.select(publicColumns).from(users).where(eq(users.shopId, shopId)).orderBy(asc(users.name));
}

const EMAIL_TAKEN = 'This e-mail is already in use.';

/** mysql2's code for a unique key violation, wherever Drizzle wrapped it */
function isDuplicateKey(error: unknown): boolean {
  for (let e: unknown = error; e; e = (e as { cause?: unknown }).cause) {
    if ((e as { code?: unknown }).code === 'ER_DUP_ENTRY') return true;
  }
  return false;
}

export async function createUser(shopId: number, input: CreateUserInput): Promise<ShopUser> {
  assertUncommonPassword(input.password, 'password');
  // Only this shop's users: whether the address has an account elsewhere is not told.
  const existing = await db
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.shopId, shopId), eq(users.email, input.email)))
    .limit(1);
  if (existing.length > 0) throw new AppError('invalid:user', 'Some user fields are not right.', { email: [EMAIL_TAKEN] });
  const passwordHash = await bcrypt.hash(input.password, BCRYPT_ROUNDS);
  let id: number;
  try {
    [{ id }] = await db
      .insert(users)
      .values({ shopId, email: input.email, name: input.name, role: input.role, passwordHash })
      .$returningId();
  } catch (error) {
    // Two creates of one address at once: the unique key decides, the loser gets the field.
    if (isDuplicateKey(error)) throw new AppError('invalid:user', 'Some user fields are not right.', { email: [EMAIL_TAKEN] });
    throw error;
  }
  const created = await getUser(shopId, id);
  if (!created) throw new AppError('internal', 'The user was not saved.');
  return created;
}

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/**
 * Runs `change` on a user with the shop's enabled admins locked; refuses when the change
 * would leave fewer than one. `leavesAdmin` says whether the user is still an enabled
 * admin afterwards.
 */
async function withAdminsLocked<T>(
  shopId: number,
  userId: number,
  leavesAdmin: (user: ShopUser) => boolean,
  change: (tx: Tx, user: ShopUser) => Promise<T>,
): Promise<T> {
  return db.transaction(async (tx) => {
    const admins = await tx
      .select({ id: users.id })
      .from(users)
      .where(and(eq(users.shopId, shopId), eq(users.role, 'admin'), eq(users.disabled, false)))
      .for('update');
    const [user] = await tx
      .select(publicColumns)
      .from(users)
      .where(and(eq(users.shopId, shopId), eq(users.id, userId)))
      .for('update');
    if (!user) throw new AppError('not-found:user', 'No such user.');
    const isAdminNow = admins.some((a) => a.id === user.id);
    if (isAdminNow && !leavesAdmin(user) && admins.length - 1 < 1) {
      throw new AppError('conflict:last-admin', 'Your shop needs at least one enabled admin: make another user an admin first.', {
        role: ['Your shop needs at least one enabled admin.'],
      });
    }
    return change(tx, user);
  });
}

/** An admin may not change their own role, and no change may leave the shop without an admin. */
export async function changeUserRole(shopId: number, actorId: number, userId: number, role: Role): Promise<ShopUser> {
  if (userId === actorId) {
    const self = await getUser(shopId, userId);
    if (self && self.role !== role) {
      throw new AppError('forbidden:own-role', 'You cannot change your own role.', { role: ['You cannot change your own role.'] });
    }
  }
  return withAdminsLocked(
    shopId,
    userId,
    (user) => role === 'admin' && !user.disabled,
    async (tx, user) => {
      if (user.role === role) return user;
      await tx.update(users).set({ role }).where(and(eq(users.shopId, shopId), eq(users.id, userId)));
      await endUserSessions(shopId, userId, undefined, tx as Executor);
      return { ...user, role };
    },
  );
}

/** An admin may not disable themself, and no disable may leave the shop without an admin. */
export async function setUserDisabled(shopId: number, actorId: number, userId: number, disabled: boolean): Promise<ShopUser> {
  if (userId === actorId && disabled) {
    throw new AppError('forbidden:disable-self', 'You cannot disable your own account.', {
      disabled: ['You cannot disable your own account.'],
    });
  }
  return withAdminsLocked(
    shopId,
    userId,
    (user) => user.role === 'admin' && !disabled,
    async (tx, user) => {
      if (user.disabled === disabled) return user;
      await tx.update(users).set({ disabled }).where(and(eq(users.shopId, shopId), eq(users.id, userId)));
      // Ended now, so re-enabling the account later does not bring an old token back.
      await endUserSessions(shopId, userId, undefined, tx as Executor);
      return { ...user, disabled };
    },
  );
}

/** An admin sets a one-time password: every session of the user ends, and the next sign-in must choose a new one. */
export async function setOneTimePassword(shopId: number, actorId: number, userId: number, password: string): Promise<ShopUser> {
  if (userId === actorId) {
    throw new AppError('forbidden:own-password', 'Change your own password on the password page, with your current one.', {
      oneTimePassword: ['Change your own password on the password page.'],
    });
  }
  assertUncommonPassword(password, 'oneTimePassword');
  const user = await getUser(shopId, userId);
  if (!user) throw new AppError('not-found:user', 'No such user.');
  const passwordHash = await bcrypt.hash(password, BCRYPT_ROUNDS);
  await db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash, mustChangePassword: true }).where(and(eq(users.shopId, shopId), eq(users.id, userId)));
    await endUserSessions(shopId, userId, undefined, tx as Executor);
  });
  return { ...user, mustChangePassword: true };
}

/**
 * A user changes their own password, giving the current one; their other sessions end,
 * the one making the change (keepSessionId) goes on.
 */
export async function changeOwnPassword(
  shopId: number,
  userId: number,
  currentPassword: string,
  newPassword: string,
  keepSessionId: string | null,
): Promise<void> {
  const [row] = await db
    .select({ passwordHash: users.passwordHash })
    .from(users)
    .where(and(eq(users.shopId, shopId), eq(users.id, userId)))
    .limit(1);
  const currentOk = await bcrypt.compare(currentPassword, row?.passwordHash ?? DUMMY_HASH);
  if (!row || !currentOk) {
    throw new AppError('invalid:password', 'Some fields are not right.', { currentPassword: ['This is not your current password.'] });
  }
  assertUncommonPassword(newPassword, 'newPassword', 'password');
  const passwordHash = await bcrypt.hash(newPassword, BCRYPT_ROUNDS);
  await db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash, mustChangePassword: false }).where(and(eq(users.shopId, shopId), eq(users.id, userId)));
    await endUserSessions(shopId, userId, keepSessionId ?? undefined, tx as Executor);
  });
}
