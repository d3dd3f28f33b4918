// GET /api/estimates/:estimateId/hold-down through the built app, on an estimate the server's
// worker computed from a stored program: the demo's sheet of 64 price-tag holders of
// 26.8 × 24.8 mm in 3 mm acrylic cut with a 3.175 mm up-cut tool (fixtures/price-tag-nest.ts).
// The per-method analysis is stored with the estimate (shops/{shop}/estimates/{id}.hold-methods.json,
// estimates.hold_methods_key) and read from there, not computed again; an estimate without it
// says so, and a new request computes it (the same row again, or a new row for an estimate
// made before the comparison existed); methods ruled out for the job (?ruleOut=) and the
// no-method-holds verdict; roles as lib/auth/roles.ts says (holddown:read), another shop's
// estimate 404.
// Figures checked by hand: vacuum μ·ΔP·A = 0.45 × 61 kPa × 664.64 mm² = 18.2 N < 45 N
// (PRODUCT.md, the analysis's common-practice defaults); tape and glue at the shop_settings
// defaults (common practice): 4 sheets × 64 parts × 40 s = 10 240 s at 40.00/h = 113.78,
// tape 4 × 0.13 and glue 4 × 64 × 0.05 = 13.32, together 127.10.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import * as s from '@/db/schema';
import { priceTagNest } from '@/fixtures/price-tag-nest';
import { getObject, putObject } from '@/lib/storage/s3';
import { callApi, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';
import { connectTestDb, type TestDb } from './support/db';
import { addProgramVersion, createEstimateShop, PASSWORD, removeEstimateShop, sleep, type EstimateShop, type StoredProgram } from './support/estimates';

interface Option {
  method: string;
  holdDown: string;
  heldParts: { part: number; order: number; reason: string }[];
  unheldParts: { part: number; order: number; reason: string }[];
  warnings: string[];
  labourSeconds: number;
  machineSecondsDelta: number;
  costMinor: number;
  jobCostMinor: number;
  ruledOut: string | null;
}
interface Answer {
  estimateId: number;
  availability: string;
  options: Option[];
  recommended: string | null;
  runnerUp: string | null;
  note: string;
  sheets: number;
  quantity: number;
  currency: string;
}

let server: AppServer;
let t: TestDb;
let shop: EstimateShop;
let other: EstimateShop;
let program: StoredProgram;
let estimateId = 0;
const jar: Record<string, CookieJar> = {};

async function waitDone(id: number): Promise<void> {
  const deadline = Date.now() + 90_000;
  for (;;) {
    const r = await callApi<{ estimate: { status: string } }>(jar.programmer, 'GET', `/api/estimates/${id}`);
    if (r.body.estimate.status === 'done') return;
    if (r.body.estimate.status === 'failed' || Date.now() > deadline) throw new Error(`estimate ${id}: ${JSON.stringify(r.body.estimate)}`);
    await sleep(200);
  }
}

beforeAll(async () => {
  server = await startAppServer();
  t = connectTestDb();
  shop = await createEstimateShop(t.db, 'holddown');
  other = await createEstimateShop(t.db, 'holddown-other');
  // the demo's price-tag job: 3 mm acrylic, tape and glue, 240 pieces, on a machine whose table holds 61 kPa
  await t.db.update(s.machines).set({ defaultVacuumKpa: 61, hourlyRateMinor: 9500 }).where(eq(s.machines.id, shop.machineId));
  await t.db
    .update(s.jobs)
    .set({ sheetWidthMm: 1250, sheetLengthMm: 2500, sheetThicknessMm: 3, holdDown: 'tape-glue', vacuumKpa: null, quantity: 240 })
    .where(eq(s.jobs.id, shop.jobId));
  program = await addProgramVersion(t.db, shop, 'price-tag-holders-64-up.nc', Buffer.from(priceTagNest().text));
  for (const role of ['programmer', 'estimator', 'operator'] as const) {
    const signed = await signInOverHttp(shop.users[role].email, PASSWORD);
    expect(signed.signedIn).toBe(true);
    jar[role] = signed.jar;
  }
  const signedOther = await signInOverHttp(other.users.programmer.email, PASSWORD);
  expect(signedOther.signedIn).toBe(true);
  jar.other = signedOther.jar;
  const r = await callApi<{ estimate: { id: number } }>(jar.programmer, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: shop.machineId });
  expect(r.status).toBe(202);
  estimateId = r.body.estimate.id;
  await waitDone(estimateId);
});

afterAll(async () => {
  try {
    if (t) {
      // the comparison made each shop's settings row (getShopSettings); it goes first
      for (const sh of [shop, other]) if (sh) await t.db.delete(s.shopSettings).where(eq(s.shopSettings.shopId, sh.shopId));
      for (const sh of [shop, other]) if (sh) await removeEstimateShop(t.db, sh.shopId);
      await t.close();
    }
  } finally {
    await server?.stop();
  }
});

