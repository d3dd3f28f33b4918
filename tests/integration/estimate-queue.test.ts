// The estimate queue's SQL (lib/estimate-server/queue.ts) against the real MariaDB, in a
// scratch database of its own so no running app server claims the rows under test. Two
// pools stand for two server processes. What the queue must guarantee (issue 17): a locking
// read that skips locked rows (MariaDB: SELECT … FOR UPDATE SKIP LOCKED, 10.6+) gives two
// claimers disjoint rows; a lease that ran out is taken over; a result is stored only by the
// process that still holds the row; rows of a stopped process on this host are queued again.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import os from 'node:os';
import { eq, inArray, sql } from 'drizzle-orm';
import { runMigrations } from '@/db/migrate';
import * as s from '@/db/schema';
import { ENGINE_VERSION } from '@/lib/kinematics/version';
import { claimEstimates, completeEstimate, failEstimate, renewLeases, requeueDeadLocalOwners } from '@/lib/estimate-server/queue';
import { jobEstimateSettings, requestEstimate } from '@/lib/estimate-server';
import { connectTestDb, createScratchDatabase, type ScratchDatabase, type TestDb } from './support/db';
import { addProgramVersion, createEstimateShop, type EstimateShop, type StoredProgram } from './support/estimates';

let scratch: ScratchDatabase;
let one: TestDb;
let two: TestDb;
let shop: EstimateShop;
let program: StoredProgram;
let keyCounter = 0;

const HOST = os.hostname();

async function addPending(n: number): Promise<number[]> {
  const ids: number[] = [];
  for (let i = 0; i < n; i++) {
    const [{ id }] = await one.db
      .insert(s.estimates)
      .values({
        shopId: shop.shopId,
        programId: program.programId,
        programVersionId: program.programVersionId,
        programVersion: program.version,
        machineId: shop.machineId,
        machineVersion: 1,
        engineVersion: ENGINE_VERSION,
        inputKey: (++keyCounter).toString(16).padStart(64, '0'),
        settings: jobEstimateSettings(shop.job),
      })
      .$returningId();
    ids.push(id);
  }
  return ids;
}

async function clearQueue() {
  await one.db.delete(s.jobEvents);
  await one.db.delete(s.estimates);
}

beforeAll(async () => {
  scratch = await createScratchDatabase();
  await runMigrations(scratch.url);
  one = connectTestDb(scratch.url);
  two = connectTestDb(scratch.url);
  shop = await createEstimateShop(one.db, 'queue');
  program = await addProgramVersion(one.db, shop, 'queue-test.nc', Buffer.from('G21\nG0 X10 Y10\nM30\n'), { store: false });
});

afterAll(async () => {
  await one?.close();
  await two?.close();
  await scratch?.drop();
});

describe('the server runs a MariaDB with SKIP LOCKED', () => {
  it('is MariaDB 10.6 or later (SKIP LOCKED arrived in 10.6, MariaDB Knowledge Base "SELECT … SKIP LOCKED")', async () => {
    const [rows] = await one.pool.query('SELECT VERSION() AS v');
    const version = String((rows as { v: string }[])[0].v);
    const [major, minor] = version.split('.').map(Number);
    expect(version).toMatch(/MariaDB/i);
    expect(major * 100 + minor).toBeGreaterThanOrEqual(1006);
  });
});

