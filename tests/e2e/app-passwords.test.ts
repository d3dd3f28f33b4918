// Passwords in the browser (issue 18 finding 5; OWASP ASVS 4.0.3 V2.1.5 users change
// their password, V2.1.1 length, V3.3.3 other sessions end): an admin sets a one-time
// password on the users page; the user signing in with it is sent to /change-password by
// every page until they choose their own; the form names a short or repeated-wrong field
// at its field and, once changed, leads on to the jobs page.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import { eq, sql } from 'drizzle-orm';
import { DEMO_PASSWORD, E2E_PORT, startAppServer, type AppServer } from '../integration/support/app-server';
import { SignInPage } from './pages/sign-in-page';
import { launchBrowser, type BrowserSession } from './support/browser';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

const USER = { name: 'Oskar Otp', email: 'oskar.otp@alder-finch.example' };
const ONE_TIME = 'handed-over-sheet-3';
const OWN = 'my-own-offcut-shelf';

let server: AppServer;
let browser: BrowserSession;
let dbm: DbModule;
let s: Schema;

beforeAll(async () => {
  server = await startAppServer(E2E_PORT);
  browser = await launchBrowser();
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  await dbm.db.execute(sql`DELETE FROM sign_in_limits`);
  await dbm.db.delete(s.users).where(eq(s.users.email, USER.email));
  const [shop] = await dbm.db.select().from(s.shops).where(eq(s.shops.slug, 'alder-finch'));
  await dbm.db.insert(s.users).values({ shopId: shop.id, ...USER, role: 'operator', passwordHash: await bcrypt.hash(DEMO_PASSWORD, 4) });
});

afterAll(async () => {
  if (dbm) {
    await dbm.db.delete(s.users).where(eq(s.users.email, USER.email));
    await dbm.db.execute(sql`DELETE FROM sign_in_limits`);
    await dbm.closeDb();
  }
  await browser?.close();
  await server?.stop();
});

describe('one-time password, then one of their own (V2.1.5)', () => {
  it('the admin sets it on the users page', async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const signIn = new SignInPage(page, server.baseUrl);
    await signIn.open();
    await signIn.signIn('ada@alder-finch.example', DEMO_PASSWORD);
    await page.waitForURL(/\/dashboard$/);
    await page.goto(`${server.baseUrl}/admin/users`);
    const row = page.getByRole('table', { name: "Your shop's users" }).locator('tbody tr', { hasText: USER.email });
    await row.getByText('One-time password…').click();
    await row.getByLabel(`One-time password for ${USER.name}`).fill(ONE_TIME);
    await row.getByRole('button', { name: 'Set, sign them out' }).click();
    await row.getByRole('status').waitFor();
    expect(await row.getByRole('status').innerText()).toContain('must choose a new password');
    await page.close();
  });

  it('the user is held on /change-password until they choose their own, then goes on', async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const signIn = new SignInPage(page, server.baseUrl);
    await signIn.open();
    await signIn.signIn(USER.email, ONE_TIME);
    await page.waitForURL(/\/change-password$/);
    await page.goto(`${server.baseUrl}/machines`);
    await page.waitForURL(/\/change-password$/);
    await page.getByText('Choose your own password to go on.').waitFor();

    const form = page.getByRole('form', { name: 'Change password' });
    await form.getByLabel('Current password').fill(ONE_TIME);
    await form.getByLabel('New password', { exact: true }).fill('too-short');
    await form.getByLabel('New password again').fill('too-short');
    await form.getByRole('button', { name: 'Change password' }).click();
    await form.getByText('Use at least 12 characters.').waitFor();

    await form.getByLabel('New password', { exact: true }).fill(OWN);
    await form.getByLabel('New password again').fill(OWN);
    await form.getByRole('button', { name: 'Change password' }).click();
    await form.getByRole('status').waitFor();
    expect(await form.getByRole('status').innerText()).toContain('Your password is changed.');
    await form.getByRole('link', { name: 'Go on to Kerfcast' }).click();
    await page.waitForURL(/\/jobs$/);
    await page.close();
  });
});
