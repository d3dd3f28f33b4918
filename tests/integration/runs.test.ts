// Runs and calibration against the real MariaDB and the built app (issue 15).
// - The timer: a run started, paused, resumed and finished with a clock the test controls
//   (db/queries/runs.ts takes `now`) has the running time the hand-added spans give, read
//   back through GET /api/runs/:runId as the browser sees it.
// - Two starts on one machine at the same moment: one 201, one 409 (the unique index on
//   runs.active_machine_id), over HTTP and through the queries.
// - Corrections: the operator on the day of their own run, not a day later, not someone
//   else's; the admin any run, and voiding; each change in run_changes with before and after.
// - Calibration: the median actual ÷ estimate of the counted runs and its quartiles, computed
//   by hand here (Hyndman & Fan 1996 definition 7, the quantiles simple-statistics gives);
//   interrupted and voided runs left out. Applying it makes machine version 2 with that time
//   factor; an estimate asked for afterwards is made on version 2 with calibrated =
//   raw × factor and the same raw time, while the quote made before keeps its frozen figures.
// - Another shop's run and machine are 404 on every route.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import { and, eq, inArray } from 'drizzle-orm';
import * as s from '@/db/schema';
import { callApi, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';
import { connectTestDb, type TestDb } from './support/db';
import { addProgramVersion, createEstimateShop, PASSWORD, removeEstimateShop, ROOT, sleep, type EstimateShop, type StoredProgram } from './support/estimates';

vi.mock('server-only', () => ({}));

type RunsModule = typeof import('@/db/queries/runs');
type RunBody = { run: { id: number; status: string; estimateId: number | null; actualSeconds: number | null; runningSeconds: number; events: { kind: string }[]; changes?: { field: string; before: string | null; after: string | null; reason: string }[] } };
type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string[]> } };
type EstimateBody = { estimate: { id: number; status: string; machineVersion: number; totalSeconds: number | null; calibratedSeconds: number | null } };
interface CalibrationBody {
  calibration: { suggestedFactor: number | null; runs: number; iqr: { q1: number; q3: number; range: number } | null; minimumRuns: number; message: string; runIds: number[]; machineVersion: number; currentFactor: number };
}

const FIXTURE = path.join(ROOT, 'fixtures/programs/shelf-brackets-birch-18mm.nc');

let server: AppServer;
let t: TestDb;
let q: RunsModule;
let shop: EstimateShop;
let other: EstimateShop;
let program: StoredProgram;
let otherProgram: StoredProgram;
const ids = { admin: 0, operator2: 0 };
const jar: Record<string, CookieJar> = {};
let estimate: EstimateBody['estimate'];
let quoteBefore: Record<string, unknown>;

const operator = () => ({ id: shop.users.operator.id, role: 'operator' as const });
const operator2 = () => ({ id: ids.operator2, role: 'operator' as const });
const admin = () => ({ id: ids.admin, role: 'admin' as const });
const at = (base: Date, seconds: number) => new Date(base.getTime() + seconds * 1000);
const start = () => ({ programId: program.programId, version: program.version, machineId: shop.machineId });

async function waitForEstimate(who: CookieJar, id: number, timeoutMs = 90_000): Promise<EstimateBody['estimate']> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await callApi<EstimateBody>(who, 'GET', `/api/estimates/${id}`);
    expect(r.status).toBe(200);
    if (r.body.estimate.status === 'done' || r.body.estimate.status === 'failed') return r.body.estimate;
    if (Date.now() > deadline) throw new Error(`estimate ${id} still ${r.body.estimate.status}`);
    await sleep(200);
  }
}

async function removeRunRows(shopId: number) {
  await t.db.delete(s.runChanges).where(eq(s.runChanges.shopId, shopId));
  await t.db.delete(s.runEvents).where(eq(s.runEvents.shopId, shopId));
  await t.db.delete(s.runs).where(eq(s.runs.shopId, shopId));
  const quotes = await t.db.select({ id: s.quotes.id }).from(s.quotes).where(eq(s.quotes.shopId, shopId));
  if (quotes.length > 0) await t.db.delete(s.mailLog).where(inArray(s.mailLog.quoteId, quotes.map((x) => x.id)));
  await t.db.delete(s.quotes).where(eq(s.quotes.shopId, shopId));
  await t.db.delete(s.quoteCounters).where(eq(s.quoteCounters.shopId, shopId));
  await t.db.delete(s.shopSettings).where(eq(s.shopSettings.shopId, shopId));
}

