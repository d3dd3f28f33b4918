// One process's share of the queue (lib/estimate-server/runner.ts) outside Next.js: the real
// worker bundle in a piscina pool, a scratch database, the S3 fake. With a lease far shorter
// than the estimate, renewal keeps the row (no other claimer can take it, one attempt); the
// pool never runs more estimates than it has threads; progress is written while it runs; a
// stopping process puts its unfinished row back in the queue.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { eq, inArray } from 'drizzle-orm';
import { runMigrations } from '@/db/migrate';
import * as s from '@/db/schema';
import { generateProgram } from '@/fixtures/program-generator';
import { jobEstimateSettings, requestEstimate } from '@/lib/estimate-server';
import { claimEstimates } from '@/lib/estimate-server/queue';
import { EstimateQueue } from '@/lib/estimate-server/runner';
import { ESTIMATE_WORKER_BUNDLE } from '@/lib/estimate-server/start';
import { connectTestDb, createScratchDatabase, type ScratchDatabase, type TestDb } from './support/db';
import { addProgramVersion, createEstimateShop, removeEstimateShop, ROOT, sleep, type EstimateShop, type StoredProgram } from './support/estimates';

let scratch: ScratchDatabase;
let one: TestDb;
let two: TestDb;
let shop: EstimateShop;
const workerFile = path.join(ROOT, ESTIMATE_WORKER_BUNDLE);

async function request(program: StoredProgram) {
  return one.db.transaction((tx) =>
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
}

const rowsOf = (ids: number[]) => one.db.select().from(s.estimates).where(inArray(s.estimates.id, ids));

beforeAll(async () => {
  if (!existsSync(workerFile)) {
    const built = spawnSync(process.execPath, [path.join(ROOT, 'scripts/build-estimate-worker.mjs')], { cwd: ROOT, stdio: 'inherit' });
    expect(built.status).toBe(0);
  }
  scratch = await createScratchDatabase();
  await runMigrations(scratch.url);
  one = connectTestDb(scratch.url);
  two = connectTestDb(scratch.url);
  // an id far from the test database's shops: the bucket is shared and keys start shops/{shopId}/
  shop = await createEstimateShop(one.db, 'runner', { shopId: 1_800_000_000 + Math.floor(Math.random() * 100_000_000) });
}, 120_000);

afterAll(async () => {
  if (one && shop) await removeEstimateShop(one.db, shop.shopId);
  await one?.close();
  await two?.close();
  await scratch?.drop();
});

describe('the queue of one process', () => {
  it('renews the lease of a long estimate, so no other process takes it, and writes progress on the way', async () => {
    const big = await addProgramVersion(one.db, shop, 'long-nest.nc', Buffer.from(generateProgram(500_000, 11)));
    const queue = new EstimateQueue({ db: one.db, workerFile, poolSize: 1, leaseMs: 400, renewMs: 100, pollMs: 100 });
    try {
      const { id } = await request(big);
      await queue.start();
      const leaseEnds = new Set<number>();
      const progress = new Set<number>();
      for (;;) {
        const [row] = await rowsOf([id]);
        if (row.status === 'done' || row.status === 'failed') break;
        if (row.status === 'running') {
          if (row.leaseUntil) leaseEnds.add(row.leaseUntil.getTime());
          progress.add(row.progress);
          // another process trying to claim meanwhile finds nothing to take
          expect(await claimEstimates(two.db, 'other-process', 5, 30_000)).toEqual([]);
        }
        await sleep(50);
      }
      const [done] = await rowsOf([id]);
      expect(done.error).toBeNull();
      expect(done).toMatchObject({ status: 'done', attempts: 1, progress: 1, leaseOwner: null });
      // the lease was moved on while it ran (a 400 ms lease, renewed every 100 ms), and no claim got through
      expect(leaseEnds.size).toBeGreaterThan(1);
      // stages reported between claim and done (lib/estimate-server/worker-task.ts)
      expect([...progress].filter((p) => p > 0 && p < 1).length).toBeGreaterThan(0);
    } finally {
      await queue.stop();
    }
  }, 120_000);

  it('runs no more estimates at once than its pool has threads', async () => {
    const programs = [];
    for (let i = 0; i < 3; i++) programs.push(await addProgramVersion(one.db, shop, `tag-row-${i}.nc`, Buffer.from(generateProgram(20_000, 20 + i))));
    const ids = [];
    for (const p of programs) ids.push((await request(p)).id);
    const queue = new EstimateQueue({ db: one.db, workerFile, poolSize: 1, pollMs: 100 });
    let most = 0;
    try {
      await queue.start();
      for (;;) {
        const rows = await rowsOf(ids);
        most = Math.max(most, rows.filter((r) => r.status === 'running').length, queue.busy);
        if (rows.every((r) => r.status === 'done' || r.status === 'failed')) break;
        await sleep(20);
      }
    } finally {
      await queue.stop();
    }
    expect(most).toBe(1);
    expect((await rowsOf(ids)).map((r) => r.status)).toEqual(['done', 'done', 'done']);
  }, 120_000);

  it('puts its unfinished estimate back in the queue when it stops', async () => {
    const big = await addProgramVersion(one.db, shop, 'stopped-nest.nc', Buffer.from(generateProgram(300_000, 12)));
    const { id } = await request(big);
    const queue = new EstimateQueue({ db: one.db, workerFile, poolSize: 1, pollMs: 100 });
    await queue.start();
    for (;;) {
      const [row] = await rowsOf([id]);
      if (row.status === 'running') break;
      expect(row.status).toBe('pending');
      await sleep(20);
    }
    await queue.stop();
    const [row] = await one.db.select().from(s.estimates).where(eq(s.estimates.id, id));
    expect(row).toMatchObject({ status: 'pending', leaseOwner: null, leaseUntil: null, attempts: 1, reportKey: null });
  }, 120_000);
});
