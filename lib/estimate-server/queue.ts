// The estimate queue is the estimates table (issue 17): any server process claims pending
// rows with a locking read that skips rows another process is claiming at the same moment
// (SELECT … FOR UPDATE SKIP LOCKED, MariaDB 10.6+), marks them running with its owner name
// and a lease time, renews the lease while the work runs, and writes the result only while
// it still holds the lease, in one transaction. A process that dies leaves leases that run
// out; the next claim by any process takes such rows over. Times are the database's clock
// (NOW(3)), so processes on different hosts agree on when a lease has run out.
import { and, asc, eq, inArray, isNotNull, like, lt, or, sql } from 'drizzle-orm';
import type { Db } from '@/db/client';
import { estimates, jobEvents, machineVersions, programs, programVersions, type EstimateSettingsDoc } from '@/db/schema';
import type { EstimateTaskResult } from './task';

export interface ClaimedEstimate {
  id: number;
  shopId: number;
  jobId: number;
  programId: number;
  programVersion: number;
  objectKey: string;
  fileName: string;
  sha256: string;
  profile: unknown;
  settings: EstimateSettingsDoc;
  attempts: number;
}

const leaseEnd = (leaseMs: number) => sql`NOW(3) + INTERVAL ${Math.round(leaseMs * 1000)} MICROSECOND`;

/** The condition of a row any process may claim: queued, or running under a lease that has run out. */
const claimable = () => or(eq(estimates.status, 'pending'), and(eq(estimates.status, 'running'), lt(estimates.leaseUntil, sql`NOW(3)`)));

/**
 * Claims at most `limit` rows for `owner`, oldest first. Two processes claiming at once get
 * different rows: each one's locking read skips the rows the other has locked.
 */
export async function claimEstimates(db: Db, owner: string, limit: number, leaseMs: number): Promise<ClaimedEstimate[]> {
  if (limit <= 0) return [];
  const ids = await db.transaction(
    async (tx) => {
      const rows = await tx
        .select({ id: estimates.id })
        .from(estimates)
        .where(claimable())
        .orderBy(asc(estimates.id))
        .limit(limit)
        .for('update', { skipLocked: true });
      const found = rows.map((r) => r.id);
      if (found.length === 0) return found;
      await tx
        .update(estimates)
        .set({
          status: 'running',
          leaseOwner: owner,
          leaseUntil: leaseEnd(leaseMs),
          attempts: sql`${estimates.attempts} + 1`,
          progress: 0,
        })
        .where(inArray(estimates.id, found));
      return found;
    },
    // only the rows read are locked, no gaps: a request inserting a new row never waits on a claim
    { isolationLevel: 'read committed' },
  );
  if (ids.length === 0) return [];
  const rows = await db
    .select({
      id: estimates.id,
      shopId: estimates.shopId,
      jobId: programs.jobId,
      programId: estimates.programId,
      programVersion: estimates.programVersion,
      objectKey: programVersions.objectKey,
      fileName: programs.name,
      sha256: programVersions.sha256,
      profile: machineVersions.profile,
      settings: estimates.settings,
      attempts: estimates.attempts,
    })
    .from(estimates)
    .innerJoin(programVersions, and(eq(programVersions.id, estimates.programVersionId), eq(programVersions.shopId, estimates.shopId)))
    .innerJoin(programs, and(eq(programs.id, estimates.programId), eq(programs.shopId, estimates.shopId)))
    .leftJoin(machineVersions, and(eq(machineVersions.machineId, estimates.machineId), eq(machineVersions.version, estimates.machineVersion)))
    .where(and(inArray(estimates.id, ids), eq(estimates.leaseOwner, owner)))
    .orderBy(asc(estimates.id));
  return rows.map((r) => ({ ...r, profile: r.profile ?? null }));
}

/** Extends the leases `owner` holds on `ids`; answers the ids it still holds (a row taken over is missing). */
export async function renewLeases(db: Db, owner: string, ids: number[], leaseMs: number): Promise<number[]> {
  if (ids.length === 0) return [];
  const held = and(inArray(estimates.id, ids), eq(estimates.leaseOwner, owner), eq(estimates.status, 'running'));
  await db.update(estimates).set({ leaseUntil: leaseEnd(leaseMs) }).where(held);
  const rows = await db.select({ id: estimates.id }).from(estimates).where(held);
  return rows.map((r) => r.id);
}

export async function setProgress(db: Db, owner: string, id: number, progress: number): Promise<void> {
  await db
    .update(estimates)
    .set({ progress: Math.max(0, Math.min(1, progress)) })
    .where(and(eq(estimates.id, id), eq(estimates.leaseOwner, owner), eq(estimates.status, 'running')));
}

/** MariaDB ended this transaction to break a deadlock (ER_LOCK_DEADLOCK, 1213): it may simply be run again. */
export function isDeadlock(err: unknown): boolean {
  for (let e: unknown = err; e; e = (e as { cause?: unknown }).cause) {
    const { code, errno } = e as { code?: unknown; errno?: unknown };
    if (code === 'ER_LOCK_DEADLOCK' || errno === 1213) return true;
  }
  return false;
}