beforeAll(async () => {
  server = await startAppServer();
  t = connectTestDb();
  q = await import('@/db/queries/runs');
  shop = await createEstimateShop(t.db, 'runs');
  other = await createEstimateShop(t.db, 'runs-other');
  const hash = await bcrypt.hash(PASSWORD, 4);
  [{ id: ids.admin }] = await t.db.insert(s.users).values({ shopId: shop.shopId, email: `admin@${shop.slug}.example`, name: 'Ada of runs', role: 'admin', passwordHash: hash }).$returningId();
  [{ id: ids.operator2 }] = await t.db.insert(s.users).values({ shopId: shop.shopId, email: `operator2@${shop.slug}.example`, name: 'Noor of runs', role: 'operator', passwordHash: hash }).$returningId();
  program = await addProgramVersion(t.db, shop, path.basename(FIXTURE), readFileSync(FIXTURE));
  otherProgram = await addProgramVersion(t.db, other, path.basename(FIXTURE), readFileSync(FIXTURE));
  for (const [key, email] of [
    ['operator', shop.users.operator.email],
    ['estimator', shop.users.estimator.email],
    ['programmer', shop.users.programmer.email],
    ['admin', `admin@${shop.slug}.example`],
    ['operator2', `operator2@${shop.slug}.example`],
    ['other', other.users.operator.email],
  ] as const) {
    const signed = await signInOverHttp(email, PASSWORD);
    expect(signed.signedIn, key).toBe(true);
    jar[key] = signed.jar;
  }
  // the estimate the runs are measured against, computed by the server, and a quote made from it
  const requested = await callApi<EstimateBody>(jar.estimator, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: shop.machineId });
  expect(requested.status).toBe(202);
  estimate = await waitForEstimate(jar.estimator, requested.body.estimate.id);
  expect(estimate.status).toBe('done');
  const quote = await callApi<{ quote: Record<string, unknown> & { id: number } }>(jar.estimator, 'POST', `/api/jobs/${shop.jobId}/quotes`, {
    estimateId: estimate.id,
    quantity: 40,
    partsPerSheet: 8,
    holdDown: 'vacuum',
    extraLines: [],
  });
  expect(quote.status, JSON.stringify(quote.body)).toBe(201);
  quoteBefore = quote.body.quote;
}, 180_000);

afterAll(async () => {
  if (t) {
    for (const sh of [shop, other]) {
      if (!sh) continue;
      await removeRunRows(sh.shopId);
      await removeEstimateShop(t.db, sh.shopId);
    }
    await t.close();
  }
  const { closeDb } = await import('@/db/client');
  await closeDb();
  await server?.stop();
});

