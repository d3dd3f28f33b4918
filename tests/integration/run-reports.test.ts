// The reports' read queries (db/queries/run-reports.ts) against the real MariaDB, on rows put
// straight into the test database for two shops: the dashboard's jobs waiting by status, this
// week's machine hours (scheduled and running jobs due Monday to Sunday, the latest version's
// newest finished estimate on the job's machine), programs due soon whose latest version still
// has error findings (a later clean version resolves them), the runs of the last 30 days with
// their medians checked against simple-statistics, and the runs table's pages. Another shop's
// rows never appear in any of them.
import { median, quantile } from 'simple-statistics';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import * as s from '@/db/schema';
import { hoursByMachine, isoWeekDays, nextDays } from '@/lib/reports/dashboard-figures';
import { summaryByMachine } from '@/lib/reports/run-stats';
import { connectTestDb, type TestDb } from './support/db';
import { createEstimateShop, removeEstimateShop, type EstimateShop } from './support/estimates';

vi.mock('server-only', () => ({}));

type Q = typeof import('@/db/queries/run-reports');
let q: Q;
let t: TestDb;
let shop: EstimateShop;
let other: EstimateShop;
const NOW = new Date('2026-12-02T10:00:00Z'); // a Wednesday: week 2026-11-30 to 2026-12-06
const ids = { dueErrors: 0, fixedLater: 0, weekJob: 0 };

async function job(x: EstimateShop, title: string, status: (typeof s.jobs.$inferInsert)['status'], dueDate: string | null, quantity = 10) {
  const [{ id }] = await t.db
    .insert(s.jobs)
    .values({ shopId: x.shopId, title, customerId: x.customerId, machineId: x.machineId, quantity, status, dueDate, ...x.job })
    .$returningId();
  return id;
}

/** A program with `versions` versions; each version's estimate on the shop's machine with the given error count. */
async function program(x: EstimateShop, jobId: number, name: string, errorsByVersion: number[], perSheetS = 1800, parts = 4) {
  const [{ id: programId }] = await t.db.insert(s.programs).values({ shopId: x.shopId, jobId, name, latestVersion: errorsByVersion.length }).$returningId();
  for (const [i, errors] of errorsByVersion.entries()) {
    const version = i + 1;
    const [{ id: programVersionId }] = await t.db
      .insert(s.programVersions)
      .values({ shopId: x.shopId, programId, version, objectKey: `shops/${x.shopId}/none-${programId}-${version}.nc`, sha256: 'c'.repeat(64), bytes: 1, lines: 1 })
      .$returningId();
    await t.db.insert(s.estimates).values({
      shopId: x.shopId,
      programId,
      programVersionId,
      programVersion: version,
      machineId: x.machineId,
      machineVersion: 1,
      engineVersion: 'test',
      inputKey: `${programId}-${version}-${x.shopId}`.padEnd(64, 'x'),
      settings: {} as never,
      status: 'done',
      totalSeconds: perSheetS / 1.1,
      calibratedSeconds: perSheetS,
      partCount: parts,
      errorCount: errors,
      warningCount: 0,
      infoCount: 0,
    });
  }
  return programId;
}

const ratiosA = [1.05, 1.1, 1.12, 1.2, 0.98, 1.15, 1.08];

beforeAll(async () => {
  t = connectTestDb();
  q = await import('@/db/queries/run-reports');
  shop = await createEstimateShop(t.db, 'reports');
  other = await createEstimateShop(t.db, 'reports-other');
  // the fixture's own job is a draft without a due date
  ids.weekJob = await job(shop, 'Display stand sides', 'scheduled', '2026-12-04', 10);
  await program(shop, ids.weekJob, 'sides.nc', [0], 1800, 4);
  const running = await job(shop, 'Sign letters', 'running', '2026-11-30', 3);
  await program(shop, running, 'letters.nc', [0], 3600, 1);
  await program(shop, await job(shop, 'Next week', 'scheduled', '2026-12-07'), 'later.nc', [0]);
  await program(shop, await job(shop, 'Draft this week', 'draft', '2026-12-03'), 'draft.nc', [0]);
  ids.dueErrors = await program(shop, await job(shop, 'Price-tag holders', 'quoted', '2026-12-05'), 'tags.nc', [0, 3]);
  ids.fixedLater = await program(shop, await job(shop, 'Fixed brackets', 'programmed', '2026-12-06'), 'fixed.nc', [2, 0]);
  await program(shop, await job(shop, 'Done already', 'done', '2026-12-03'), 'done.nc', [5]);
  await program(shop, await job(shop, 'Due far ahead', 'accepted', '2026-12-20'), 'far.nc', [4]);
  // the other shop: the same kinds of rows, none of which may appear
  const otherJob = await job(other, 'Other shop job', 'scheduled', '2026-12-04');
  const otherProgram = await program(other, otherJob, 'other.nc', [9]);

  const [shopProgram] = await t.db.select().from(s.programs).where(eq(s.programs.id, ids.dueErrors));
  const runRow = (x: EstimateShop, programId: number, jobId: number, ratio: number, daysAgo: number, extra: Partial<typeof s.runs.$inferInsert> = {}) => {
    const finishedAt = new Date(NOW.getTime() - daysAgo * 86_400_000);
    return {
      shopId: x.shopId,
      jobId,
      programId,
      programVersion: 1,
      machineId: x.machineId,
      machineVersion: 1,
      operatorId: x.users.operator.id,
      status: 'finished' as const,
      startedAt: new Date(finishedAt.getTime() - 3_600_000),
      finishedAt,
      actualSeconds: 1000 * ratio,
      sheetsCut: 1,
      ...extra,
    };
  };
  // estimates of version 1 of tags.nc: 1800 / 1.1 s per sheet before the time factor
  const [e1] = await t.db.select().from(s.estimates).where(eq(s.estimates.programId, ids.dueErrors)).orderBy(s.estimates.id).limit(1);
  const perSheet = e1.totalSeconds!;
  const rowsA = ratiosA.map((r, i) => runRow(shop, shopProgram.id, shopProgram.jobId, r, i + 1, { estimateId: e1.id, actualSeconds: perSheet * r }));
  rowsA.push(runRow(shop, shopProgram.id, shopProgram.jobId, 3, 2, { estimateId: e1.id, actualSeconds: perSheet * 3, status: 'voided', voidedAt: NOW }));
  rowsA.push(runRow(shop, shopProgram.id, shopProgram.jobId, 0.2, 3, { estimateId: e1.id, actualSeconds: perSheet * 0.2, interrupted: true }));
  rowsA.push(runRow(shop, shopProgram.id, shopProgram.jobId, 2, 45, { estimateId: e1.id, actualSeconds: perSheet * 2 }));
  await t.db.insert(s.runs).values(rowsA);
  const [eo] = await t.db.select().from(s.estimates).where(eq(s.estimates.programId, otherProgram));
  await t.db.insert(s.runs).values(runRow(other, otherProgram, otherJob, 5, 1, { estimateId: eo.id, actualSeconds: eo.totalSeconds! * 5 }));
}, 120_000);

