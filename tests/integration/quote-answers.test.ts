// Quotes after they are sent, through the built app against the real MariaDB and the SMTP
// capture (issue 14, item 2 and 5): a shop of its own in pounds sterling whose rule rounds the
// net up to a multiple of 5.00, with a 14-day validity, and the shelf-bracket program estimated
// by the server's worker. Checked here:
// - the quote is in the shop's currency and its net follows the shop's rounding rule (the
//   rounding line is the difference, the net a multiple of the step and never below);
// - validity: a sent quote is valid until the sending day + the shop's validity days, still
//   answerable on that last day, expired the day after (and then refuses its answer);
// - a revision is a new quote, with its own number, that points at the old one; sending it
//   withdraws the old one's link, which then refuses an answer, while the revision accepts;
//   a revision of a quote of another job is refused;
// - the customer declines (with a reason): the quote is declined, the job is not accepted,
//   the history says so, and a second answer is refused.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { desc, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
// first: it points DATABASE_URL at the test database before lib/env reads it
import { callApi, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';
import * as s from '@/db/schema';
import { env } from '@/lib/env';
import { connectTestDb, type TestDb } from './support/db';
import { addProgramVersion, createEstimateShop, PASSWORD, removeEstimateShop, ROOT, sleep, type EstimateShop } from './support/estimates';

vi.mock('server-only', () => ({}));

const FIXTURE = path.join(ROOT, 'fixtures/programs/shelf-brackets-birch-18mm.nc');

interface Line {
  key: string;
  arithmetic: string;
  amountMinor: number | null;
}
interface Quote {
  id: number;
  number: string;
  status: string;
  revisionOf: number | null;
  totalMinor: number;
  currency: string;
  lines: Line[];
  validUntil: string | null;
  declineReason: string | null;
  linkRevoked: boolean;
}

let server: AppServer;
let t: TestDb;
let shop: EstimateShop;
let estimateId = 0;
let partsPerSheet = 0;
let customerEmail = '';
let otherJobId = 0;
const jar: Record<string, CookieJar> = {};

async function waitDone(id: number): Promise<void> {
  const deadline = Date.now() + 120_000;
  for (;;) {
    const r = await callApi<{ estimate: { status: string } }>(jar.programmer, 'GET', `/api/estimates/${id}`);
    if (r.body.estimate.status === 'done') return;
    if (r.body.estimate.status === 'failed' || Date.now() > deadline) throw new Error(`estimate ${id}: ${JSON.stringify(r.body.estimate)}`);
    await sleep(250);
  }
}

async function mailFor(number: string): Promise<{ text: string } | undefined> {
  const deadline = Date.now() + 10_000;
  for (;;) {
    const res = await fetch(`${env.MAIL_CAPTURE_URL}/messages`);
    const found = ((await res.json()) as { to: string[]; subject: string; text: string }[]).find((m) => m.to.includes(customerEmail) && m.subject.includes(number));
    if (found || Date.now() > deadline) return found;
    await sleep(100);
  }
}

async function createDraft(quantity = 40, revisionOf?: number): Promise<Quote> {
  const r = await callApi<{ quote: Quote }>(jar.estimator, 'POST', `/api/jobs/${shop.jobId}/quotes`, { estimateId, quantity, partsPerSheet, holdDown: 'vacuum', extraLines: [], revisionOf });
  expect(r.status, JSON.stringify(r.body)).toBe(201);
  return r.body.quote;
}

async function send(quote: Quote): Promise<string> {
  const r = await callApi<{ quote: Quote }>(jar.estimator, 'POST', `/api/quotes/${quote.id}/send`);
  expect(r.status, JSON.stringify(r.body)).toBe(200);
  const mail = await mailFor(quote.number);
  expect(mail, `the message of ${quote.number}`).toBeDefined();
  const m = /\/q\/([A-Za-z0-9_-]{16,64})/.exec(mail!.text);
  return m![1]!;
}

const getQuote = async (id: number) => (await callApi<{ quote: Quote }>(jar.estimator, 'GET', `/api/quotes/${id}`)).body.quote;
const jobStatus = async () => (await t.db.select({ status: s.jobs.status }).from(s.jobs).where(eq(s.jobs.id, shop.jobId)))[0]!.status;
const dbDate = async (expr: string) => {
  const [rows] = (await t.pool.query(`SELECT DATE_FORMAT(${expr}, '%Y-%m-%d') AS d`)) as unknown as [{ d: string }[]];
  return rows[0]!.d;
};

beforeAll(async () => {
  server = await startAppServer();
  t = connectTestDb();
  shop = await createEstimateShop(t.db, 'quote-answers');
  customerEmail = `buying+${randomBytes(4).toString('hex')}@hollin-outdoor.example`;
  await t.db.update(s.customers).set({ email: customerEmail }).where(eq(s.customers.id, shop.customerId));
  await t.db.update(s.shops).set({ currency: 'GBP' }).where(eq(s.shops.id, shop.shopId));
  const [{ id: materialId }] = await t.db
    .insert(s.materials)
    .values({ shopId: shop.shopId, name: 'Birch plywood 18 mm', thicknessMm: 18, sheetWidthMm: 2440, sheetLengthMm: 1220, costPerSheetMinor: 4150 })
    .$returningId();
  await t.db.update(s.jobs).set({ materialId, status: 'programmed' }).where(eq(s.jobs.id, shop.jobId));
  const [{ id: otherJob }] = await t.db
    .insert(s.jobs)
    .values({ shopId: shop.shopId, customerId: shop.customerId, title: 'Second job', sheetWidthMm: 2440, sheetLengthMm: 1220, sheetThicknessMm: 18, zZero: 'top', holdDown: 'vacuum', quantity: 1, status: 'draft' })
    .$returningId();
  otherJobId = otherJob;
  await t.db.insert(s.shopSettings).values({ shopId: shop.shopId, quoteValidityDays: 14, marginBp: 2000, taxBp: 2000, roundToMinor: 500, roundingMode: 'up' });
  const program = await addProgramVersion(t.db, shop, 'shelf-brackets-birch-18mm.nc', readFileSync(FIXTURE));
  for (const role of ['programmer', 'estimator'] as const) {
    const signed = await signInOverHttp(shop.users[role].email, PASSWORD);
    expect(signed.signedIn).toBe(true);
    jar[role] = signed.jar;
  }
  const r = await callApi<{ estimate: { id: number } }>(jar.programmer, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: shop.machineId });
  estimateId = r.body.estimate.id;
  await waitDone(estimateId);
  const [est] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, estimateId));
  partsPerSheet = est!.partCount!;
});