describe('the hold-down comparison of a stored estimate', () => {
  it('is stored with the estimate: the per-method analysis object beside the report, named in the row', async () => {
    const [row] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, estimateId));
    expect(row.settings.machineVacuumKpa).toBe(61);
    expect(row.holdMethodsKey).toBe(`shops/${shop.shopId}/estimates/${estimateId}.hold-methods.json`);
    const stored = await getObject(row.holdMethodsKey!);
    const doc = JSON.parse(stored!.body.toString('utf8'));
    expect(doc.parts).toHaveLength(64);
    expect(doc.methods.map((m: { id: string }) => m.id)).toEqual(['vacuum', 'tape-glue', 'clamps', 'tabs', 'skin']);
    expect(doc.methods[0]).toMatchObject({ vacuumKpa: 61, vacuumSource: 'machine' });
  });

  it('answers every method with its parts, reasons, warnings and costs, and recommends tape and glue', async () => {
    const r = await callApi<Answer>(jar.estimator, 'GET', `/api/estimates/${estimateId}/hold-down`);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const a = r.body;
    expect(a).toMatchObject({ estimateId, availability: 'ready', recommended: 'tape-glue', runnerUp: null, sheets: 4, quantity: 240, currency: 'EUR' });
    for (const o of a.options) for (const key of ['method', 'heldParts', 'unheldParts', 'warnings', 'labourSeconds', 'machineSecondsDelta', 'costMinor']) expect(o).toHaveProperty(key);
    const by = Object.fromEntries(a.options.map((o) => [o.method, o]));
    expect(by.vacuum!.heldParts).toHaveLength(0);
    expect(by.vacuum!.unheldParts).toHaveLength(64);
    expect(by.vacuum!.unheldParts[0]!.reason).toMatch(/^area 665 mm²: vacuum at 61\.0 kPa holds 18\.2 N .*the cutter T2 pushes 45 N$/);
    expect(by.vacuum!.ruledOut).toMatch(/^does not hold 64 of 64 parts/);
    expect(by.clamps!.warnings.join(' ')).toMatch(/Up-cut tool T2 .*3\.0 mm sheet/);
    expect(by['tape-glue']!.heldParts).toHaveLength(64);
    expect(by['tape-glue']!.labourSeconds).toBe(64 * 40);
    expect(by['tape-glue']!.jobCostMinor).toBe(12710);
    expect(a.note).toMatch(/aid, not a guarantee/);
  });

  it('reads the stored analysis, not a new one: a changed object changes the answer', async () => {
    const [row] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, estimateId));
    const original = (await getObject(row.holdMethodsKey!))!.body;
    const doc = JSON.parse(original.toString('utf8'));
    doc.methods = doc.methods.filter((m: { id: string }) => m.id !== 'skin');
    await putObject(row.holdMethodsKey!, JSON.stringify(doc), 'application/json');
    try {
      const r = await callApi<Answer>(jar.estimator, 'GET', `/api/estimates/${estimateId}/hold-down`);
      expect(r.body.options.map((o) => o.method)).toEqual(['vacuum', 'tape-glue', 'clamps', 'tabs']);
    } finally {
      await putObject(row.holdMethodsKey!, original, 'application/json');
    }
    // the same inputs asked again find the same estimate and its stored comparison
    const again = await callApi<{ estimate: { id: number; status: string } }>(jar.programmer, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: shop.machineId });
    expect(again.body.estimate).toMatchObject({ id: estimateId, status: 'done' });
  });

  it('an estimate stored without the per-method analysis (made before the comparison) says so', async () => {
    const [row] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, estimateId));
    await t.db.update(s.estimates).set({ holdMethodsKey: null }).where(eq(s.estimates.id, estimateId));
    try {
      const r = await callApi<Answer>(jar.estimator, 'GET', `/api/estimates/${estimateId}/hold-down`);
      expect(r.status).toBe(200);
      expect(r.body).toMatchObject({ availability: 'not-computed', options: [], recommended: null });
      expect(r.body.note).toMatch(/made before the hold-down comparison existed.*Request a new estimate/);
    } finally {
      await t.db.update(s.estimates).set({ holdMethodsKey: row.holdMethodsKey }).where(eq(s.estimates.id, estimateId));
    }
  });

  it('asked for again, an estimate stored without the analysis is computed again with it: the same row, the same figures', async () => {
    const [before] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, estimateId));
    await t.db.update(s.estimates).set({ holdMethodsKey: null }).where(eq(s.estimates.id, estimateId));
    const r = await callApi<{ estimate: { id: number; status: string } }>(jar.programmer, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: shop.machineId });
    expect(r.status, JSON.stringify(r.body)).toBe(202);
    expect(r.body.estimate).toEqual({ id: estimateId, status: 'pending' });
    await waitDone(estimateId);
    const [after] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, estimateId));
    expect(after.holdMethodsKey).toBe(`shops/${shop.shopId}/estimates/${estimateId}.hold-methods.json`);
    // the same inputs give the same estimate (the engine is deterministic)
    expect(after).toMatchObject({ totalSeconds: before.totalSeconds, calibratedSeconds: before.calibratedSeconds, partCount: 64, inputKey: before.inputKey });
    const a = await callApi<Answer>(jar.estimator, 'GET', `/api/estimates/${estimateId}/hold-down`);
    expect(a.body).toMatchObject({ availability: 'ready', recommended: 'tape-glue' });
    // with the analysis stored, a further request finds it and computes nothing
    const again = await callApi<{ estimate: { id: number; status: string } }>(jar.programmer, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: shop.machineId });
    expect(again.status).toBe(200);
    expect(again.body.estimate).toMatchObject({ id: estimateId, status: 'done' });
  });

  it('an estimate made before the comparison existed (its settings without the machine’s level): a request makes a new one with it', async () => {
    const [row] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, estimateId));
    const { machineVacuumKpa: _drop, ...olderSettings } = row.settings;
    void _drop;
    // the row as such an estimate was stored: another input key, no machine level, no analysis
    await t.db.update(s.estimates).set({ holdMethodsKey: null, settings: olderSettings, inputKey: 'f'.repeat(64) }).where(eq(s.estimates.id, estimateId));
    try {
      const old = await callApi<Answer>(jar.estimator, 'GET', `/api/estimates/${estimateId}/hold-down`);
      expect(old.body.availability).toBe('not-computed');
      const r = await callApi<{ estimate: { id: number; status: string } }>(jar.programmer, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: shop.machineId });
      expect(r.status, JSON.stringify(r.body)).toBe(202);
      const newer = r.body.estimate.id;
      expect(newer).not.toBe(estimateId);
      await waitDone(newer);
      const a = await callApi<Answer>(jar.estimator, 'GET', `/api/estimates/${newer}/hold-down`);
      expect(a.body).toMatchObject({ estimateId: newer, availability: 'ready', recommended: 'tape-glue' });
      await t.db.delete(s.estimates).where(eq(s.estimates.id, newer));
    } finally {
      await t.db.update(s.estimates).set({ holdMethodsKey: row.holdMethodsKey, settings: row.settings, inputKey: row.inputKey }).where(eq(s.estimates.id, estimateId));
    }
  });

  it('with tape and glue ruled out for the job no method holds every part: each method’s failing parts and what would change the verdict', async () => {
    const r = await callApi<Answer & { wouldChange: string[] }>(jar.estimator, 'GET', `/api/estimates/${estimateId}/hold-down?ruleOut=tape-glue`);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body).toMatchObject({ availability: 'ready', recommended: null, runnerUp: null });
    expect(r.body.note).toMatch(/^No method holds every part\. Vacuum at 61\.0 kPa \(the machine’s level\): 64 of 64 not held \(parts 1–64\); Tape and glue: ruled out for this job; Screws or clamps: 64 of 64 not held \(parts 1–64\); The program’s tabs: 64 of 64 not held \(parts 1–64\); Onion skin: 64 of 64 not held \(parts 1–64\)\./);
    // F ÷ (μ·ΔP) = 45 N ÷ (0.45 × 61 kPa) = 1639.3 mm², against the holders' 664.64 mm²
    expect(r.body.wouldChange[0]).toBe('Larger parts: at 61.0 kPa a part needs at least 1639 mm² (F ÷ (μ·ΔP) = 45 N ÷ (0.45 × 61.0 kPa)); the largest part not held has 665 mm².');
    expect(r.body.wouldChange.slice(1)).toEqual([
      'Tabs or an onion skin left in the CAM program on the 64 parts that have neither: they would hold under any method, at the cost of trimming per tab or a skin pass.',
      'A method that does not depend on friction: tape and glue, ruled out here, holds a part by its bond whatever its size.',
    ]);
    expect(r.body.options.find((o) => o.method === 'tape-glue')!.ruledOut).toMatch(/^ruled out for this job: the parts may not be taped or glued/);
    // ruling out vacuum changes nothing of the suggestion; an unknown name is refused, naming the field
    const noVac = await callApi<Answer>(jar.estimator, 'GET', `/api/estimates/${estimateId}/hold-down?ruleOut=vacuum`);
    expect(noVac.body.recommended).toBe('tape-glue');
    const bad = await callApi<{ error: { code: string; fields: Record<string, string[]> } }>(jar.estimator, 'GET', `/api/estimates/${estimateId}/hold-down?ruleOut=glue`);
    expect(bad.status).toBe(422);
    expect(bad.body.error.fields.ruleOut![0]).toMatch(/^Not a hold-down method: glue\./);
  });

  it('roles and shops: the operator is refused (403), another shop and a missing id answer 404', async () => {
    expect((await callApi(jar.programmer, 'GET', `/api/estimates/${estimateId}/hold-down`)).status).toBe(200);
    const refused = await callApi<{ error: { code: string } }>(jar.operator, 'GET', `/api/estimates/${estimateId}/hold-down`);
    expect(refused.status).toBe(403);
    const foreign = await callApi<{ error: { code: string } }>(jar.other, 'GET', `/api/estimates/${estimateId}/hold-down`);
    expect(foreign.status).toBe(404);
    expect(foreign.body.error.code).toBe('not-found:estimate');
    expect((await callApi(jar.estimator, 'GET', `/api/estimates/99999999/hold-down`)).status).toBe(404);
    expect((await callApi(jar.estimator, 'GET', `/api/estimates/x/hold-down`)).status).toBe(404);
  });
});