describe('the run timer from server timestamps', () => {
  let runId = 0;
  // a clock of our own: a morning two days ago, milliseconds included (timestamps keep 3 digits)
  const t0 = new Date(Date.UTC(new Date().getUTCFullYear(), new Date().getUTCMonth(), new Date().getUTCDate() - 2, 7, 30, 0, 125));

  it('starts against the stored estimate and counts the spans between start, pauses, resumes and finish', async () => {
    const started = await q.startRun(shop.shopId, operator(), start(), t0);
    runId = started.id;
    expect(started).toMatchObject({ status: 'running', estimateId: estimate.id, machineVersion: 1, programVersion: 1 });
    await q.pauseRun(shop.shopId, operator(), runId, at(t0, 600.25));
    // while paused the running time stands still: 600.25 s at any later instant
    expect((await q.getRun(shop.shopId, runId, at(t0, 800)))!.runningSeconds).toBeCloseTo(600.25, 6);
    await q.resumeRun(shop.shopId, operator(), runId, at(t0, 900));
    // running again: 600.25 + (1000 − 900)
    expect((await q.getRun(shop.shopId, runId, at(t0, 1000)))!.runningSeconds).toBeCloseTo(700.25, 6);
    await q.pauseRun(shop.shopId, operator(), runId, at(t0, 1500));
    await q.resumeRun(shop.shopId, operator(), runId, at(t0, 1620));
    const done = await q.finishRun(shop.shopId, operator(), runId, { sheetsCut: 2, interrupted: false, notes: 'Timed with the test clock.' }, at(t0, 2000));
    // (600.25 − 0) + (1500 − 900) + (2000 − 1620) = 1580.25 s; the two pauses (299.75 s and 120 s) are left out
    expect(done.status).toBe('finished');
    expect(done.actualSeconds).toBeCloseTo(1580.25, 6);
  });

  it('reads back the same over HTTP, with the six events in order', async () => {
    const r = await callApi<RunBody>(jar.operator2, 'GET', `/api/runs/${runId}`);
    expect(r.status).toBe(200);
    expect(r.body.run.actualSeconds).toBeCloseTo(1580.25, 6);
    expect(r.body.run.events.map((e) => e.kind)).toEqual(['start', 'pause', 'resume', 'pause', 'resume', 'finish']);
    const [row] = await t.db.select().from(s.runs).where(eq(s.runs.id, runId));
    expect(row.activeMachineId, 'a finished run no longer holds its machine').toBeNull();
  });

  it('refuses a move the timer cannot make (409) and a finished run moved again', async () => {
    const r = await callApi<ErrorBody>(jar.operator, 'POST', `/api/runs/${runId}/resume`, {});
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('conflict:run-state');
    // kept out of the calibration below, which counts runs of its own
    await q.voidRun(shop.shopId, admin(), runId, 'Timer check only.');
  });

  it('runs through the HTTP routes as the issue names them', async () => {
    const started = await callApi<RunBody>(jar.operator, 'POST', '/api/runs', start());
    expect(started.status, JSON.stringify(started.body)).toBe(201);
    expect(started.body.run).toMatchObject({ status: 'running', estimateId: estimate.id });
    const id = started.body.run.id;
    // another operator may not drive it; the run's own operator may
    expect((await callApi<ErrorBody>(jar.operator2, 'POST', `/api/runs/${id}/pause`, {})).status).toBe(403);
    const paused = await callApi<RunBody>(jar.operator, 'POST', `/api/runs/${id}/pause`, {});
    expect(paused.status).toBe(200);
    expect(paused.body.run.status).toBe('paused');
    expect((await callApi<RunBody>(jar.operator, 'POST', `/api/runs/${id}/resume`, {})).body.run.status).toBe('running');
    const bad = await callApi<ErrorBody>(jar.operator, 'POST', `/api/runs/${id}/finish`, { sheetsCut: 0, interrupted: false });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields ?? {})).toEqual(['sheetsCut']);
    const finished = await callApi<RunBody>(jar.operator, 'POST', `/api/runs/${id}/finish`, { sheetsCut: 0, interrupted: true, notes: 'Stopped to check a loose part.' });
    expect(finished.status).toBe(200);
    expect(finished.body.run.status).toBe('finished');
    expect(finished.body.run.actualSeconds).toBeGreaterThan(0);
    // a programmer reads runs but does not log them
    expect((await callApi<ErrorBody>(jar.programmer, 'POST', '/api/runs', start())).status).toBe(403);
  });
});

