// Every page under the Content Security Policy, in Debian's Chromium: signed out the
// sign-in page, then signed in as the admin (who may see every page) the jobs,
// machines, customers and users pages, a page that does not exist, and a move between
// pages by the main navigation. Fails on any CSP violation (the browser's
// securitypolicyviolation event, or its console report), on any console error and on
// any uncaught page error; and checks that the page's scripts really ran (React
// hydrated the page), which a policy that blocked them would prevent.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ConsoleMessage, Page } from 'playwright-core';
import { DEMO_PASSWORD, E2E_PORT, startAppServer, type AppServer } from '../integration/support/app-server';
import { AppShell } from './pages/app-shell';
import { SignInPage } from './pages/sign-in-page';
import { launchBrowser, type BrowserSession } from './support/browser';

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

/** What went wrong on a page: CSP violations, console errors, uncaught errors. */
interface Problems {
  violations: string[];
  consoleErrors: string[];
  pageErrors: string[];
}

/**
 * A fresh page that records problems. The violation listener is added before any of the
 * page's own scripts run (an init script is the browser's, not the page's, so the CSP
 * does not apply to it) and reports through a binding, so nothing is lost on navigation.
 */
async function watchedPage(): Promise<{ page: Page; problems: Problems; expectedStatusUrls: Set<string> }> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  const problems: Problems = { violations: [], consoleErrors: [], pageErrors: [] };
  // A page that answers 403/404 on purpose makes Chromium log "Failed to load resource"
  // for the document itself; that one message is expected, nothing else is.
  const expectedStatusUrls = new Set<string>();
  await page.exposeFunction('__kerfcastReportViolation', (text: string) => problems.violations.push(text));
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (event) => {
      const report = (window as unknown as { __kerfcastReportViolation: (t: string) => void }).__kerfcastReportViolation;
      report(`${event.effectiveDirective} blocked ${event.blockedURI || '(inline)'} at ${event.sourceFile}:${event.lineNumber}`);
    });
  });
  page.on('console', (message: ConsoleMessage) => {
    const text = message.text();
    if (/Content[- ]Security[- ]Policy|Refused to (load|execute|apply|connect|create|frame)/i.test(text)) problems.violations.push(text);
    if (message.type() !== 'error') return;
    const url = message.location().url;
    if (/^Failed to load resource: the server responded with a status of 40[34]/.test(text) && expectedStatusUrls.has(url)) return;
    problems.consoleErrors.push(`${text} (${url})`);
  });
  page.on('pageerror', (error) => problems.pageErrors.push(error.message));
  return { page, problems, expectedStatusUrls };
}

/** True once React has hydrated the element: its fiber is attached to the DOM node. */
async function hydrated(page: Page, selector: string): Promise<boolean> {
  return page
    .waitForFunction(
      (sel) => {
        const el = document.querySelector(sel);
        return !!el && Object.keys(el).some((k) => k.startsWith('__reactFiber'));
      },
      selector,
      { timeout: 15_000 },
    )
    .then(() => true)
    .catch(() => false);
}

function expectNoProblems(problems: Problems, where: string) {
  expect(problems.violations, `CSP violations on ${where}`).toEqual([]);
  expect(problems.consoleErrors, `console errors on ${where}`).toEqual([]);
  expect(problems.pageErrors, `uncaught errors on ${where}`).toEqual([]);
}

const SIGNED_IN_PAGES = [
  { path: '/jobs', heading: 'Jobs', status: 200 },
  { path: '/dashboard', heading: 'Dashboard', status: 200 },
  { path: '/runs', heading: 'Runs: estimated vs actual', status: 200 },
  { path: '/machines', heading: 'Machines', status: 200 },
  { path: '/machines/new', heading: 'New machine', status: 200 },
  { path: '/materials', heading: 'Materials', status: 200 },
  { path: '/customers', heading: 'Customers', status: 200 },
  { path: '/admin/users', heading: 'Users', status: 200 },
  { path: '/no-such-page', heading: 'Nothing here', status: 404 },
] as const;

describe('every page under the Content Security Policy', () => {
  it('signed out: the sign-in page runs its scripts with no violation', async () => {
    const { page, problems } = await watchedPage();
    const response = await page.goto(`${server.baseUrl}/sign-in`);
    expect(response?.status()).toBe(200);
    expect(await response?.headerValue('content-security-policy')).toMatch(/script-src 'self' 'nonce-/);
    expect(await hydrated(page, 'form')).toBe(true);
    // The form's own check answers in the browser: proof that its script is running.
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('Enter your e-mail.').waitFor();
    expectNoProblems(problems, '/sign-in');
    await page.close();
  });

  it('signed in as the admin: jobs, machines, customers, users and a missing page', async () => {
    const { page, problems, expectedStatusUrls } = await watchedPage();
    const signIn = new SignInPage(page, server.baseUrl);
    await signIn.open();
    await signIn.signIn('ada@alder-finch.example', DEMO_PASSWORD);
    await page.waitForURL(/\/dashboard$/);
    await new AppShell(page).waitUntilSignedIn();
    expectNoProblems(problems, 'sign-in and the dashboard');

    for (const p of SIGNED_IN_PAGES) {
      const url = `${server.baseUrl}${p.path}`;
      if (p.status !== 200) expectedStatusUrls.add(url);
      const response = await page.goto(url);
      expect(response?.status(), p.path).toBe(p.status);
      expect(await page.getByRole('heading', { level: 1 }).innerText()).toBe(p.heading);
      expect(await hydrated(page, 'h1'), `${p.path} hydrated`).toBe(true);
      await page.waitForLoadState('networkidle');
      expectNoProblems(problems, p.path);
    }
    await page.close();
  });

  it('moving between pages by the navigation (client-side, chunks loaded on demand)', async () => {
    const { page, problems } = await watchedPage();
    const signIn = new SignInPage(page, server.baseUrl);
    await signIn.open();
    await signIn.signIn('ada@alder-finch.example', DEMO_PASSWORD);
    await page.waitForURL(/\/dashboard$/);
    const shell = new AppShell(page);
    await shell.waitUntilSignedIn();
    expect(await hydrated(page, '[data-testid="main-nav"]')).toBe(true);
    for (const label of ['Machines', 'Customers', 'Users', 'Jobs']) {
      await page.getByTestId('main-nav').getByRole('link', { name: label }).click();
      await page.waitForFunction((l) => document.querySelector('h1')?.textContent === l, label);
      expect(await shell.currentPageLabel()).toBe(label);
    }
    await page.waitForLoadState('networkidle');
    expectNoProblems(problems, 'navigation');
    await shell.signOut();
    expectNoProblems(problems, 'sign-out');
    await page.close();
  });
});