/** Runs `work` (one whole transaction) again when MariaDB chose it as a deadlock's victim, a few times. */
export async function retryDeadlocks<T>(work: () => Promise<T>, tries = 4): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await work();
    } catch (err) {
      if (attempt >= tries || !isDeadlock(err)) throw err;
      console.warn(`[kerfcast] estimate queue: MariaDB ended a transaction to break a deadlock; running it again (attempt ${attempt + 1} of ${tries})`);
      await new Promise((r) => setTimeout(r, 10 * attempt + Math.random() * 20));
    }
  }
}

/**
 * Stores the result, in one transaction with the job's history line, if `owner` still holds
 * the row. false: another process took it over (its lease ran out), and the result is dropped.
 * READ COMMITTED: the guarded UPDATE may be read through estimates_queue_idx (status, id),
 * and under REPEATABLE READ it then also locked the gap before the running rows, where a new
 * pending row goes. An upload holds its job's row lock while it inserts that pending row, and
 * the history line here needs a shared lock on the same job row (its foreign key): the two
 * waited on each other and MariaDB ended this one, losing a finished computation (seen with
 * two processes and uploads to the job meanwhile). Without the gap lock there is no cycle;
 * a deadlock of some other kind is run again rather than lost.
 */
export async function completeEstimate(db: Db, owner: string, claimed: ClaimedEstimate, result: EstimateTaskResult): Promise<boolean> {
  return retryDeadlocks(() => db.transaction(async (tx) => {
    const [update] = await tx
      .update(estimates)
      .set({
        status: 'done',
        progress: 1,
        error: null,
        computeMs: result.computeMs,
        totalSeconds: result.totalSeconds,
        calibratedSeconds: result.calibratedSeconds,
        errorCount: result.errorCount,
        warningCount: result.warningCount,
        infoCount: result.infoCount,
        partCount: result.partCount,
        reportKey: result.reportKey,
        leaseOwner: null,
        leaseUntil: null,
        finishedAt: sql`NOW()`,
      })
      .where(and(eq(estimates.id, claimed.id), eq(estimates.leaseOwner, owner), eq(estimates.status, 'running')));
    if (update.affectedRows !== 1) return false;
    await tx.insert(jobEvents).values({
      shopId: claimed.shopId,
      jobId: claimed.jobId,
      userId: null,
      kind: 'estimate-done',
      detail: `Estimate ${claimed.id} of ${claimed.fileName} v${claimed.programVersion}: ${result.totalSeconds.toFixed(1)} s, ${result.errorCount} errors, ${result.warningCount} warnings.`.slice(0, 500),
    });
    return true;
  }, { isolationLevel: 'read committed' }));
}

/** Stores the reason of a failed computation if `owner` still holds the row; a request for the same inputs retries it. */
export async function failEstimate(db: Db, owner: string, id: number, reason: string): Promise<boolean> {
  const [update] = await db
    .update(estimates)
    .set({ status: 'failed', error: reason.slice(0, 4000), leaseOwner: null, leaseUntil: null, finishedAt: sql`NOW()` })
    .where(and(eq(estimates.id, id), eq(estimates.leaseOwner, owner), eq(estimates.status, 'running')));
  return update.affectedRows === 1;
}

/** Puts rows `owner` holds back in the queue (a process stopping with work unfinished). */
export async function releaseEstimates(db: Db, owner: string, ids: number[]): Promise<void> {
  if (ids.length === 0) return;
  await db
    .update(estimates)
    .set({ status: 'pending', leaseOwner: null, leaseUntil: null, progress: 0 })
    .where(and(inArray(estimates.id, ids), eq(estimates.leaseOwner, owner), eq(estimates.status, 'running')));
}

/**
 * On start: rows still marked running by an earlier process on this host that no longer
 * lives (a restart) go back to the queue at once instead of waiting for their leases to run
 * out. Owners on other hosts are left to their leases: only they know whether they live.
 */
export async function requeueDeadLocalOwners(db: Db, host: string, ownOwner: string, isAlive: (pid: number) => boolean): Promise<number> {
  const prefix = `${host}:`;
  const owners = await db
    .selectDistinct({ owner: estimates.leaseOwner })
    .from(estimates)
    .where(and(eq(estimates.status, 'running'), isNotNull(estimates.leaseOwner), like(estimates.leaseOwner, `${escapeLike(prefix)}%`)));
  const dead = owners
    .map((o) => o.owner as string)
    .filter((owner) => {
      if (owner === ownOwner) return false;
      const pid = Number(owner.slice(prefix.length).split(':')[0]);
      // the same pid under another owner name is this process's earlier life (a container restart)
      return !Number.isInteger(pid) || pid === process.pid || !isAlive(pid);
    });
  if (dead.length === 0) return 0;
  const [update] = await db
    .update(estimates)
    .set({ status: 'pending', leaseOwner: null, leaseUntil: null, progress: 0 })
    .where(and(eq(estimates.status, 'running'), inArray(estimates.leaseOwner, dead)));
  return update.affectedRows;
}

function escapeLike(s: string): string {
  return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}
