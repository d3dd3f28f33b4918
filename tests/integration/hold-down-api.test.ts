// GET /api/estimates/:estimateId/hold-down through the built app, on an estimate the server's
// worker computed from a stored program: the demo's sheet of 64 price-tag holders of
// 26.8 × 24.8 mm in 3 mm acrylic cut with a 3.175 mm up-cut tool (fixtures/price-tag-nest.ts).
// The per-method analysis is stored with the estimate (shops/{shop}/estimates/{id}.hold-methods.json,
// estimates.hold_methods_key) and read from there, not computed again; an estimate without it
// says so; roles as lib/auth/roles.ts says (holddown:read), another shop's estimate 404.
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