afterAll(async () => {
  const mail = await import('@/lib/mail/mailer').catch(() => null);
  mail?.closeMailer();
  const client = await import('@/db/client').catch(() => null);
  await client?.closeDb();
  if (t && shop) {
    await t.db.delete(s.mailLog).where(eq(s.mailLog.shopId, shop.shopId));
    await t.db.update(s.quotes).set({ revisionOf: null }).where(eq(s.quotes.shopId, shop.shopId));
    await t.db.delete(s.quotes).where(eq(s.quotes.shopId, shop.shopId));
    await t.db.delete(s.quoteCounters).where(eq(s.quoteCounters.shopId, shop.shopId));
    await t.db.delete(s.shopSettings).where(eq(s.shopSettings.shopId, shop.shopId));
    await t.db.delete(s.jobEvents).where(eq(s.jobEvents.shopId, shop.shopId));
    await t.db.delete(s.jobs).where(eq(s.jobs.id, otherJobId));
    await t.db.update(s.jobs).set({ materialId: null }).where(eq(s.jobs.shopId, shop.shopId));
    await t.db.delete(s.materials).where(eq(s.materials.shopId, shop.shopId));
    await removeEstimateShop(t.db, shop.shopId);
  }
  await t?.close();
  await server?.stop();
});

describe('the shop’s currency and rounding rule', () => {
  it('a quote is in the shop’s currency, its net rounded up to a multiple of 5.00', async () => {
    const q = await createDraft();
    expect(q.currency).toBe('GBP');
    const line = (key: string) => q.lines.find((l) => l.key === key)!;
    const before = line('subtotal').amountMinor! + line('margin').amountMinor!;
    const net = line('net').amountMinor!;
    // up to the next multiple of 500 minor units: ⌈before ÷ 500⌉ × 500
    expect(net).toBe(Math.ceil(before / 500) * 500);
    expect(net % 500).toBe(0);
    expect(line('rounding').amountMinor).toBe(net - before);
    expect(line('rounding').amountMinor).toBeGreaterThanOrEqual(0);
    expect(line('rounding').arithmetic).toMatch(/rounded up multiple of GBP 5\.00 = GBP /);
    // tax 20 % of the net, integer minor units, half up
    expect(line('tax').amountMinor).toBe(Math.floor((net * 2000 + 5000) / 10_000));
    expect(q.totalMinor).toBe(net + line('tax').amountMinor!);
  });
});

