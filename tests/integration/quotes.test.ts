// Quotes through the built app against the real MariaDB and the SMTP capture that
// scripts/services-start.sh runs (issue 14): a shop of its own with the shelf-bracket program
// (fixtures/programs/shelf-brackets-birch-18mm.nc) estimated by the server's worker on a copy
// of fixtures/machines/router-1.json, an 18 mm birch sheet at EUR 48.00 and the shop settings
// below. Checked here:
// - a draft's figures against the build-up rule worked out by hand in the test;
// - sending logs the message (mail_log sent with the server's message id) and the capture
//   holds exactly one message to the customer's address, whose PDF attachment parses with
//   pdf2json (a PDF text extractor from the npm registry) and shows the number and total;
// - the customer's link accepts once; a second answer, a wrong token and an expired quote are
//   refused and change nothing (the quote row and the job's history are compared before/after);
// - 20 quotes created at once take 20 distinct consecutive numbers (row-locked counter);
// - another shop's quote and job ids answer 404 and change nothing;
// - a send the relay refuses (RFC 5321 §4.2.2, 550 mailbox unavailable) names the reason,
//   leaves the quote a draft, and a second try sends it;
// - a later machine-rate change, a calibration and new shop settings do not move a quote.
import { readFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { simpleParser } from 'mailparser';
import PDFParser from 'pdf2json';
import { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
// first: it points DATABASE_URL at the test database before lib/env reads it
import { callApi, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';
import * as s from '@/db/schema';
import { env } from '@/lib/env';
import { connectTestDb, type TestDb } from './support/db';
import { addProgramVersion, createEstimateShop, PASSWORD, removeEstimateShop, ROOT, sleep, type EstimateShop, type StoredProgram } from './support/estimates';

// lib/mail/quote-mail.ts and db/queries are marked server-only; the marker package throws
// outside the react-server build condition, which vitest does not use.
vi.mock('server-only', () => ({}));

const FIXTURE = path.join(ROOT, 'fixtures/programs/shelf-brackets-birch-18mm.nc');
const MAIL_DIR = path.join(process.env.KERFCAST_DATA_DIR ? path.resolve(process.env.KERFCAST_DATA_DIR) : path.join(ROOT, '.data'), 'mail');

interface Line {
  key: string;
  label: string;
  arithmetic: string;
  amountMinor: number | null;
}
interface Quote {
  id: number;
  jobId: number;
  estimateId: number;
  number: string;
  status: string;
  totalMinor: number;
  currency: string;
  lines: Line[];
  inputs: { quantity: number; partsPerSheet: number; holdDown: string; extraLines: { label: string; amountMinor: number }[] };
  figures: { secondsPerSheet: number; machineRateMinorPerHour: number; materialCostMinorPerSheet: number; estimatePartCount: number; settings: Record<string, unknown> };
  validUntil: string | null;
  answerName: string | null;
  lastMail: { status: string; toAddress: string; error: string | null } | null;
}
interface Basis {
  estimateId: number;
  figures: Quote['figures'];
  defaults: { quantity: number; partsPerSheet: number; holdDown: string };
}
interface Captured {
  file: string;
  to: string[];
  subject: string;
  text: string;
  attachments: { filename: string | null; contentType: string; size: number }[];
}

let server: AppServer;
let t: TestDb;
let shop: EstimateShop;
let other: EstimateShop;
let program: StoredProgram;
let estimateId = 0;
let secondsPerSheet = 0;
let partsPerSheet = 0;
let customerEmail = '';
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

/** The captured messages to one address (each test run's customer has an address of its own). */
async function mailTo(address: string): Promise<Captured[]> {
  const res = await fetch(`${env.MAIL_CAPTURE_URL}/messages`);
  expect(res.status).toBe(200);
  return ((await res.json()) as Captured[]).filter((m) => m.to.includes(address));
}

async function waitForMailCount(address: string, count: number): Promise<Captured[]> {
  const deadline = Date.now() + 10_000;
  for (;;) {
    const found = await mailTo(address);
    if (found.length >= count || Date.now() > deadline) return found;
    await sleep(100);
  }
}

/**
 * The text of a PDF as pdf2json extracts it. pdf2json 3.1.6 reads the Buffer's whole
 * underlying ArrayBuffer, so a small Buffer cut from Node's shared pool (byteOffset > 0) reads
 * as garbage ("Invalid XRef stream header"); the bytes go in a Buffer of their own.
 */
function pdfText(pdf: Buffer): Promise<string> {
  const own = Buffer.alloc(pdf.length);
  pdf.copy(own);
  return new Promise((resolve, reject) => {
    const parser = new PDFParser(null, true);
    parser.on('pdfParser_dataError', (e) => reject(new Error(String((e as { parserError?: unknown }).parserError ?? e))));
    parser.on('pdfParser_dataReady', () => resolve(parser.getRawTextContent()));
    parser.parseBuffer(own);
  });
}

/** The token of the link /q/{token} in a captured message. */
function tokenIn(text: string): string {
  const m = /\/q\/([A-Za-z0-9_-]{16,64})/.exec(text);
  if (!m) throw new Error(`no customer link in: ${text}`);
  return m[1]!;
}

async function quoteRow(id: number) {
  const [row] = await t.db.select().from(s.quotes).where(eq(s.quotes.id, id));
  return row!;
}

const jobEventCount = async () => (await t.db.select({ id: s.jobEvents.id }).from(s.jobEvents).where(eq(s.jobEvents.jobId, shop.jobId))).length;

async function createDraft(who: CookieJar = jar.estimator, quantity = 40): Promise<Quote> {
  const r = await callApi<{ quote: Quote }>(who, 'POST', `/api/jobs/${shop.jobId}/quotes`, {
    estimateId,
    quantity,
    partsPerSheet,
    holdDown: 'vacuum',
    extraLines: [{ label: 'Edge sanding', amountMinor: 4500 }],
  });
  expect(r.status, JSON.stringify(r.body)).toBe(201);
  return r.body.quote;
}

async function sendAndGetToken(quote: Quote): Promise<string> {
  const before = (await mailTo(customerEmail)).length;
  const r = await callApi<{ quote: Quote }>(jar.estimator, 'POST', `/api/quotes/${quote.id}/send`);
  expect(r.status, JSON.stringify(r.body)).toBe(200);
  expect(r.body.quote.status).toBe('sent');
  const mails = await waitForMailCount(customerEmail, before + 1);
  const mail = mails.find((m) => m.subject.includes(quote.number));
  expect(mail, `a captured message for ${quote.number}`).toBeDefined();
  return tokenIn(mail!.text);
}

beforeAll(async () => {
  server = await startAppServer();
  t = connectTestDb();
  shop = await createEstimateShop(t.db, 'quotes');
  other = await createEstimateShop(t.db, 'quotes-other');
  // a customer address of this run only, so the capture's older messages never count
  customerEmail = `orders+${randomBytes(4).toString('hex')}@pellow-lane.example`;
  await t.db.update(s.customers).set({ email: customerEmail }).where(eq(s.customers.id, shop.customerId));
  const [{ id: materialId }] = await t.db
    .insert(s.materials)
    .values({ shopId: shop.shopId, name: 'Birch plywood 18 mm', thicknessMm: 18, sheetWidthMm: 2440, sheetLengthMm: 1220, costPerSheetMinor: 4800 })
    .$returningId();
  await t.db.update(s.jobs).set({ materialId, status: 'programmed' }).where(eq(s.jobs.id, shop.jobId));
  await t.db.update(s.machines).set({ hourlyRateMinor: 9000 }).where(eq(s.machines.id, shop.machineId));
  // the shop's settings, set here so the hand computation below does not hang on the defaults
  await t.db.insert(s.shopSettings).values({
    shopId: shop.shopId,
    address: '4 Tannery Row\nEastmere',
    quoteTerms: 'Payment within 30 days of delivery.',
    quoteValidityDays: 30,
    setupS: 900,
    loadUnloadSPerSheet: 240,
    wasteAllowanceBp: 1000,
    marginBp: 2500,
    taxBp: 2000,
    roundToMinor: 100,
    roundingMode: 'nearest',
  });
  program = await addProgramVersion(t.db, shop, 'shelf-brackets-birch-18mm.nc', readFileSync(FIXTURE));
  for (const role of ['programmer', 'estimator', 'operator'] as const) {
    const signed = await signInOverHttp(shop.users[role].email, PASSWORD);
    expect(signed.signedIn).toBe(true);
    jar[role] = signed.jar;
  }
  const signedOther = await signInOverHttp(other.users.estimator.email, PASSWORD);
  expect(signedOther.signedIn).toBe(true);
  jar.other = signedOther.jar;
  const r = await callApi<{ estimate: { id: number } }>(jar.programmer, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: shop.machineId });
  expect(r.status).toBe(202);
  estimateId = r.body.estimate.id;
  await waitDone(estimateId);
  const [est] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, estimateId));
  secondsPerSheet = est!.calibratedSeconds ?? est!.totalSeconds!;
  partsPerSheet = est!.partCount!;
  expect(partsPerSheet).toBeGreaterThan(0);
});