describe('two starts on one machine at the same moment', () => {
  it('over HTTP: one 201, the other 409 naming who holds the machine', async () => {
    const [a, b] = await Promise.all([callApi<RunBody | ErrorBody>(jar.operator, 'POST', '/api/runs', start()), callApi<RunBody | ErrorBody>(jar.operator2, 'POST', '/api/runs', start())]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const lost = (a.status === 409 ? a : b).body as ErrorBody;
    expect(lost.error.code).toBe('conflict:machine-busy');
    const won = ((a.status === 201 ? a : b).body as RunBody).run;
    const open = await t.db.select().from(s.runs).where(and(eq(s.runs.shopId, shop.shopId), eq(s.runs.activeMachineId, shop.machineId)));
    expect(open.map((r) => r.id)).toEqual([won.id]);
    // a third start while it is open is 409 too; after it is voided the machine is free
    expect((await callApi(jar.operator, 'POST', '/api/runs', start())).status).toBe(409);
    const voided = await callApi<RunBody>(jar.admin, 'POST', `/api/runs/${won.id}/void`, { reason: 'Two starts in a test.' });
    expect(voided.status).toBe(200);
    expect(voided.body.run.status).toBe('voided');
  });

  it('through the queries, ten times: always exactly one run opened', async () => {
    for (let i = 0; i < 10; i++) {
      const now = new Date();
      const outcomes = await Promise.allSettled([q.startRun(shop.shopId, operator(), start(), now), q.startRun(shop.shopId, operator2(), start(), now)]);
      const won = outcomes.filter((o) => o.status === 'fulfilled');
      const lost = outcomes.filter((o) => o.status === 'rejected') as PromiseRejectedResult[];
      expect(won).toHaveLength(1);
      expect(lost).toHaveLength(1);
      expect((lost[0].reason as { code: string }).code).toBe('conflict:machine-busy');
      await q.voidRun(shop.shopId, admin(), (won[0] as PromiseFulfilledResult<{ id: number }>).value.id, 'Concurrency check.');
    }
  });
});

describe('corrections and voiding', () => {
  let runId = 0;
  const day = new Date(Date.UTC(2026, 10, 17, 9, 0, 0));

  it('the operator corrects their own run on the day; each field leaves its audit row', async () => {
    const r = await q.startRun(shop.shopId, operator(), start(), day);
    runId = r.id;
    await q.finishRun(shop.shopId, operator(), runId, { sheetsCut: 3, interrupted: false }, at(day, 1800));
    const fixed = await q.correctRun(shop.shopId, operator(), runId, { sheetsCut: 2, notes: 'Sheet 3 was a re-cut.', reason: 'Miscounted the sheets.' }, at(day, 3600));
    expect(fixed.sheetsCut).toBe(2);
    expect(fixed.changes.map((c) => [c.field, c.before, c.after, c.reason])).toEqual([
      ['sheetsCut', '3', '2', 'Miscounted the sheets.'],
      ['notes', null, 'Sheet 3 was a re-cut.', 'Miscounted the sheets.'],
    ]);
  });

  it('not on a later day, and not another operator’s run', async () => {
    await expect(q.correctRun(shop.shopId, operator(), runId, { sheetsCut: 1, reason: 'Late.' }, at(day, 86_400 * 2))).rejects.toMatchObject({ code: 'forbidden:run' });
    await expect(q.correctRun(shop.shopId, operator2(), runId, { sheetsCut: 1, reason: 'Not mine.' }, at(day, 3700))).rejects.toMatchObject({ code: 'forbidden:run' });
    // over HTTP today: the run ended on 17 November 2026, so the operator is refused
    expect((await callApi<ErrorBody>(jar.operator, 'PATCH', `/api/runs/${runId}`, { sheetsCut: 1, reason: 'Late.' })).status).toBe(403);
  });

  it('the admin corrects any run and voids it; voiding is theirs only', async () => {
    const fixed = await callApi<RunBody>(jar.admin, 'PATCH', `/api/runs/${runId}`, { actualSeconds: 1750, reason: 'The timer ran on while the sheet was swept.' });
    expect(fixed.status, JSON.stringify(fixed.body)).toBe(200);
    expect(fixed.body.run.actualSeconds).toBe(1750);
    expect(fixed.body.run.changes!.at(-1)).toMatchObject({ field: 'actualSeconds', before: '1800', after: '1750' });
    expect((await callApi(jar.operator, 'POST', `/api/runs/${runId}/void`, { reason: 'Mine.' })).status).toBe(403);
    const voided = await callApi<RunBody>(jar.admin, 'POST', `/api/runs/${runId}/void`, { reason: 'A test run.' });
    expect(voided.body.run.status).toBe('voided');
    expect(voided.body.run.changes!.at(-1)).toMatchObject({ field: 'status', before: 'finished', after: 'voided', reason: 'A test run.' });
    expect((await callApi(jar.admin, 'PATCH', `/api/runs/${runId}`, { sheetsCut: 1, reason: 'After void.' })).status).toBe(409);
    // the list the program page shows counts the audit rows (2 by the operator, 1 by the admin, the voiding)
    const listed = await q.listRuns(shop.shopId, { programId: start().programId, page: 1, perPage: 100 });
    expect(listed.runs.find((x) => x.id === runId)?.changeCount).toBe(4);
    expect((await callApi<RunBody>(jar.admin, 'GET', `/api/runs/${runId}`)).body.run.changes).toHaveLength(4);
  });

  it('a run entered afterwards: start and duration become its two events', async () => {
    const r = await callApi<RunBody>(jar.operator, 'POST', '/api/runs/manual', { ...start(), startedAt: '2026-11-18T10:00:00Z', durationSeconds: 1234.5, sheetsCut: 1, interrupted: false });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.run).toMatchObject({ status: 'finished', estimateId: estimate.id, actualSeconds: 1234.5 });
    expect(r.body.run.events.map((e) => e.kind)).toEqual(['start', 'finish']);
    await q.voidRun(shop.shopId, admin(), r.body.run.id, 'Not part of the calibration check.');
  });
});