describe('picking the estimate', () => {
  it('offers every finished estimate of the job, program version × machine version, the latest first; a quote takes the one picked', async () => {
    // a second version of the program (one more comment line), estimated on the same machine
    const v2 = await addProgramVersion(t.db, shop, 'shelf-brackets-birch-18mm.nc', Buffer.concat([Buffer.from('(revised nest)\n'), readFileSync(FIXTURE)]));
    const r = await callApi<{ estimate: { id: number } }>(jar.programmer, 'POST', `/api/programs/${v2.programId}/estimates`, { machineId: shop.machineId });
    expect(r.status).toBe(202);
    await waitDone(r.body.estimate.id);
    const listed = await callApi<{ bases: { estimateId: number; programVersion: number; machineVersion: number; figures: { estimateId: number } }[] }>(jar.estimator, 'GET', `/api/jobs/${shop.jobId}/quotes`);
    expect(listed.status).toBe(200);
    expect(listed.body.bases.map((b) => [b.estimateId, b.programVersion])).toEqual([
      [r.body.estimate.id, 2],
      [estimateId, 1],
    ]);
    const fromV1 = await createDraft(12);
    expect((await t.db.select({ estimateId: s.quotes.estimateId }).from(s.quotes).where(eq(s.quotes.id, fromV1.id)))[0]!.estimateId).toBe(estimateId);
    const fromV2 = await callApi<{ quote: Quote & { estimateId: number } }>(jar.estimator, 'POST', `/api/jobs/${shop.jobId}/quotes`, { estimateId: r.body.estimate.id, quantity: 12, partsPerSheet, holdDown: 'vacuum', extraLines: [] });
    expect(fromV2.status).toBe(201);
    expect(fromV2.body.quote.estimateId).toBe(r.body.estimate.id);
  });
});

describe('validity', () => {
  it('a sent quote is valid for the shop’s 14 days: answerable on the last day, expired the day after', async () => {
    const q = await createDraft(20);
    const token = await send(q);
    const sent = await getQuote(q.id);
    expect(sent.status).toBe('sent');
    expect(sent.validUntil).toBe(await dbDate('DATE_ADD(CURRENT_DATE(), INTERVAL 14 DAY)'));
    // the days pass: today is the last valid day
    await t.db.update(s.quotes).set({ validUntil: sql`CURRENT_DATE()` }).where(eq(s.quotes.id, q.id));
    expect((await getQuote(q.id)).status).toBe('sent');
    expect(await (await fetch(`${server.baseUrl}/q/${token}`)).text()).not.toContain('This quote has expired.');
    // and then it has run out
    await t.db.update(s.quotes).set({ validUntil: sql`DATE_SUB(CURRENT_DATE(), INTERVAL 1 DAY)` }).where(eq(s.quotes.id, q.id));
    expect((await getQuote(q.id)).status).toBe('expired');
    const r = await callApi<{ error: { message: string } }>(null, 'POST', `/api/q/${token}`, { answer: 'accept', name: 'Rhona Vell' });
    expect(r.status).toBe(409);
    expect(r.body.error.message).toBe('This quote has expired.');
  });
});