afterAll(async () => {
  const mail = await import('@/lib/mail/mailer').catch(() => null);
  mail?.closeMailer();
  const client = await import('@/db/client').catch(() => null);
  await client?.closeDb();
  if (t) {
    for (const sh of [shop, other]) {
      if (!sh) continue;
      await t.db.delete(s.mailLog).where(eq(s.mailLog.shopId, sh.shopId));
      await t.db.delete(s.quotes).where(eq(s.quotes.shopId, sh.shopId));
      await t.db.delete(s.quoteCounters).where(eq(s.quoteCounters.shopId, sh.shopId));
      await t.db.delete(s.shopSettings).where(eq(s.shopSettings.shopId, sh.shopId));
      await t.db.delete(s.jobEvents).where(eq(s.jobEvents.shopId, sh.shopId));
      await t.db.update(s.jobs).set({ materialId: null }).where(eq(s.jobs.shopId, sh.shopId));
      await t.db.delete(s.materials).where(eq(s.materials.shopId, sh.shopId));
      await removeEstimateShop(t.db, sh.shopId);
    }
    await t.close();
  }
  await server?.stop();
});

describe('a draft quote from the stored estimate', () => {
  it('offers the job’s finished estimate as a basis, with the machine, material and shop figures', async () => {
    const r = await callApi<{ quotes: Quote[]; bases: Basis[] }>(jar.estimator, 'GET', `/api/jobs/${shop.jobId}/quotes`);
    expect(r.status).toBe(200);
    expect(r.body.quotes).toEqual([]);
    expect(r.body.bases).toHaveLength(1);
    expect(r.body.bases[0]).toMatchObject({
      estimateId,
      figures: { secondsPerSheet, machineRateMinorPerHour: 9000, materialCostMinorPerSheet: 4800, estimatePartCount: partsPerSheet },
      defaults: { quantity: 40, partsPerSheet, holdDown: 'vacuum' },
    });
  });

  it('is 201 with a number and the build-up the issue defines, worked out by hand here', async () => {
    const q = await createDraft();
    expect(q.number).toMatch(new RegExp(`^Q-${new Date().getUTCFullYear()}-\\d{4}$`));
    expect(q).toMatchObject({ status: 'draft', currency: 'EUR', estimateId });
    // sheets = ⌈quantity ÷ parts per sheet⌉ (issue 14 point 1)
    const sheets = Math.ceil(40 / partsPerSheet);
    // machine time = estimate per sheet × sheets + setup + load/unload per sheet, whole seconds (half up)
    const machineS = Math.floor(secondsPerSheet * sheets + 900 + 240 * sheets + 0.5);
    // at EUR 90.00 per hour, minor units rounded half up
    const machine = Math.floor((machineS * 9000) / 3600 + 0.5);
    // material = sheets × EUR 48.00 × (1 + 10 % waste)
    const material = Math.floor((sheets * 4800 * 11_000) / 10_000 + 0.5);
    // vacuum: no hand work and no consumables (lib/quotes/hold-down-labour.ts, common practice)
    const subtotal = machine + material + 0 + 4500;
    const margin = Math.floor((subtotal * 2500) / 10_000 + 0.5);
    // rounded to the nearest EUR 1.00, half up
    const net = Math.floor((subtotal + margin + 50) / 100) * 100;
    const tax = Math.floor((net * 2000) / 10_000 + 0.5);
    const byKey = Object.fromEntries(q.lines.map((l) => [l.key, l]));
    expect(byKey.sheets!.arithmetic).toContain(`= ${sheets}`);
    expect(byKey['machine-time']!.arithmetic).toContain(`= ${machineS} s`);
    expect(byKey.machine!.amountMinor).toBe(machine);
    expect(byKey.material!.amountMinor).toBe(material);
    expect(byKey['hold-down-labour']!.amountMinor).toBe(0);
    expect(byKey['extra-0']).toMatchObject({ label: 'Edge sanding', amountMinor: 4500 });
    expect(byKey.subtotal!.amountMinor).toBe(subtotal);
    expect(byKey.margin!.amountMinor).toBe(margin);
    expect(byKey.net!.amountMinor).toBe(net);
    expect(byKey.tax!.amountMinor).toBe(tax);
    expect(q.totalMinor).toBe(net + tax);
    expect(Number.isInteger(q.totalMinor)).toBe(true);

    const got = await callApi<{ quote: Quote }>(jar.estimator, 'GET', `/api/quotes/${q.id}`);
    expect(got.status).toBe(200);
    // quotes are the estimator's and the admin's (lib/auth/roles.ts): an operator is refused
    const operator = await callApi<{ error: { code: string } }>(jar.operator, 'GET', `/api/quotes/${q.id}`);
    expect(operator.status).toBe(403);
    expect(got.body.quote).toMatchObject({ id: q.id, number: q.number, totalMinor: q.totalMinor, status: 'draft' });
  });

  it('refuses bad input with the fields named and stores nothing', async () => {
    const before = (await t.db.select({ id: s.quotes.id }).from(s.quotes).where(eq(s.quotes.shopId, shop.shopId))).length;
    const r = await callApi<{ error: { fields?: Record<string, string[]> } }>(jar.estimator, 'POST', `/api/jobs/${shop.jobId}/quotes`, {
      estimateId,
      quantity: 0,
      partsPerSheet,
      holdDown: 'vacuum',
      extraLines: [],
    });
    expect(r.status).toBe(422);
    expect(Object.keys(r.body.error.fields ?? {})).toContain('quantity');
    const wrongEstimate = await callApi<{ error: { fields?: Record<string, string[]> } }>(jar.estimator, 'POST', `/api/jobs/${shop.jobId}/quotes`, {
      estimateId: estimateId + 1_000_000,
      quantity: 10,
      partsPerSheet,
      holdDown: 'vacuum',
      extraLines: [],
    });
    expect(wrongEstimate.status).toBe(422);
    expect(Object.keys(wrongEstimate.body.error.fields ?? {})).toContain('estimateId');
    const after = (await t.db.select({ id: s.quotes.id }).from(s.quotes).where(eq(s.quotes.shopId, shop.shopId))).length;
    expect(after).toBe(before);
  });
});

