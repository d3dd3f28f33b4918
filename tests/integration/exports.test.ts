// The CSV exports through the built app (GET /api/exports/runs.csv and /estimates.csv): rows put
// straight into the test database are read back with csv-parse (a parser independent of the
// writer) and compared field by field with the rows; notes with commas, double quotes and line
// breaks come back unchanged (RFC 4180 §2 rules 6 and 7); more rows than one batch of the
// stream (EXPORT_BATCH = 500) all arrive once, in id order; another shop's rows never appear,
// and its machine as a filter gives a header-only file; a bad filter answers 422 naming it; a
// visitor without a session gets 401. Estimate per run = estimate per sheet × sheets cut
// (lib/runs/run-estimate.ts), hand-computed below.
import { parse } from 'csv-parse/sync';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as s from '@/db/schema';
import { callApi, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';
import { connectTestDb, type TestDb } from './support/db';
import { createEstimateShop, PASSWORD, removeEstimateShop, type EstimateShop } from './support/estimates';

let server: AppServer;
let t: TestDb;
let shop: EstimateShop;
let other: EstimateShop;
let jar: CookieJar;
let estimateId = 0;
let otherEstimateId = 0;
const RUNS = 612;
const HARD_NOTES = ['Sheet 2, corner lifted', 'Held it with a "spare" clamp', 'first line\r\nsecond line', 'bare\nfeed', '=1+1 typed by mistake', ''];
const OTHER_MARK = 'OTHER-SHOP-RUN-MARK';

async function seedShop(x: EstimateShop, label: string): Promise<{ estimateId: number; programId: number }> {
  const [{ id: programId }] = await t.db.insert(s.programs).values({ shopId: x.shopId, jobId: x.jobId, name: `${label}, "brackets".nc` }).$returningId();
  const [{ id: programVersionId }] = await t.db
    .insert(s.programVersions)
    .values({ shopId: x.shopId, programId, version: 1, objectKey: `shops/${x.shopId}/none.nc`, sha256: 'b'.repeat(64), bytes: 10, lines: 1 })
    .$returningId();
  const [{ id }] = await t.db
    .insert(s.estimates)
    .values({
      shopId: x.shopId,
      programId,
      programVersionId,
      programVersion: 1,
      machineId: x.machineId,
      machineVersion: 1,
      engineVersion: 'test',
      inputKey: `${label}`.padEnd(64, '0').slice(0, 64),
      settings: {} as never,
      status: 'done',
      totalSeconds: 1000,
      calibratedSeconds: 1120,
      partCount: 12,
      errorCount: 1,
      warningCount: 0,
      infoCount: 2,
    })
    .$returningId();
  return { estimateId: id, programId };
}

async function runsOf(shopId: number) {
  return t.db.select().from(s.runs).where(eq(s.runs.shopId, shopId)).orderBy(s.runs.id);
}

async function cleanRuns(shopId: number) {
  const ids = (await runsOf(shopId)).map((r) => r.id);
  if (ids.length) await t.db.delete(s.runs).where(inArray(s.runs.id, ids));
}

beforeAll(async () => {
  server = await startAppServer();
  t = connectTestDb();
  shop = await createEstimateShop(t.db, 'exports');
  other = await createEstimateShop(t.db, 'exports-other');
  const a = await seedShop(shop, 'exports-a');
  const b = await seedShop(other, 'exports-b');
  estimateId = a.estimateId;
  otherEstimateId = b.estimateId;
  const base = Date.UTC(2026, 9, 1, 7);
  const rows = Array.from({ length: RUNS }, (_, i) => {
    const startedAt = new Date(base + i * 3_600_000);
    const voided = i % 50 === 7;
    const interrupted = i % 31 === 3;
    const sheets = 1 + (i % 3);
    const actual = 1000 * sheets * (1 + (i % 20) / 100);
    return {
      shopId: shop.shopId,
      jobId: shop.jobId,
      programId: a.programId,
      programVersion: 1,
      machineId: shop.machineId,
      machineVersion: 1,
      estimateId: a.estimateId,
      operatorId: shop.users.operator.id,
      status: voided ? ('voided' as const) : ('finished' as const),
      startedAt,
      finishedAt: new Date(startedAt.getTime() + actual * 1000),
      actualSeconds: actual,
      sheetsCut: sheets,
      interrupted,
      notes: HARD_NOTES[i % HARD_NOTES.length] || null,
      voidedAt: voided ? new Date(startedAt.getTime() + 86_400_000) : null,
      voidReason: voided ? 'Timer left running, over lunch' : null,
    };
  });
  for (let i = 0; i < rows.length; i += 200) await t.db.insert(s.runs).values(rows.slice(i, i + 200));
  await t.db.insert(s.runs).values({
    shopId: other.shopId,
    jobId: other.jobId,
    programId: b.programId,
    programVersion: 1,
    machineId: other.machineId,
    machineVersion: 1,
    estimateId: b.estimateId,
    operatorId: other.users.operator.id,
    status: 'finished',
    startedAt: new Date(base),
    finishedAt: new Date(base + 1_000_000),
    actualSeconds: 1000,
    sheetsCut: 1,
    notes: OTHER_MARK,
  });
  jar = (await signInOverHttp(shop.users.estimator.email, PASSWORD)).jar;
}, 180_000);

afterAll(async () => {
  if (t) {
    for (const x of [shop, other]) {
      if (!x) continue;
      await cleanRuns(x.shopId);
      await removeEstimateShop(t.db, x.shopId);
    }
    await t.close();
  }
  await server?.stop();
});

async function csv(route: string, cookies: CookieJar | null = jar): Promise<{ status: number; type: string | null; records: Record<string, string>[]; text: string }> {
  const response = await fetch(`${server.baseUrl}${route}`, { headers: cookies ? { cookie: cookies.header() } : {} });
  const text = await response.text();
  const records = response.status === 200 ? (parse(text, { columns: true, bom: true }) as Record<string, string>[]) : [];
  return { status: response.status, type: response.headers.get('content-type'), records, text };
}

describe('GET /api/exports/runs.csv', () => {
  it('every run of the shop, once, in id order, across more than one batch; each field as stored', async () => {
    const got = await csv('/api/exports/runs.csv');
    expect(got.status).toBe(200);
    expect(got.type).toBe('text/csv; charset=utf-8; header=present');
    const stored = await runsOf(shop.shopId);
    expect(stored.length).toBe(RUNS);
    expect(got.records.map((r) => Number(r.run_id))).toEqual(stored.map((r) => r.id));
    for (const [i, r] of stored.entries()) {
      const rec = got.records[i];
      // a note typed as a formula gets a leading apostrophe (escape_formulas); none is written empty
      expect(rec.notes).toBe(r.notes === null ? '' : r.notes.startsWith('=') ? `'${r.notes}` : r.notes);
      expect(Number(rec.actual_s)).toBeCloseTo(r.actualSeconds!, 1);
      // 1000 s per sheet × sheets cut
      expect(Number(rec.estimate_s)).toBe(1000 * r.sheetsCut!);
      expect(Number(rec.actual_over_estimate)).toBeCloseTo(r.actualSeconds! / (1000 * r.sheetsCut!), 4);
      expect(rec.started_at_utc).toBe(r.startedAt.toISOString());
      expect(rec.interrupted).toBe(String(r.interrupted));
      expect(rec.voided).toBe(String(r.status === 'voided'));
      expect(rec.in_statistics).toBe(r.status === 'voided' ? 'no: voided' : r.interrupted ? 'no: interrupted' : 'yes');
      expect(rec.operator).toBe('operator of exports');
    }
    // the hard notes came back exactly (RFC 4180 quoting), and the CRLF record ends are there
    expect(new Set(got.records.map((r) => r.notes))).toEqual(new Set(['Sheet 2, corner lifted', 'Held it with a "spare" clamp', 'first line\r\nsecond line', 'bare\nfeed', "'=1+1 typed by mistake", '']));
    expect(got.text).toContain('"Held it with a ""spare"" clamp"');
    expect(got.text.split('\r\n')[0]).toBe(Object.keys(got.records[0]).join(','));
    expect(got.text).not.toContain(OTHER_MARK);
  });

  it('filters: voided runs only; another shop’s machine gives only the header', async () => {
    const voided = await csv('/api/exports/runs.csv?status=voided');
    const stored = (await runsOf(shop.shopId)).filter((r) => r.status === 'voided');
    expect(voided.records.map((r) => Number(r.run_id))).toEqual(stored.map((r) => r.id));
    expect(voided.records.every((r) => r.void_reason === 'Timer left running, over lunch')).toBe(true);

    const foreign = await csv(`/api/exports/runs.csv?machineId=${other.machineId}`);
    expect(foreign.status).toBe(200);
    expect(foreign.records).toEqual([]);
    expect(foreign.text.split('\r\n').filter(Boolean)).toHaveLength(1);
  });

  it('the other shop sees its own run only', async () => {
    const otherJar = (await signInOverHttp(other.users.operator.email, PASSWORD)).jar;
    const got = await csv('/api/exports/runs.csv', otherJar);
    expect(got.records.map((r) => r.notes)).toEqual([OTHER_MARK]);
  });

  it('a bad filter answers 422 naming it; no session answers 401', async () => {
    const bad = await callApi<{ error: { fields: Record<string, string[]> } }>(jar, 'GET', '/api/exports/runs.csv?status=stopped&from=2026-02-31');
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['from', 'status']);
    expect((await csv('/api/exports/runs.csv', null)).status).toBe(401);
  });
});

describe('GET /api/exports/estimates.csv', () => {
  it('the shop’s estimates with their figures; never the other shop’s', async () => {
    const got = await csv('/api/exports/estimates.csv');
    expect(got.status).toBe(200);
    const ids = got.records.map((r) => Number(r.estimate_id));
    expect(ids).toContain(estimateId);
    expect(ids).not.toContain(otherEstimateId);
    const rec = got.records.find((r) => Number(r.estimate_id) === estimateId)!;
    expect(rec).toMatchObject({ program: 'exports-a, "brackets".nc', estimate_per_sheet_s: '1000', calibrated_per_sheet_s: '1120', parts: '12', errors: '1', status: 'done' });
    expect(got.text).toContain('"exports-a, ""brackets"".nc"');
  });

  it('another shop’s machine as a filter: only the header', async () => {
    const got = await csv(`/api/exports/estimates.csv?machineId=${other.machineId}`);
    expect(got.records).toEqual([]);
  });
});
