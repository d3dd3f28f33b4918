// Browser test of issue 14 in Debian's Chromium against the built app: a job of the demo shop
// (Marlow Street Bakery's window brackets, Router 1, 18 mm birch) with the shelf-bracket program
// (fixtures/programs/shelf-brackets-birch-18mm.nc) estimated by the server's worker. Tomas (an
// estimator) opens the job, builds a quote in the builder (the build-up moves at once when the
// quantity changes, and its total is the one the server stores), saves and sends it; the
// message in the SMTP capture carries the customer's link; the customer, signed out, opens it
// and accepts once; the job shows the quote and itself accepted. `npm run mail:list` (the
// Done-when's check) lists the message with its PDF. Screenshots go to
// .data/screenshots (quote-builder.png, quote-sent.png, quote-customer.png, quote-customer-done.png,
// quote-job-accepted.png).
import { execFile } from 'node:child_process';
import { mkdirSync, readFileSync } from 'node:fs';
import { promisify } from 'node:util';
import path from 'node:path';
import { and, eq, inArray } from 'drizzle-orm';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { callApi, DEMO_PASSWORD, E2E_PORT, signInOverHttp, startAppServer, type AppServer } from '../integration/support/app-server';
import { addProgramVersion, sleep } from '../integration/support/estimates';
import { JobPage } from './pages/job-page';
import { SignInPage } from './pages/sign-in-page';
import { launchBrowser, type BrowserSession } from './support/browser';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

const run = promisify(execFile);
const ROOT = path.resolve(__dirname, '../..');
const SCREENSHOT_DIR = path.join(ROOT, '.data/screenshots');
const FIXTURE = path.join(ROOT, 'fixtures/programs/shelf-brackets-birch-18mm.nc');
const MAIL_CAPTURE_URL = process.env.MAIL_CAPTURE_URL ?? `http://127.0.0.1:${process.env.KERFCAST_MAIL_HTTP_PORT ?? 8025}`;
// an invented job of the demo shop; the suffix keeps reruns (and their captured mail) apart
const TITLE = `Window brackets to quote, e2e ${Date.now().toString(36)}`;

let server: AppServer;
let browser: BrowserSession;
let dbm: DbModule;
let s: Schema;
let jobId = 0;

async function removeJob(id: number) {
  const { db } = dbm;
  const quoteIds = (await db.select({ id: s.quotes.id }).from(s.quotes).where(eq(s.quotes.jobId, id))).map((q) => q.id);
  if (quoteIds.length > 0) {
    await db.delete(s.mailLog).where(inArray(s.mailLog.quoteId, quoteIds));
    await db.delete(s.quotes).where(inArray(s.quotes.id, quoteIds));
  }
  const programIds = (await db.select({ id: s.programs.id }).from(s.programs).where(eq(s.programs.jobId, id))).map((p) => p.id);
  if (programIds.length > 0) {
    await db.delete(s.estimates).where(inArray(s.estimates.programId, programIds));
    await db.delete(s.programVersions).where(inArray(s.programVersions.programId, programIds));
    await db.delete(s.programs).where(inArray(s.programs.id, programIds));
  }
  await db.delete(s.jobEvents).where(eq(s.jobEvents.jobId, id));
  await db.delete(s.jobs).where(eq(s.jobs.id, id));
}

beforeAll(async () => {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  server = await startAppServer(E2E_PORT);
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  const { db } = dbm;
  const [shop] = await db.select().from(s.shops).where(eq(s.shops.slug, 'alder-finch'));
  const [customer] = await db.select().from(s.customers).where(and(eq(s.customers.shopId, shop!.id), eq(s.customers.name, 'Marlow Street Bakery')));
  const [material] = await db.select().from(s.materials).where(and(eq(s.materials.shopId, shop!.id), eq(s.materials.name, 'Birch plywood 18 mm')));
  const [machine] = await db.select().from(s.machines).where(and(eq(s.machines.shopId, shop!.id), eq(s.machines.name, 'Router 1')));
  const [{ id }] = await db
    .insert(s.jobs)
    .values({
      shopId: shop!.id,
      title: TITLE,
      customerId: customer!.id,
      materialId: material!.id,
      machineId: machine!.id,
      sheetWidthMm: material!.sheetWidthMm,
      sheetLengthMm: material!.sheetLengthMm,
      sheetThicknessMm: material!.thicknessMm,
      zZero: 'table',
      holdDown: 'vacuum',
      vacuumKpa: 61,
      quantity: 24,
      status: 'programmed',
    })
    .$returningId();
  jobId = id;
  // the program stored the way an upload stores it, and its estimate computed by the server
  const program = await addProgramVersion(db, { shopId: shop!.id, jobId }, 'shelf-brackets-birch-18mm.nc', readFileSync(FIXTURE));
  const priya = await signInOverHttp('priya@alder-finch.example', DEMO_PASSWORD);
  const queued = await callApi<{ estimate: { id: number } }>(priya.jar, 'POST', `/api/programs/${program.programId}/estimates`, { machineId: machine!.id });
  expect([200, 202]).toContain(queued.status);
  const deadline = Date.now() + 120_000;
  for (;;) {
    const r = await callApi<{ estimate: { status: string } }>(priya.jar, 'GET', `/api/estimates/${queued.body.estimate.id}`);
    if (r.body.estimate.status === 'done') break;
    if (r.body.estimate.status === 'failed' || Date.now() > deadline) throw new Error(`estimate: ${JSON.stringify(r.body.estimate)}`);
    await sleep(250);
  }
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  if (dbm) {
    if (jobId) await removeJob(jobId).catch((e: unknown) => console.warn(`e2e clean-up of job ${jobId} failed:`, e));
    await dbm.closeDb();
  }
  await server?.stop();
});