describe('sending to the customer', () => {
  let quote: Quote;
  let token = '';

  it('logs the message, and the capture holds one message to the customer with the quote’s PDF', async () => {
    quote = await createDraft();
    const r = await callApi<{ quote: Quote }>(jar.estimator, 'POST', `/api/quotes/${quote.id}/send`);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body.quote).toMatchObject({ id: quote.id, number: quote.number, status: 'sent', totalMinor: quote.totalMinor });
    expect(r.body.quote.validUntil).toMatch(/^\d{4}-\d{2}-\d{2}$/);

    const logged = await t.db.select().from(s.mailLog).where(eq(s.mailLog.quoteId, quote.id));
    expect(logged).toHaveLength(1);
    expect(logged[0]).toMatchObject({ shopId: shop.shopId, toAddress: customerEmail, status: 'sent', error: null });
    expect(logged[0]!.messageId).toMatch(/^<.+@.+>$/);
    expect(logged[0]!.subject).toContain(quote.number);

    const mails = await waitForMailCount(customerEmail, 1);
    expect(mails).toHaveLength(1);
    const mail = mails[0]!;
    expect(mail.to).toEqual([customerEmail]);
    expect(mail.subject).toContain(quote.number);
    expect(mail.attachments).toEqual([expect.objectContaining({ filename: `${quote.number}.pdf`, contentType: 'application/pdf' })]);
    expect(mail.text).toContain(`${server.baseUrl}/q/`);
    token = tokenIn(mail.text);
    // 128 random bits in base64url: 22 characters
    expect(token).toHaveLength(22);

    // the stored message itself: its attachment parses as a PDF with the number and the total
    const parsed = await simpleParser(readFileSync(path.join(MAIL_DIR, mail.file)));
    const pdf = parsed.attachments[0]!.content;
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const text = await pdfText(pdf);
    expect(text).toContain(`Quote ${quote.number}`);
    const euros = (quote.totalMinor / 100).toLocaleString('en', { minimumFractionDigits: 2 });
    expect(text).toContain(`Total EUR ${euros}`);
    expect(text).toContain('Pellow Lane Florist');
    expect(text).toMatch(/estimate computed from the cutting program/);

    // only the token's SHA-256 is stored
    const row = await quoteRow(quote.id);
    expect(row.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(row.tokenHash).not.toContain(token);
    const [job] = await t.db.select({ status: s.jobs.status }).from(s.jobs).where(eq(s.jobs.id, shop.jobId));
    expect(job!.status).toBe('quoted');
  });

  it('downloads the same document from GET /api/quotes/:id/pdf', async () => {
    const res = await fetch(`${server.baseUrl}/api/quotes/${quote.id}/pdf`, { headers: { cookie: jar.estimator.header() } });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    expect(res.headers.get('content-disposition')).toContain(`${quote.number}.pdf`);
    const text = await pdfText(Buffer.from(await res.arrayBuffer()));
    expect(text).toContain(`Quote ${quote.number}`);
  });

  it('a sent quote is not sent again', async () => {
    const r = await callApi<{ error: { code: string } }>(jar.estimator, 'POST', `/api/quotes/${quote.id}/send`);
    expect(r.status).toBe(409);
    expect(await mailTo(customerEmail)).toHaveLength(1);
  });

  it('the customer’s page shows the quote without sign-in, and the link accepts it once', async () => {
    const page = await fetch(`${server.baseUrl}/q/${token}`, { redirect: 'manual' });
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain(quote.number);
    expect(html).toContain('Accept the quote');

    const eventsBefore = await jobEventCount();
    const ok = await callApi<{ ok: boolean; status: string }>(null, 'POST', `/api/q/${token}`, { answer: 'accept', name: 'Ada Pellow', purchaseOrder: 'PO-7731' });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body).toEqual({ ok: true, status: 'accepted' });
    const accepted = await quoteRow(quote.id);
    expect(accepted).toMatchObject({ status: 'accepted', answerName: 'Ada Pellow', answerPo: 'PO-7731' });
    expect(accepted.tokenUsedAt).not.toBeNull();
    const [job] = await t.db.select({ status: s.jobs.status }).from(s.jobs).where(eq(s.jobs.id, shop.jobId));
    expect(job!.status).toBe('accepted');
    const events = await t.db.select().from(s.jobEvents).where(eq(s.jobEvents.jobId, shop.jobId)).orderBy(desc(s.jobEvents.id)).limit(2);
    expect(events.map((e) => [e.kind, e.detail])).toEqual([
      ['status', 'quoted>accepted'],
      ['quote-accepted', `The customer (Ada Pellow, order PO-7731) accepted quote ${quote.number}.`],
    ]);
    expect(await jobEventCount()).toBe(eventsBefore + 2);
    // the shop sees the answer on the job's quotes
    const list = await callApi<{ quotes: Quote[] }>(jar.estimator, 'GET', `/api/jobs/${shop.jobId}/quotes`);
    expect(list.body.quotes.find((x) => x.id === quote.id)).toMatchObject({ status: 'accepted', answerName: 'Ada Pellow' });
  });

  it('a second answer, by accept or decline, is refused and changes nothing', async () => {
    const before = await quoteRow(quote.id);
    const eventsBefore = await jobEventCount();
    const again = await callApi<{ error: { code: string; message: string } }>(null, 'POST', `/api/q/${token}`, { answer: 'accept', name: 'Someone Else' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe('This quote has already been answered.');
    const decline = await callApi(null, 'POST', `/api/q/${token}`, { answer: 'decline', reason: 'changed our minds' });
    expect(decline.status).toBe(409);
    expect(await quoteRow(quote.id)).toEqual(before);
    expect(await jobEventCount()).toBe(eventsBefore);
    const page = await (await fetch(`${server.baseUrl}/q/${token}`)).text();
    expect(page).toContain('This quote has been accepted.');
    expect(page).not.toContain('Accept the quote</button>');
  });

  it('a wrong token is refused (404) and changes nothing', async () => {
    const rowsBefore = await t.db.select().from(s.quotes).where(eq(s.quotes.shopId, shop.shopId));
    const eventsBefore = await jobEventCount();
    const wrong = `${token.slice(0, -2)}${token.endsWith('AA') ? 'BB' : 'AA'}`;
    for (const bad of [wrong, randomBytes(16).toString('base64url'), 'short']) {
      const r = await callApi(null, 'POST', `/api/q/${bad}`, { answer: 'accept', name: 'Ada Pellow' });
      expect(r.status, bad).toBe(404);
    }
    const page = await fetch(`${server.baseUrl}/q/${wrong}`);
    expect(await page.text()).toContain('This link is not valid');
    expect(await t.db.select().from(s.quotes).where(eq(s.quotes.shopId, shop.shopId))).toEqual(rowsBefore);
    expect(await jobEventCount()).toBe(eventsBefore);
  });

  it('an expired quote’s link is refused and records no answer', async () => {
    const late = await createDraft();
    const lateToken = await sendAndGetToken(late);
    // its validity ran out yesterday
    await t.db.update(s.quotes).set({ validUntil: sql`DATE_SUB(CURRENT_DATE(), INTERVAL 1 DAY)` }).where(eq(s.quotes.id, late.id));
    const eventsBefore = await jobEventCount();
    const r = await callApi<{ error: { message: string } }>(null, 'POST', `/api/q/${lateToken}`, { answer: 'accept', name: 'Ada Pellow' });
    expect(r.status).toBe(409);
    expect(r.body.error.message).toBe('This quote has expired.');
    const row = await quoteRow(late.id);
    expect(row).toMatchObject({ status: 'expired', answerName: null, answerPo: null, answeredAt: null, tokenUsedAt: null });
    expect(await jobEventCount()).toBe(eventsBefore);
    const page = await (await fetch(`${server.baseUrl}/q/${lateToken}`)).text();
    expect(page).toContain('This quote has expired.');
  });
});

describe('numbers under concurrent creation', () => {
  it('20 quotes created at once take 20 distinct consecutive numbers', async () => {
    const year = new Date().getUTCFullYear();
    const [counter] = await t.db.select().from(s.quoteCounters).where(and(eq(s.quoteCounters.shopId, shop.shopId), eq(s.quoteCounters.year, year)));
    const first = counter!.next;
    const made = await Promise.all(Array.from({ length: 20 }, (_, i) => createDraft(jar.estimator, 10 + i)));
    const numbers = made.map((q) => q.number);
    expect(new Set(numbers).size).toBe(20);
    const seq = numbers.map((n) => Number(n.split('-')[2])).sort((a, b) => a - b);
    expect(seq).toEqual(Array.from({ length: 20 }, (_, i) => first + i));
    const [after] = await t.db.select().from(s.quoteCounters).where(and(eq(s.quoteCounters.shopId, shop.shopId), eq(s.quoteCounters.year, year)));
    expect(after!.next).toBe(first + 20);
  });
});

describe('another shop', () => {
  it('answers 404 for this shop’s quote and job ids and changes nothing', async () => {
    const q = await createDraft();
    const before = await quoteRow(q.id);
    for (const [method, route] of [
      ['GET', `/api/quotes/${q.id}`],
      ['GET', `/api/quotes/${q.id}/pdf`],
      ['POST', `/api/quotes/${q.id}/send`],
      ['POST', `/api/quotes/${q.id}/revoke`],
      ['GET', `/api/jobs/${shop.jobId}/quotes`],
    ] as const) {
      const r = await callApi(jar.other, method, route);
      expect(r.status, `${method} ${route}`).toBe(404);
    }
    const post = await callApi(jar.other, 'POST', `/api/jobs/${shop.jobId}/quotes`, { estimateId, quantity: 10, partsPerSheet, holdDown: 'vacuum', extraLines: [] });
    expect(post.status).toBe(404);
    expect(await quoteRow(q.id)).toEqual(before);
    expect(await t.db.select().from(s.mailLog).where(eq(s.mailLog.quoteId, q.id))).toEqual([]);
    expect(await t.db.select().from(s.quotes).where(eq(s.quotes.shopId, other.shopId))).toEqual([]);
  });
});

describe('a send the relay refuses', () => {
  let relay: SMTPServer;

  beforeAll(async () => {
    relay = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      logger: false,
      onRcptTo(_address, _session, callback) {
        callback(Object.assign(new Error('mailbox unavailable'), { responseCode: 550 }));
      },
      onData(stream, _session, callback) {
        stream.on('data', () => {});
        stream.on('end', () => callback());
      },
    });
    await new Promise<void>((resolve) => relay.listen(0, '127.0.0.1', () => resolve()));
  });

  afterAll(async () => {
    await new Promise<void>((resolve) => relay.close(() => resolve()));
  });

  it('names the relay’s reason, logs it, keeps the quote a draft, and a second try sends it', async () => {
    expect(env.DATABASE_URL).toMatch(/_test(\?|$)/);
    const q = await createDraft();
    const mailer = await import('@/lib/mail/mailer');
    const { sendQuoteToCustomer } = await import('@/lib/mail/quote-mail');
    const port = (relay.server.address() as net.AddressInfo).port;
    mailer.closeMailer();
    (globalThis as { kerfcastMailer?: unknown }).kerfcastMailer = mailer.createTransport(`smtp://127.0.0.1:${port}`);
    try {
      await expect(sendQuoteToCustomer(shop.shopId, shop.users.estimator.id, q.id)).rejects.toMatchObject({
        code: 'conflict:mail-failed',
        message: expect.stringMatching(new RegExp(`^The mail to ${customerEmail.replace(/[+.]/g, '\\$&')} was not sent: .*550 mailbox unavailable.*still a draft`)),
      });
    } finally {
      mailer.closeMailer();
    }
    const row = await quoteRow(q.id);
    expect(row).toMatchObject({ status: 'draft', tokenHash: null, sentAt: null });
    const logged = await t.db.select().from(s.mailLog).where(eq(s.mailLog.quoteId, q.id));
    expect(logged).toHaveLength(1);
    expect(logged[0]).toMatchObject({ status: 'failed', toAddress: customerEmail, messageId: null });
    expect(logged[0]!.error).toMatch(/550 mailbox unavailable/);
    // the shop sees the reason on the quote (the job page shows lastMail)
    const shown = await callApi<{ quote: Quote }>(jar.estimator, 'GET', `/api/quotes/${q.id}`);
    expect(shown.body.quote).toMatchObject({ status: 'draft', lastMail: { status: 'failed', toAddress: customerEmail } });
    expect(shown.body.quote.lastMail!.error).toMatch(/550 mailbox unavailable/);

    // tried again through the app, whose relay (the capture) takes it
    await sendAndGetToken(q);
    const logs = await t.db.select().from(s.mailLog).where(eq(s.mailLog.quoteId, q.id)).orderBy(s.mailLog.id);
    expect(logs.map((l) => l.status)).toEqual(['failed', 'sent']);
    expect((await quoteRow(q.id)).status).toBe('sent');
  });
});

