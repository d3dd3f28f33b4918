// The reports in Chromium on the demo history (db/seed-runs.ts: runs on both routers, some
// interrupted, one voided on each): an admin signs in and lands on /dashboard with its four
// panels filled in (not loading, not an error); /runs shows the figures, the table with the
// voided and interrupted runs marked as left out, and both charts drawn as SVG (the y = x and
// the 1.00 reference lines, a mark per run); a filter that matches nothing shows the empty
// state. No console errors, no uncaught errors, no CSP violation reported to the console.
// Screenshots are kept in .data/screenshots.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, E2E_PORT, startAppServer, type AppServer } from '../integration/support/app-server';
import { AppShell } from './pages/app-shell';
import { SignInPage } from './pages/sign-in-page';
import { launchBrowser, type BrowserSession } from './support/browser';

const SCREENSHOT_DIR = path.resolve(__dirname, '../../.data/screenshots');

let server: AppServer;
let browser: BrowserSession;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  server = await startAppServer(E2E_PORT);
  browser = await launchBrowser();
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  page = await browser.context.newPage();
  await page.setViewportSize({ width: 1400, height: 1000 });
  page.on('console', (m) => {
    if (m.type() === 'error') problems.push(m.text());
  });
  page.on('pageerror', (e) => problems.push(`uncaught: ${e.message}`));
  const signIn = new SignInPage(page, server.baseUrl);
  await signIn.open();
  await signIn.signIn('ada@alder-finch.example', DEMO_PASSWORD);
  await page.waitForURL(/\/dashboard$/);
  await new AppShell(page).waitUntilSignedIn();
}, 120_000);

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe('the dashboard', () => {
  it('is the admin’s landing page, with its four panels read (none still loading)', async () => {
    expect(await page.getByRole('heading', { level: 1 }).innerText()).toBe('Dashboard');
    for (const id of ['week-hours', 'waiting', 'due-errors', 'ratio']) {
      const panel = page.getByTestId(`panel-${id}`);
      await panel.waitFor();
      await expect.poll(() => panel.getByText('Reading…').count()).toBe(0);
    }
    // the demo history has finished runs on both routers in the last 30 days
    const ratio = page.getByTestId('panel-ratio');
    await ratio.getByRole('table').waitFor();
    expect(await ratio.locator('tbody tr').count()).toBeGreaterThanOrEqual(1);
    expect(await page.getByTestId('panel-waiting').innerText()).toMatch(/Draft|Programmed|Quoted|Accepted|Scheduled|No job is waiting/);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'dashboard.png'), fullPage: true });
    expect(problems).toEqual([]);
  });
});

describe('runs: estimated vs actual', () => {
  it('shows the figures, the table with left-out runs marked, and both charts', async () => {
    await page.goto(`${server.baseUrl}/runs?perPage=100`);
    expect(await page.getByRole('heading', { level: 1 }).innerText()).toBe('Runs: estimated vs actual');
    const table = page.getByRole('table', { name: 'Runs, newest first' });
    await table.waitFor();
    expect(await table.locator('tbody tr').count()).toBeGreaterThan(10);
    expect(await table.locator('[data-standing="voided"]').count()).toBeGreaterThanOrEqual(1);
    expect(await table.locator('[data-standing="interrupted"]').count()).toBeGreaterThanOrEqual(1);
    expect(await page.getByRole('table', { name: 'Actual ÷ estimate per machine' }).locator('tbody tr').count()).toBeGreaterThanOrEqual(1);

    for (const id of ['chart-actual-vs-estimated', 'chart-ratio-over-time']) {
      const chart = page.getByTestId(id);
      await chart.locator('svg.recharts-surface').first().waitFor();
      // a horizontal line has a bounding box 0 high, which Playwright calls hidden: wait for it in the DOM
      await chart.locator('.recharts-reference-line line').first().waitFor({ state: 'attached' });
      const [x1, x2] = await chart.locator('.recharts-reference-line line').first().evaluate((l) => [Number(l.getAttribute('x1')), Number(l.getAttribute('x2'))]);
      expect(x2 - x1).toBeGreaterThan(100);
      await expect.poll(() => chart.locator('.recharts-scatter-symbol').count()).toBeGreaterThan(10);
    }
    await page.evaluate(() => document.fonts.ready);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'runs-report.png'), fullPage: true });
    await page.getByRole('region', { name: 'Charts' }).screenshot({ path: path.join(SCREENSHOT_DIR, 'runs-charts.png') });
    expect(problems).toEqual([]);
  });

  it('a filter that matches nothing says so', async () => {
    await page.goto(`${server.baseUrl}/runs?status=paused&from=2001-01-01&to=2001-01-02`);
    await page.getByText('No run matches these filters.').waitFor();
    expect(problems).toEqual([]);
  });

  it('a bad filter in the address is named and left out', async () => {
    await page.goto(`${server.baseUrl}/runs?status=stopped`);
    await page.getByText('Part of this address could not be used, so it was left out.').waitFor();
    await page.getByRole('table', { name: 'Runs, newest first' }).waitFor();
    expect(problems).toEqual([]);
  });
});
