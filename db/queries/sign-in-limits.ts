import 'server-only';
// Shared counters of sign-in attempts (table sign_in_limits), one row per hashed key with
// a fixed window. An attempt is reserved before the password is compared: the upsert
// below takes the row's lock, so parallel attempts are counted one after another and
// only the first `maxAttempts` in a window go on to bcrypt (ASVS 4.0.3 V2.2.1). A
// successful sign-in gives its reservation back. Times come from the database's clock,
// so every server process agrees on them.
import { and, eq, lt, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { signInLimits } from '@/db/schema';

export interface Limit {
  windowS: number;
  maxAttempts: number;
}

export interface Reservation {
  allowed: boolean;
  /** seconds until the window ends (what the visitor must wait when refused) */
  retryAfterS: number;
}

export async function reserveAttempt(keyHash: string, kind: 'email' | 'ip', limit: Limit): Promise<Reservation> {
  return db.transaction(async (tx) => {
    // Assignments run left to right: `attempts` is decided on the old expires_at, which
    // the second assignment then renews when the window had ended.
    await tx.execute(sql`
      INSERT INTO ${signInLimits} (key_hash, kind, attempts, expires_at)
      VALUES (${keyHash}, ${kind}, 1, NOW(3) + INTERVAL ${limit.windowS} SECOND)
      ON DUPLICATE KEY UPDATE
        attempts = IF(expires_at <= NOW(3), 1, attempts + 1),
        expires_at = IF(expires_at <= NOW(3), VALUES(expires_at), expires_at)`);
    const [row] = await tx
      .select({
        attempts: signInLimits.attempts,
        leftS: sql<number>`GREATEST(0, CEIL(TIMESTAMPDIFF(MICROSECOND, NOW(3), ${signInLimits.expiresAt}) / 1000000))`,
      })
      .from(signInLimits)
      .where(eq(signInLimits.keyHash, keyHash));
    return { allowed: row.attempts <= limit.maxAttempts, retryAfterS: Number(row.leftS) };
  });
}

/** Gives one reserved attempt back (a sign-in that succeeded, or one refused before any check). */
export async function releaseAttempt(keyHash: string): Promise<void> {
  await db
    .update(signInLimits)
    .set({ attempts: sql`GREATEST(${signInLimits.attempts} - 1, 0)` })
    .where(and(eq(signInLimits.keyHash, keyHash), sql`${signInLimits.expiresAt} > NOW(3)`));
}

/** Forgets a key (the e-mail's count after a successful sign-in). */
export async function clearAttempts(keyHash: string): Promise<void> {
  await db.delete(signInLimits).where(eq(signInLimits.keyHash, keyHash));
}

/** Removes windows that have ended; the timer in lib/auth/housekeeping.ts calls it. */
export async function purgeExpiredLimits(): Promise<number> {
  const [result] = await db.delete(signInLimits).where(lt(signInLimits.expiresAt, sql`NOW(3)`));
  return result.affectedRows;
}
