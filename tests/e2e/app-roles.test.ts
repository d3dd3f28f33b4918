// Browser test in Debian's Chromium against the built app and the seeded test
// database: each demo role signs in with the keyboard, sees its own navigation,
// gets the 403 page on a page outside its role; a bad password shows the generic
// message; and a screenshot of the jobs page is kept for a look at the design.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, E2E_PORT, startAppServer, type AppServer } from '../integration/support/app-server';
import { AppShell } from './pages/app-shell';
import { JobsPage } from './pages/jobs-page';
import { SignInPage } from './pages/sign-in-page';
import { launchBrowser, type BrowserSession } from './support/browser';

const SCREENSHOT_DIR = path.resolve(__dirname, '../../.data/screenshots');

let server: AppServer;
let browser: BrowserSession;

beforeAll(async () => {
  server = await startAppServer(E2E_PORT);
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

async function freshPage() {
  // Each role gets a clean cookie jar inside the one browser profile.
  await browser.context.clearCookies();
  return browser.context.newPage();
}

// Expectations from the role table as the product states it (lib/auth/roles.ts header).
const ROLES = [
  { email: 'ada@alder-finch.example', role: 'Admin', home: 'Dashboard', nav: ['Jobs', 'Dashboard', 'Preview', 'Runs', 'Machines', 'Materials', 'Customers', 'Users', 'Settings'], forbidden: null },
  { email: 'priya@alder-finch.example', role: 'Programmer', home: 'Jobs', nav: ['Jobs', 'Preview', 'Runs', 'Machines', 'Materials', 'Customers'], forbidden: '/admin/users' },
  { email: 'tomas@alder-finch.example', role: 'Estimator', home: 'Dashboard', nav: ['Jobs', 'Dashboard', 'Preview', 'Runs', 'Machines', 'Materials', 'Customers'], forbidden: '/admin/users' },
  { email: 'lena@alder-finch.example', role: 'Operator', home: 'Jobs', nav: ['Jobs', 'Preview', 'Runs', 'Machines', 'Materials'], forbidden: '/customers' },
] as const;

describe('signing in as each demo role', () => {
  for (const r of ROLES) {
    it(`${r.role}: sees ${r.nav.join(', ')}${r.forbidden ? ` and gets 403 on ${r.forbidden}` : ''}`, async () => {
      const page = await freshPage();
      const signIn = new SignInPage(page, server.baseUrl);
      const shell = new AppShell(page);
      await signIn.open();
      await signIn.signIn(r.email, DEMO_PASSWORD);
      await page.waitForURL(r.home === 'Dashboard' ? /\/dashboard$/ : /\/jobs$/);
      await shell.waitUntilSignedIn();
      expect(await shell.navLabels()).toEqual(r.nav);
      expect(await shell.roleShown()).toBe(r.role);
      expect(await shell.currentPageLabel()).toBe(r.home);
      if (r.home !== 'Jobs') await page.goto(`${server.baseUrl}/jobs`);
      expect((await new JobsPage(page, server.baseUrl).titles()).length).toBeGreaterThan(0);

      if (r.forbidden) {
        const response = await page.goto(`${server.baseUrl}${r.forbidden}`);
        expect(response?.status()).toBe(403);
        await page.getByTestId('forbidden-page').waitFor();
        expect(await page.getByRole('heading', { level: 1 }).innerText()).toBe('This page is not open to your role');
      } else {
        const response = await page.goto(`${server.baseUrl}/admin/users`);
        expect(response?.status()).toBe(200);
        expect(await page.getByRole('heading', { level: 1 }).innerText()).toBe('Users');
      }
      await shell.signOut();
      await page.close();
    });
  }
});

describe('sign-in failures', () => {
  it('a bad password shows the generic message, focused, and stays on /sign-in', async () => {
    const page = await freshPage();
    const signIn = new SignInPage(page, server.baseUrl);
    await signIn.open();
    await signIn.signIn('tomas@alder-finch.example', 'not-the-password');
    expect(await signIn.errorText()).toBe('Wrong e-mail or password. Check both and try again.');
    expect(await signIn.isFocusedOnError()).toBe(true);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.close();
  });

  it('empty fields are named before anything is sent', async () => {
    const page = await freshPage();
    await new SignInPage(page, server.baseUrl).open();
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('Enter your e-mail.').waitFor();
    await page.getByText('Enter your password.').waitFor();
    expect(await page.getByLabel('E-mail').getAttribute('aria-invalid')).toBe('true');
    await page.close();
  });

  it('a signed-out visit to a page lands on /sign-in', async () => {
    const page = await freshPage();
    await page.goto(`${server.baseUrl}/machines`);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.close();
  });
});

describe('look', () => {
  it('renders the jobs page with the shipped fonts (screenshot in .data/screenshots)', async () => {
    const page = await freshPage();
    const requested: string[] = [];
    page.on('request', (request) => requested.push(request.url()));
    const signIn = new SignInPage(page, server.baseUrl);
    await signIn.open();
    await signIn.signIn('priya@alder-finch.example', DEMO_PASSWORD);
    await page.waitForURL(/\/jobs$/);
    const jobs = new JobsPage(page, server.baseUrl);
    await jobs.titles();
    await page.evaluate(() => document.fonts.ready);
    // Fonts come from our own origin (next/font/local), nothing from a font service.
    const fonts = requested.filter((u) => /\.woff2(\?|$)/.test(u));
    expect(fonts.length).toBeGreaterThanOrEqual(2);
    expect(requested.filter((u) => !u.startsWith(server.baseUrl) && !u.startsWith('data:'))).toEqual([]);
    const bodyFont = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(bodyFont).toMatch(/textFont|Atkinson/i);
    // Status is written out as a word, not shown by colour alone.
    const statuses = await jobs.statusTexts();
    for (const s of statuses) expect(s).toMatch(/^(Draft|Programmed|Quoted|Accepted|Scheduled|Running|Done|Cancelled)$/);
    mkdirSync(SCREENSHOT_DIR, { recursive: true });
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'jobs.png'), fullPage: true });
    await page.close();
  });
});
