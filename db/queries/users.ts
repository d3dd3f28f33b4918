import 'server-only';
// Users of a shop. Every function takes the shop id and filters by it, except the
// sign-in lookup: an e-mail is unique across Kerfcast, and the shop is not known
// until the user is found. Password hashes never leave this module except to the
// sign-in check.
import { and, asc, eq } from 'drizzle-orm';
import bcrypt from 'bcryptjs';
import { db } from '@/db/client';
import { users, type Role } from '@/db/schema';
import { BCRYPT_ROUNDS } from '@/lib/auth/password-hashing';
import { AppError } from '@/lib/errors';
import type { CreateUserInput } from '@/lib/validation/users';


const publicColumns = {
  id: users.id,
  shopId: users.shopId,
  email: users.email,
  name: users.name,
  role: users.role,
  disabled: users.disabled,
  createdAt: users.createdAt,
};

export type ShopUser = { id: number; shopId: number; email: string; name: string; role: Role; disabled: boolean; createdAt: Date };

export async function findUserForSignIn(email: string) {
  const rows = await db
    .select({ ...publicColumns, passwordHash: users.passwordHash })
    .from(users)
    .where(eq(users.email, email.trim().toLowerCase()))
    .limit(1);
  return rows[0] ?? null;
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

export async function createUser(shopId: number, input: CreateUserInput): Promise<ShopUser> {
  const existing = await db.select({ id: users.id }).from(users).where(eq(users.email, input.email)).limit(1);
  if (existing.length > 0) {
    throw new AppError('invalid:user', 'Some user fields are not right.', { email: ['This e-mail is already in use.'] });
  }
  const passwordHash = await bcrypt.hash(input.password, BCRYPT_ROUNDS);
  const [{ id }] = await db
    .insert(users)
    .values({ shopId, email: input.email, name: input.name, role: input.role, passwordHash })
    .$returningId();
  const created = await getUser(shopId, id);
  if (!created) throw new AppError('internal', 'The user was not saved.');
  return created;
}

async function mustGet(shopId: number, userId: number): Promise<ShopUser> {
  const user = await getUser(shopId, userId);
  if (!user) throw new AppError('not-found:user', 'No such user.');
  return user;
}

/** An admin may not change their own role: the shop could be left without an admin. */
export async function changeUserRole(shopId: number, actorId: number, userId: number, role: Role): Promise<ShopUser> {
  const user = await mustGet(shopId, userId);
  if (user.id === actorId && role !== user.role) {
    throw new AppError('forbidden:own-role', 'You cannot change your own role.', { role: ['You cannot change your own role.'] });
  }
  await db.update(users).set({ role }).where(and(eq(users.shopId, shopId), eq(users.id, userId)));
  return { ...user, role };
}

/** An admin may not disable themself, for the same reason. */
export async function setUserDisabled(shopId: number, actorId: number, userId: number, disabled: boolean): Promise<ShopUser> {
  const user = await mustGet(shopId, userId);
  if (user.id === actorId && disabled) {
    throw new AppError('forbidden:disable-self', 'You cannot disable your own account.', {
      disabled: ['You cannot disable your own account.'],
    });
  }
  await db.update(users).set({ disabled }).where(and(eq(users.shopId, shopId), eq(users.id, userId)));
  return { ...user, disabled };
}