describe('a revision', () => {
  it('is a new quote with its own number pointing at the old; sending it withdraws the old link', async () => {
    const old = await createDraft(40);
    const oldToken = await send(old);
    const revision = await createDraft(80, old.id);
    expect(revision.revisionOf).toBe(old.id);
    expect(revision.number).not.toBe(old.number);
    expect(Number(revision.number.slice(-4))).toBe(Number(old.number.slice(-4)) + 1);
    expect(revision.totalMinor).toBeGreaterThan(old.totalMinor);
    // until the revision is sent, the old quote still takes an answer
    expect((await getQuote(old.id)).linkRevoked).toBe(false);
    const newToken = await send(revision);
    const oldNow = await getQuote(old.id);
    expect(oldNow).toMatchObject({ status: 'sent', linkRevoked: true, totalMinor: old.totalMinor });
    const refused = await callApi<{ error: { message: string } }>(null, 'POST', `/api/q/${oldToken}`, { answer: 'accept', name: 'Rhona Vell' });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toBe('The shop has withdrawn this link.');
    expect(await (await fetch(`${server.baseUrl}/q/${oldToken}`)).text()).toContain('withdrawn');
    const accepted = await callApi(null, 'POST', `/api/q/${newToken}`, { answer: 'accept', name: 'Rhona Vell', purchaseOrder: 'HOG-118' });
    expect(accepted.status).toBe(200);
    expect((await getQuote(revision.id)).status).toBe('accepted');
    expect(await jobStatus()).toBe('accepted');
  });

  it('of a quote of another job is refused, naming the field, and stores nothing', async () => {
    const [q] = await t.db.select().from(s.quotes).where(eq(s.quotes.shopId, shop.shopId)).orderBy(desc(s.quotes.id)).limit(1);
    const count = (await t.db.select({ id: s.quotes.id }).from(s.quotes).where(eq(s.quotes.shopId, shop.shopId))).length;
    const r = await callApi<{ error: { fields: Record<string, string[]> } }>(jar.estimator, 'POST', `/api/jobs/${otherJobId}/quotes`, { estimateId, quantity: 1, partsPerSheet: 1, holdDown: 'vacuum', extraLines: [], revisionOf: q!.id });
    expect(r.status).toBe(422);
    expect(Object.keys(r.body.error.fields)).toEqual(expect.arrayContaining([expect.stringMatching(/^(estimateId|revisionOf)$/)]));
    expect((await t.db.select({ id: s.quotes.id }).from(s.quotes).where(eq(s.quotes.shopId, shop.shopId))).length).toBe(count);
  });
});

describe('the customer declines', () => {
  it('with a reason: the quote is declined, the job not accepted, the history says so; a second answer is refused', async () => {
    await t.db.update(s.jobs).set({ status: 'programmed' }).where(eq(s.jobs.id, shop.jobId));
    const q = await createDraft(10);
    const token = await send(q);
    expect(await jobStatus()).toBe('quoted');
    const r = await callApi<{ ok: boolean; status: string }>(null, 'POST', `/api/q/${token}`, { answer: 'decline', reason: 'Lead time too long for our opening' });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body).toEqual({ ok: true, status: 'declined' });
    expect(await getQuote(q.id)).toMatchObject({ status: 'declined', declineReason: 'Lead time too long for our opening' });
    expect(await jobStatus()).toBe('quoted');
    const [event] = await t.db.select().from(s.jobEvents).where(eq(s.jobEvents.jobId, shop.jobId)).orderBy(desc(s.jobEvents.id)).limit(1);
    expect(event).toMatchObject({ kind: 'quote-declined', detail: `The customer declined quote ${q.number}: Lead time too long for our opening.` });
    const again = await callApi<{ error: { message: string } }>(null, 'POST', `/api/q/${token}`, { answer: 'accept', name: 'Rhona Vell' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe('This quote has already been answered.');
    expect(await (await fetch(`${server.baseUrl}/q/${token}`)).text()).toContain('declined');
  });
});