afterAll(async () => {
  if (t) {
    for (const x of [shop, other]) {
      if (!x) continue;
      const runIds = (await t.db.select({ id: s.runs.id }).from(s.runs).where(eq(s.runs.shopId, x.shopId))).map((r) => r.id);
      if (runIds.length) await t.db.delete(s.runs).where(inArray(s.runs.id, runIds));
      await removeEstimateShop(t.db, x.shopId);
    }
    await t.close();
  }
  const { closeDb } = await import('@/db/client');
  await closeDb();
});

describe('dashboard queries', () => {
  it('jobs waiting by status: this shop’s only, every waiting status listed', async () => {
    const rows = await q.jobsWaitingByStatus(shop.shopId);
    // draft: the fixture's job and "Draft this week"; scheduled: this week's and next week's
    expect(rows).toEqual([
      { status: 'draft', count: 2 },
      { status: 'programmed', count: 1 },
      { status: 'quoted', count: 1 },
      { status: 'accepted', count: 1 },
      { status: 'scheduled', count: 2 },
    ]);
  });

  it('machine hours this week: the scheduled and the running job due in the week, nothing else', async () => {
    const { monday, sunday } = isoWeekDays(NOW);
    expect([monday, sunday]).toEqual(['2026-11-30', '2026-12-06']);
    const week = await q.weekPrograms(shop.shopId, monday, sunday);
    expect(week.programs).toHaveLength(2);
    expect(week.programs.map((p) => p.jobId)).toContain(ids.weekJob);
    const [m] = hoursByMachine(week.programs);
    // 1800 s × ⌈10 ÷ 4⌉ + 3600 s × ⌈3 ÷ 1⌉ = 5400 + 10800 = 16200 s = 4.5 h
    expect(m.hours).toBeCloseTo(4.5, 9);
    expect(m.jobs).toBe(2);
  });

  it('due soon with errors: the latest version’s errors only; a clean later version, a done job and a far due date are not listed', async () => {
    const { from, to } = nextDays(NOW, 7);
    const rows = await q.dueProgramsWithErrors(shop.shopId, from, to);
    expect(rows.map((r) => [r.programId, r.version, r.errorCount])).toEqual([[ids.dueErrors, 2, 3]]);
    expect(await q.dueProgramsWithErrors(other.shopId, from, to)).toHaveLength(1);
  });

  it('runs of the last 30 days: median and quartiles per machine equal simple-statistics’, voided, interrupted and older runs left out', async () => {
    const rows = await q.runsEndedSince(shop.shopId, new Date(NOW.getTime() - 30 * 86_400_000));
    expect(rows.every((r) => r.machineId === shop.machineId)).toBe(true);
    expect(rows).toHaveLength(ratiosA.length + 2);
    const [m] = summaryByMachine(rows);
    expect(m.counted).toBe(ratiosA.length);
    expect(m.leftOut).toMatchObject({ voided: 1, interrupted: 1 });
    expect(m.median).toBeCloseTo(median(ratiosA), 9);
    expect(m.q1).toBeCloseTo(quantile(ratiosA, 0.25), 9);
    expect(m.q3).toBeCloseTo(quantile(ratiosA, 0.75), 9);
  });
});

describe('runs table', () => {
  it('pages newest first with the total; filters by status; another shop’s machine finds nothing', async () => {
    const first = await q.runReportPage(shop.shopId, { page: 1, perPage: 25 });
    expect(first.total).toBe(ratiosA.length + 3);
    expect(first.rows.map((r) => new Date(r.startedAt).getTime())).toEqual([...first.rows.map((r) => new Date(r.startedAt).getTime())].sort((a, b) => b - a));
    const voided = await q.runReportAll(shop.shopId, { status: 'voided' });
    expect(voided.rows.map((r) => r.voided)).toEqual([true]);
    expect((await q.runReportPage(shop.shopId, { page: 1, perPage: 25, machineId: other.machineId })).total).toBe(0);
    // the estimate of a run = the stored estimate per sheet × sheets cut (1 here), before the time factor
    expect(first.rows[0].estimatedSeconds).toBeCloseTo(1800 / 1.1, 9);
  });
});