describe('claiming', () => {
  it('skips the rows another open claim holds: two claimers get disjoint rows', async () => {
    await clearQueue();
    const ids = await addPending(6);
    // process one holds two rows in an open transaction, as in the middle of its claim
    const conn = await one.pool.getConnection();
    try {
      await conn.query('SET SESSION TRANSACTION ISOLATION LEVEL READ COMMITTED');
      await conn.beginTransaction();
      const [held] = await conn.query(
        "SELECT id FROM estimates WHERE status = 'pending' ORDER BY id LIMIT 2 FOR UPDATE SKIP LOCKED",
      );
      const heldIds = (held as { id: number }[]).map((r) => r.id);
      expect(heldIds).toEqual(ids.slice(0, 2));
      // process two claims meanwhile and neither waits nor gets the held rows
      const claimed = await claimEstimates(two.db, 'proc-two', 10, 30_000);
      expect(claimed.map((c) => c.id)).toEqual(ids.slice(2));
      await conn.rollback();
    } finally {
      conn.release();
    }
    // the two rows come free when the first transaction ends
    const rest = await claimEstimates(one.db, 'proc-one', 10, 30_000);
    expect(rest.map((c) => c.id)).toEqual(ids.slice(0, 2));
  });

  it('never hands one row to two processes claiming at the same time', async () => {
    await clearQueue();
    const ids = await addPending(60);
    const got: Record<string, number[]> = { a: [], b: [] };
    const drain = async (name: 'a' | 'b', db: TestDb) => {
      for (;;) {
        const claimed = await claimEstimates(db.db, `proc-${name}`, 3, 30_000);
        if (claimed.length === 0) return;
        got[name].push(...claimed.map((c) => c.id));
      }
    };
    await Promise.all([drain('a', one), drain('b', two), drain('a', one), drain('b', two)]);
    const all = [...got.a, ...got.b];
    expect(new Set(all).size).toBe(all.length);
    expect([...all].sort((x, y) => x - y)).toEqual(ids);
    // each claim marked its rows with its owner and counted the attempt
    const rows = await one.db.select().from(s.estimates).where(inArray(s.estimates.id, got.a));
    expect(rows.every((r) => r.status === 'running' && r.leaseOwner === 'proc-a' && r.attempts === 1)).toBe(true);
  });

  it('claims no more rows than asked for (a pool with that many free threads)', async () => {
    await clearQueue();
    await addPending(5);
    expect(await claimEstimates(one.db, 'proc-one', 2, 30_000)).toHaveLength(2);
    expect(await claimEstimates(one.db, 'proc-one', 0, 30_000)).toHaveLength(0);
  });

  it('hands the worker what it needs: the object, the file name, the hash, the frozen profile and settings', async () => {
    await clearQueue();
    // through requestEstimate, so the machine version's snapshot is written as in the app
    const requested = await one.db.transaction((tx) =>
      requestEstimate(tx, {
        shopId: shop.shopId,
        programId: program.programId,
        programVersionId: program.programVersionId,
        programVersion: program.version,
        sha256: program.sha256,
        machineId: shop.machineId,
        requestedBy: null,
        settings: jobEstimateSettings(shop.job),
      }),
    );
    const [claimed] = await claimEstimates(one.db, 'proc-one', 1, 30_000);
    expect(claimed.id).toBe(requested.id);
    expect(claimed.objectKey).toBe(program.objectKey);
    expect(claimed.fileName).toBe('queue-test.nc');
    expect(claimed.sha256).toBe(program.sha256);
    expect(claimed.jobId).toBe(shop.jobId);
    expect(claimed.profile).toEqual(shop.profile);
    // the machine's own vacuum level is frozen with the job's settings (the hold-down comparison); this machine names none
    expect(claimed.settings).toEqual({ sheet: { widthMm: 2440, lengthMm: 1220, thicknessMm: 18 }, zero: 'top', hold: 'vacuum', vacuumKpa: 61, machineVacuumKpa: null });
  });
});

describe('leases', () => {
  it('takes over a row whose lease ran out, and leaves one whose lease runs', async () => {
    await clearQueue();
    const [expired, live] = await addPending(2);
    await one.db.execute(sql`UPDATE estimates SET status = 'running', lease_owner = 'gone-host:1:dead', lease_until = NOW(3) - INTERVAL 1 SECOND, attempts = 1 WHERE id = ${expired}`);
    await one.db.execute(sql`UPDATE estimates SET status = 'running', lease_owner = 'other-host:2:live', lease_until = NOW(3) + INTERVAL 10 MINUTE, attempts = 1 WHERE id = ${live}`);
    const claimed = await claimEstimates(two.db, 'proc-two', 5, 30_000);
    expect(claimed.map((c) => c.id)).toEqual([expired]);
    const [row] = await one.db.select().from(s.estimates).where(eq(s.estimates.id, expired));
    expect(row.leaseOwner).toBe('proc-two');
    expect(row.attempts).toBe(2);
    const [untouched] = await one.db.select().from(s.estimates).where(eq(s.estimates.id, live));
    expect(untouched.leaseOwner).toBe('other-host:2:live');
  });

  it('stores a result only for the process that still holds the row', async () => {
    await clearQueue();
    const [id] = await addPending(1);
    const [first] = await claimEstimates(one.db, 'slow-proc', 1, 30_000);
    // the slow process's lease runs out and another process takes the row over
    await one.db.execute(sql`UPDATE estimates SET lease_until = NOW(3) - INTERVAL 1 SECOND WHERE id = ${id}`);
    const [second] = await claimEstimates(two.db, 'fast-proc', 1, 30_000);
    expect(second.id).toBe(id);
    // the slow one finds out when it renews, and cannot store its result
    expect(await renewLeases(one.db, 'slow-proc', [id], 30_000)).toEqual([]);
    const result = { ok: true as const, reportKey: 'k', reportBytes: 1, computeMs: 5, phasesMs: { read: 1, engine: 3, store: 1 }, totalSeconds: 12.5, calibratedSeconds: 12.5, errorCount: 0, warningCount: 1, infoCount: 2, partCount: 3 };
    expect(await completeEstimate(one.db, 'slow-proc', first, result)).toBe(false);
    expect(await failEstimate(one.db, 'slow-proc', id, 'late')).toBe(false);
    expect(await renewLeases(two.db, 'fast-proc', [id], 30_000)).toEqual([id]);
    expect(await completeEstimate(two.db, 'fast-proc', second, { ...result, totalSeconds: 13 })).toBe(true);
    const [row] = await one.db.select().from(s.estimates).where(eq(s.estimates.id, id));
    expect(row).toMatchObject({ status: 'done', totalSeconds: 13, leaseOwner: null, leaseUntil: null, progress: 1, partCount: 3 });
    // the job's history names the finished estimate once
    const events = await one.db.select().from(s.jobEvents).where(eq(s.jobEvents.jobId, shop.jobId));
    expect(events.filter((e) => e.kind === 'estimate-done')).toHaveLength(1);
  });

  it('queues again, at start, what an earlier process on this host left running; another host\'s rows wait for their lease', async () => {
    await clearQueue();
    const [deadLocal, earlierLife, otherHost, mine] = await addPending(4);
    const set = (id: number, owner: string) =>
      one.db.execute(sql`UPDATE estimates SET status = 'running', lease_owner = ${owner}, lease_until = NOW(3) + INTERVAL 10 MINUTE WHERE id = ${id}`);
    await set(deadLocal, `${HOST}:999999:aaaa`);
    await set(earlierLife, `${HOST}:${process.pid}:bbbb`);
    await set(otherHost, `not-${HOST}:999999:cccc`);
    await set(mine, `${HOST}:${process.pid}:mine`);
    const n = await requeueDeadLocalOwners(one.db, HOST, `${HOST}:${process.pid}:mine`, (pid) => pid !== 999999);
    expect(n).toBe(2);
    const rows = new Map((await one.db.select().from(s.estimates)).map((r) => [r.id, r]));
    expect(rows.get(deadLocal)).toMatchObject({ status: 'pending', leaseOwner: null });
    expect(rows.get(earlierLife)).toMatchObject({ status: 'pending', leaseOwner: null });
    expect(rows.get(otherHost)).toMatchObject({ status: 'running', leaseOwner: `not-${HOST}:999999:cccc` });
    expect(rows.get(mine)).toMatchObject({ status: 'running' });
  });
});