async function signedInPage(email: string): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  const signIn = new SignInPage(page, server.baseUrl);
  await signIn.open();
  await signIn.signIn(email, DEMO_PASSWORD);
  // admins and estimators land on the dashboard, the others on the jobs page
  await page.waitForURL(/\/(dashboard|jobs)$/);
  return page;
}

async function customerLink(subjectPart: string): Promise<string> {
  const deadline = Date.now() + 15_000;
  for (;;) {
    const res = await fetch(`${MAIL_CAPTURE_URL}/messages`);
    const found = ((await res.json()) as { subject: string; text: string; to: string[] }[]).filter((m) => m.subject.includes(subjectPart));
    if (found.length > 0) {
      expect(found).toHaveLength(1);
      expect(found[0]!.to).toEqual(['orders@marlow-street-bakery.example']);
      const m = /(https?:\/\/\S+\/q\/[A-Za-z0-9_-]+)/.exec(found[0]!.text);
      if (!m) throw new Error(`no link in ${found[0]!.text}`);
      return m[1]!;
    }
    if (Date.now() > deadline) throw new Error(`no captured mail with "${subjectPart}"`);
    await sleep(200);
  }
}

let quoteNumber = '';
let totalText = '';

describe('an estimator quotes a job and the customer accepts', () => {
  it('builds a quote on the job page, the total moving with the quantity, and saves it', async () => {
    const page = await signedInPage('tomas@alder-finch.example');
    const job = new JobPage(page, server.baseUrl);
    await job.open(jobId);
    const quotes = page.getByTestId('job-quotes');
    await quotes.getByRole('button', { name: 'New quote' }).click();
    const builder = page.getByRole('form', { name: 'Quote builder' });
    await builder.waitFor();
    // the job's quantity and the parts the estimate found are the defaults
    expect(await builder.getByLabel('Quantity (pieces)').inputValue()).toBe('24');
    const total = page.getByTestId('build-up-total');
    await total.waitFor();
    const at24 = (await total.innerText()).trim();
    expect(at24).toMatch(/^EUR [\d,]+\.\d{2}$/);
    // more pieces, more sheets, a higher total, at once in the browser
    await builder.getByLabel('Quantity (pieces)').fill('240');
    await page.waitForFunction((before) => document.querySelector('[data-testid="build-up-total"]')?.textContent?.trim() !== before, at24);
    const at240 = (await total.innerText()).trim();
    const euros = (t: string) => Number(t.replace(/[^\d.]/g, ''));
    expect(euros(at240)).toBeGreaterThan(euros(at24));
    // a bad quantity names the field and hides the price
    await builder.getByLabel('Quantity (pieces)').fill('0');
    await expect.poll(() => builder.getByText('Enter the quantity as a whole number of 1 or more.').count()).toBe(1);
    expect(await builder.getByRole('button', { name: 'Save draft quote' }).isDisabled()).toBe(true);
    await builder.getByLabel('Quantity (pieces)').fill('24');
    await page.waitForFunction((want) => document.querySelector('[data-testid="build-up-total"]')?.textContent?.trim() === want, at24);
    // each line says how it was computed
    expect(await page.getByTestId('quote-build-up').locator('[data-line="sheets"] td').first().innerText()).toMatch(/⌈24 pieces ÷ \d+ per sheet⌉ = \d+/);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'quote-builder.png'), fullPage: true });

    await builder.getByRole('button', { name: 'Save draft quote' }).click();
    const saved = quotes.getByRole('status').filter({ hasText: /saved as a draft/ });
    await saved.waitFor();
    quoteNumber = /Quote (Q-\d{4}-\d{4})/.exec(await saved.innerText())![1]!;
    const item = page.getByTestId(`quote-${quoteNumber}`);
    expect((await item.getByTestId('quote-status').innerText()).trim()).toBe('Draft');
    totalText = (await item.getByTestId('quote-total').innerText()).trim();
    expect(totalText).toBe(at24);
    // the server stored the total the browser showed
    const [row] = await dbm.db.select().from(s.quotes).where(and(eq(s.quotes.jobId, jobId), eq(s.quotes.number, quoteNumber)));
    expect(`EUR ${(row!.totalMinor / 100).toLocaleString('en', { minimumFractionDigits: 2 })}`).toBe(totalText);

    await item.getByRole('button', { name: 'Send to customer' }).click();
    await quotes.getByRole('status').filter({ hasText: `Quote ${quoteNumber} sent to the customer.` }).waitFor();
    await expect.poll(async () => (await item.getByTestId('quote-status').innerText()).trim()).toBe('Sent');
    expect((await job.status()).trim()).toBe('Quoted');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'quote-sent.png'), fullPage: true });
    await page.close();
  });

  it('`npm run mail:list` shows the message to the customer with its PDF attached', async () => {
    // the script the Done-when names, run as npm runs it (scripts/mail-read.ts over the capture's reader)
    await customerLink(`Quote ${quoteNumber} from Alder & Finch Shopfitting: ${TITLE}`);
    const { stdout } = await run('npm', ['run', '-s', 'mail:list'], { cwd: ROOT, env: { ...process.env, MAIL_CAPTURE_URL } });
    const subject = `  subject: Quote ${quoteNumber} from Alder & Finch Shopfitting: ${TITLE}`;
    const lines = stdout.split('\n');
    const at = lines.indexOf(subject);
    expect(at, stdout.slice(-2000)).toBeGreaterThan(0);
    expect(lines[at - 1]).toMatch(/ to orders@marlow-street-bakery\.example$/);
    expect(lines[at + 1]).toMatch(new RegExp(`^  attachments: ${quoteNumber}\\.pdf \\(\\d+ B\\)$`));
    expect(lines.slice(at + 2, at + 8).join('\n')).toContain(`${totalText} in total`);
  });

  it('the customer opens the link from the e-mail, signed out, and accepts once', async () => {
    // numbers are per shop, so other shops' tests send the same number: the job's title tells them apart
    const link = await customerLink(`Quote ${quoteNumber} from Alder & Finch Shopfitting: ${TITLE}`);
    expect(link.startsWith(`${server.baseUrl}/q/`)).toBe(true);
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.goto(link);
    await page.getByRole('heading', { level: 1, name: `Quote ${quoteNumber}` }).waitFor();
    expect((await page.getByTestId('customer-total').innerText()).trim()).toBe(`Total ${totalText}`);
    // no shop navigation for a visitor
    expect(await page.getByRole('link', { name: 'Jobs' }).count()).toBe(0);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'quote-customer.png'), fullPage: true });

    // the name is needed
    await page.getByRole('button', { name: 'Accept the quote' }).click();
    await page.getByText('Enter your name.').waitFor();
    await page.getByLabel('Your name').fill('Maren Holt');
    await page.getByLabel('Purchase-order number (optional)').fill('MSB-2027-014');
    await page.getByRole('button', { name: 'Accept the quote' }).click();
    await page.getByTestId('quote-link-state').filter({ hasText: 'This quote has been accepted.' }).waitFor();
    expect(await page.getByRole('button', { name: 'Accept the quote' }).count()).toBe(0);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'quote-customer-done.png'), fullPage: true });

    // opened again: answered, nothing to press
    await page.goto(link);
    await page.getByTestId('quote-link-state').filter({ hasText: 'This quote has been accepted.' }).waitFor();
    expect(await page.getByRole('radio').count()).toBe(0);
    await page.close();
  });

  it('the job shows the quote accepted and itself accepted', async () => {
    const page = await signedInPage('tomas@alder-finch.example');
    const job = new JobPage(page, server.baseUrl);
    await job.open(jobId);
    const item = page.getByTestId(`quote-${quoteNumber}`);
    await item.waitFor();
    expect((await item.getByTestId('quote-status').innerText()).trim()).toBe('Accepted');
    expect(await item.innerText()).toContain('Accepted by Maren Holt, purchase order MSB-2027-014.');
    expect((await job.status()).trim()).toBe('Accepted');
    expect((await job.history()).join('\n')).toMatch(/accepted quote/);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'quote-job-accepted.png'), fullPage: true });
    await page.close();
  });
});
