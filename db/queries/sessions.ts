import 'server-only';
// Signed-in sessions (table user_sessions). The token carries the row's id; a session is
// live while its row is not ended, it was seen within the idle limit and it began within
// the absolute limit (ASVS 4.0.3 V3.3.1, V3.3.2), and its user is enabled. Ending every
// session of a user (disable, role change, password change) is one UPDATE, so it holds
// in every server process at once.
import { randomBytes } from 'node:crypto';
import { and, eq, isNull, lt, ne, or, sql } from 'drizzle-orm';
import { db, type Db } from '@/db/client';
import { userSessions, users, type Role } from '@/db/schema';

export interface SessionLimits {
  idleS: number;
  maxS: number;
}

/** the database or an open transaction (a role change ends sessions in its own transaction) */
export type Executor = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

/** a session is marked as seen at most this often, so reads do not all write */
const TOUCH_EVERY_S = 30;

export async function createSession(shopId: number, userId: number): Promise<string> {
  const id = randomBytes(16).toString('hex');
  await db.insert(userSessions).values({ id, shopId, userId });
  return id;
}

export interface LiveSessionUser {
  id: number;
  shopId: number;
  role: Role;
  name: string;
  email: string;
  mustChangePassword: boolean;
}

/** The user of a live session, or null; marks the session as seen. */
export async function readLiveSession(sessionId: string, shopId: number, userId: number, limits: SessionLimits): Promise<LiveSessionUser | null> {
  const rows = await db
    .select({
      id: users.id,
      shopId: users.shopId,
      role: users.role,
      name: users.name,
      email: users.email,
      mustChangePassword: users.mustChangePassword,
      sinceSeenS: sql<number>`TIMESTAMPDIFF(SECOND, ${userSessions.lastSeenAt}, NOW())`,
    })
    .from(userSessions)
    .innerJoin(users, eq(users.id, userSessions.userId))
    .where(
      and(
        eq(userSessions.id, sessionId),
        eq(userSessions.userId, userId),
        eq(users.shopId, shopId),
        eq(users.disabled, false),
        isNull(userSessions.endedAt),
        sql`${userSessions.lastSeenAt} > NOW() - INTERVAL ${limits.idleS} SECOND`,
        sql`${userSessions.createdAt} > NOW() - INTERVAL ${limits.maxS} SECOND`,
      ),
    )
    .limit(1);
  const row = rows[0];
  if (!row) return null;
  if (Number(row.sinceSeenS) >= TOUCH_EVERY_S) {
    await db.update(userSessions).set({ lastSeenAt: sql`NOW()` }).where(eq(userSessions.id, sessionId));
  }
  const { sinceSeenS: _seen, ...user } = row;
  return user;
}

export async function endSession(sessionId: string): Promise<void> {
  await db.update(userSessions).set({ endedAt: sql`NOW()` }).where(and(eq(userSessions.id, sessionId), isNull(userSessions.endedAt)));
}

/** Ends every session of a user, except `keep` (the session changing its own password). */
export async function endUserSessions(shopId: number, userId: number, keep?: string, exec: Executor = db): Promise<void> {
  await exec
    .update(userSessions)
    .set({ endedAt: sql`NOW()` })
    .where(
      and(
        eq(userSessions.shopId, shopId),
        eq(userSessions.userId, userId),
        isNull(userSessions.endedAt),
        keep ? ne(userSessions.id, keep) : undefined,
      ),
    );
}

/** Deletes sessions that can no longer be live; the timer in lib/auth/housekeeping.ts calls it. */
export async function purgeDeadSessions(limits: SessionLimits): Promise<number> {
  const [result] = await db
    .delete(userSessions)
    .where(
      or(
        lt(userSessions.lastSeenAt, sql`NOW() - INTERVAL ${limits.idleS} SECOND`),
        lt(userSessions.createdAt, sql`NOW() - INTERVAL ${limits.maxS} SECOND`),
        sql`${userSessions.endedAt} < NOW() - INTERVAL 1 DAY`,
      ),
    );
  return result.affectedRows;
}