describe('calibration', () => {
  // actual ÷ estimate of the runs that count, invented; sorted 1.05 1.07 1.08 1.09 1.10 1.20:
  // median (1.08 + 1.09) / 2 = 1.085; type 7 quartiles at positions (6 − 1)·0.25 = 1.25 and
  // 3.75: q1 = 1.07 + 0.25·0.01 = 1.0725, q3 = 1.09 + 0.75·0.01 = 1.0975 (hand-computed)
  const ratios = [1.1, 1.05, 1.2, 1.08, 1.07, 1.09];

  it('says it needs the minimum number of runs (5 by default) before suggesting', async () => {
    // every run so far is voided or interrupted: none counts
    const first = await callApi<CalibrationBody>(jar.operator, 'GET', `/api/machines/${shop.machineId}/calibration`);
    expect(first.status).toBe(200);
    expect(first.body.calibration).toMatchObject({ suggestedFactor: null, runs: 0, minimumRuns: 5 });
    expect(first.body.calibration.message).toMatch(/at least 5/);
  });

  it('suggests the median of the counted runs, leaving interrupted and voided ones out', async () => {
    const perSheet = estimate.totalSeconds!;
    const base = new Date(Date.UTC(2026, 10, 20, 7, 0, 0));
    for (const [i, ratio] of ratios.entries()) {
      const t1 = at(base, i * 86_400);
      const r = await q.startRun(shop.shopId, operator(), start(), t1);
      await q.finishRun(shop.shopId, operator(), r.id, { sheetsCut: 2, interrupted: false }, at(t1, perSheet * 2 * ratio));
    }
    // an interrupted run (ratio 3) and a voided one (ratio 0.5), both newer: neither counts
    const late = at(base, 10 * 86_400);
    const interrupted = await q.startRun(shop.shopId, operator(), start(), late);
    await q.finishRun(shop.shopId, operator(), interrupted.id, { sheetsCut: 1, interrupted: true }, at(late, perSheet * 3));
    const wrong = await q.startRun(shop.shopId, operator(), start(), at(late, 86_400));
    await q.finishRun(shop.shopId, operator(), wrong.id, { sheetsCut: 1, interrupted: false }, at(late, 86_400 + perSheet * 0.5));
    await q.voidRun(shop.shopId, admin(), wrong.id, 'Wrong program.');

    const r = await callApi<CalibrationBody>(jar.estimator, 'GET', `/api/machines/${shop.machineId}/calibration`);
    const c = r.body.calibration;
    expect(c.runs).toBe(6);
    expect(c.suggestedFactor).toBeCloseTo(1.085, 3);
    expect(c.iqr!.q1).toBeCloseTo(1.0725, 3);
    expect(c.iqr!.q3).toBeCloseTo(1.0975, 3);
    expect(c.runIds).not.toContain(interrupted.id);
    expect(c.runIds).not.toContain(wrong.id);
    expect(c.message).toMatch(/% longer than estimated/);
  });

  it('only an admin applies it, and only the figure still suggested', async () => {
    expect((await callApi(jar.estimator, 'POST', `/api/machines/${shop.machineId}/calibration`, { suggestedFactor: 1.085 })).status).toBe(403);
    const stale = await callApi<ErrorBody>(jar.admin, 'POST', `/api/machines/${shop.machineId}/calibration`, { suggestedFactor: 1.2 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('conflict:calibration');
  });

  it('applying makes machine version 2 with that time factor', async () => {
    const r = await callApi<{ applied: { version: number; previousVersion: number; timeFactor: number; previousFactor: number } }>(jar.admin, 'POST', `/api/machines/${shop.machineId}/calibration`, { suggestedFactor: 1.085 });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.applied).toEqual({ machineId: shop.machineId, version: 2, previousVersion: 1, timeFactor: 1.085, previousFactor: 1 });
    const versions = await t.db.select().from(s.machineVersions).where(eq(s.machineVersions.machineId, shop.machineId));
    expect(versions.map((v) => [v.version, v.profile.timeFactor]).sort()).toEqual([
      [1, 1],
      [2, 1.085],
    ]);
    // applied once: a second apply is refused, the machine already uses it
    expect((await callApi(jar.admin, 'POST', `/api/machines/${shop.machineId}/calibration`, { suggestedFactor: 1.085 })).status).toBe(409);
  });

  it('a later estimate uses version 2 (calibrated = raw × 1.085) while the earlier quote keeps its figures', async () => {
    const requested = await callApi<EstimateBody>(jar.estimator, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: shop.machineId });
    expect(requested.status).toBe(202);
    expect(requested.body.estimate.id).not.toBe(estimate.id);
    const later = await waitForEstimate(jar.estimator, requested.body.estimate.id);
    expect(later).toMatchObject({ status: 'done', machineVersion: 2 });
    // the raw time does not depend on the factor; the calibrated one is raw × factor
    expect(later.totalSeconds).toBe(estimate.totalSeconds);
    expect(later.calibratedSeconds!).toBeCloseTo(later.totalSeconds! * 1.085, 4);
    const old = await callApi<EstimateBody>(jar.estimator, 'GET', `/api/estimates/${estimate.id}`);
    expect(old.body.estimate).toMatchObject({ machineVersion: 1, calibratedSeconds: estimate.calibratedSeconds });
    const quote = await callApi<{ quote: Record<string, unknown> }>(jar.estimator, 'GET', `/api/quotes/${(quoteBefore as { id: number }).id}`);
    expect(quote.body.quote.figures).toEqual(quoteBefore.figures);
    expect(quote.body.quote.totalMinor).toBe(quoteBefore.totalMinor);
    expect(quote.body.quote.lines).toEqual(quoteBefore.lines);
    // and a run started now records the machine's new version against the newest estimate
    const run = await q.startRun(shop.shopId, operator(), start(), new Date());
    expect(run).toMatchObject({ machineVersion: 2, estimateId: later.id });
    await q.voidRun(shop.shopId, admin(), run.id, 'Only checking the estimate it records.');
  });
});