describe('requesting', () => {
  it('finds the stored row for the same inputs and queues a failed one again', async () => {
    await clearQueue();
    const req = {
      shopId: shop.shopId,
      programId: program.programId,
      programVersionId: program.programVersionId,
      programVersion: program.version,
      sha256: program.sha256,
      machineId: shop.machineId,
      requestedBy: null,
      settings: jobEstimateSettings(shop.job),
    };
    const first = await one.db.transaction((tx) => requestEstimate(tx, req));
    expect(first).toMatchObject({ status: 'pending', created: true, requeued: false });
    const again = await one.db.transaction((tx) => requestEstimate(tx, req));
    expect(again).toEqual({ id: first.id, status: 'pending', created: false, requeued: false });
    // a different job setting is a different estimate
    const clamps = await one.db.transaction((tx) => requestEstimate(tx, { ...req, settings: { ...req.settings, hold: 'clamps', vacuumKpa: null } }));
    expect(clamps.created).toBe(true);
    expect(clamps.id).not.toBe(first.id);
    // two requests at the same moment from two processes: one row
    await one.db.delete(s.estimates);
    const [p, q] = await Promise.all([one.db.transaction((tx) => requestEstimate(tx, req)), two.db.transaction((tx) => requestEstimate(tx, req))]);
    expect(p.id).toBe(q.id);
    expect([p.created, q.created].filter(Boolean)).toHaveLength(1);
    // failed, then asked for again: back in the queue
    await claimEstimates(one.db, 'proc-one', 1, 30_000);
    await failEstimate(one.db, 'proc-one', p.id, 'The program file is missing from storage.');
    const retry = await one.db.transaction((tx) => requestEstimate(tx, req));
    expect(retry).toEqual({ id: p.id, status: 'pending', created: false, requeued: true });
    const [reclaimed] = await claimEstimates(one.db, 'proc-one', 1, 30_000);
    expect(reclaimed.attempts).toBe(2);
  });

  it('writes the machine version snapshot once and keys a changed profile apart', async () => {
    await clearQueue();
    const req = {
      shopId: shop.shopId,
      programId: program.programId,
      programVersionId: program.programVersionId,
      programVersion: program.version,
      sha256: program.sha256,
      machineId: shop.machineId,
      requestedBy: null,
      settings: jobEstimateSettings(shop.job),
    };
    const v1 = await one.db.transaction((tx) => requestEstimate(tx, req));
    const [machine] = await one.db.select().from(s.machines).where(eq(s.machines.id, shop.machineId));
    await one.db.update(s.machines).set({ version: machine.version + 1, accelXMmPerS2: 900 }).where(eq(s.machines.id, shop.machineId));
    const v2 = await one.db.transaction((tx) => requestEstimate(tx, req));
    expect(v2.created).toBe(true);
    const snapshots = await one.db.select().from(s.machineVersions).where(eq(s.machineVersions.machineId, shop.machineId));
    expect(snapshots.map((m) => m.version).sort()).toEqual([machine.version, machine.version + 1]);
    expect(snapshots.find((m) => m.version === machine.version + 1)?.profile.accelMmPerS2.x).toBe(900);
    const rows = await one.db.select().from(s.estimates).where(inArray(s.estimates.id, [v1.id, v2.id]));
    expect(rows.map((r) => r.machineVersion).sort()).toEqual([machine.version, machine.version + 1]);
    await one.db.update(s.machines).set({ version: machine.version, accelXMmPerS2: machine.accelXMmPerS2 }).where(eq(s.machines.id, shop.machineId));
  });
});