describe('frozen figures', () => {
  it('a machine-rate change, a calibration and new shop settings move neither a draft nor a sent quote', async () => {
    const draft = await createDraft();
    const sent = await createDraft(jar.estimator, 24);
    await sendAndGetToken(sent);
    const before = await Promise.all([draft, sent].map((q) => callApi<{ quote: Quote }>(jar.estimator, 'GET', `/api/quotes/${q.id}`)));

    // the machine profile's rate doubles and its version moves on; a calibration lowers the estimate; the shop's margin rises
    const [m] = await t.db.select().from(s.machines).where(eq(s.machines.id, shop.machineId));
    await t.db.update(s.machines).set({ hourlyRateMinor: 18_000, version: m!.version + 1 }).where(eq(s.machines.id, shop.machineId));
    await t.db.update(s.estimates).set({ calibratedSeconds: secondsPerSheet * 0.8 }).where(eq(s.estimates.id, estimateId));
    await t.db.update(s.shopSettings).set({ marginBp: 4000, setupS: 1800 }).where(eq(s.shopSettings.shopId, shop.shopId));

    // a new quote sees the change (so the change is real) ...
    const bases = await callApi<{ bases: Basis[] }>(jar.estimator, 'GET', `/api/jobs/${shop.jobId}/quotes`);
    expect(bases.body.bases[0]!.figures).toMatchObject({ machineRateMinorPerHour: 18_000, secondsPerSheet: secondsPerSheet * 0.8, settings: { marginBp: 4000, setupS: 1800 } });
    const fresh = await createDraft();
    expect(fresh.totalMinor).not.toBe(draft.totalMinor);

    // ... the earlier ones keep their inputs, figures, lines and total
    for (const [i, q] of [draft, sent].entries()) {
      const now = await callApi<{ quote: Quote }>(jar.estimator, 'GET', `/api/quotes/${q.id}`);
      expect(now.body.quote.totalMinor).toBe(before[i]!.body.quote.totalMinor);
      expect(now.body.quote.lines).toEqual(before[i]!.body.quote.lines);
      expect(now.body.quote.figures).toEqual(before[i]!.body.quote.figures);
      expect(now.body.quote.figures).toMatchObject({ machineRateMinorPerHour: 9000, secondsPerSheet });
      const res = await fetch(`${server.baseUrl}/api/quotes/${q.id}/pdf`, { headers: { cookie: jar.estimator.header() } });
      const euros = (q.totalMinor / 100).toLocaleString('en', { minimumFractionDigits: 2 });
      expect(await pdfText(Buffer.from(await res.arrayBuffer()))).toContain(`Total EUR ${euros}`);
    }
    const rows = await t.db.select({ id: s.quotes.id, total: s.quotes.totalMinor }).from(s.quotes).where(inArray(s.quotes.id, [draft.id, sent.id]));
    expect(rows.map((r) => r.total).sort()).toEqual([draft.totalMinor, sent.totalMinor].sort());
  });
});