describe("another shop's runs and machines", () => {
  it('are 404 on every route', async () => {
    const [mine] = await t.db.select({ id: s.runs.id }).from(s.runs).where(eq(s.runs.shopId, shop.shopId)).limit(1);
    for (const [method, route, body] of [
      ['GET', `/api/runs/${mine.id}`, undefined],
      ['POST', `/api/runs/${mine.id}/pause`, {}],
      ['POST', `/api/runs/${mine.id}/finish`, { sheetsCut: 1 }],
      ['PATCH', `/api/runs/${mine.id}`, { sheetsCut: 1, reason: 'x' }],
      ['GET', `/api/machines/${shop.machineId}/calibration`, undefined],
      ['POST', '/api/runs', { programId: program.programId, version: 1, machineId: other.machineId }],
      ['POST', '/api/runs', { programId: otherProgram.programId, version: 1, machineId: shop.machineId }],
    ] as const) {
      const r = await callApi<ErrorBody>(jar.other, method, route, body);
      expect(r.status, `${method} ${route}`).toBe(404);
      expect(r.body.error.code).toMatch(/^not-found:/);
    }
    const list = await callApi<{ runs: unknown[]; total: number }>(jar.other, 'GET', `/api/runs?machineId=${shop.machineId}`);
    expect(list.body.total).toBe(0);
  });
});
