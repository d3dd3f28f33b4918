// The 3D viewer in Debian's Chromium (WebGL2 in software through SwiftShader): on /preview a
// programmer picks the demo fixture, the worker's progressbar reaches 100, the canvas is not
// blank (its pixels read back), the legend and the parts table show the fixture's parts,
// playing for a second moves Elapsed and the highlighted source line, and choosing a finding
// highlights the finding's own line. No console errors, no uncaught errors. A screenshot is
// kept in .data/screenshots.
import { mkdirSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { mkdtempSync, rmSync } from 'node:fs';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, E2E_PORT, startAppServer, type AppServer } from '../integration/support/app-server';
import { AppShell } from './pages/app-shell';
import { SignInPage } from './pages/sign-in-page';
import { CHROMIUM_PATH } from './support/browser';

const SCREENSHOT_DIR = path.resolve(__dirname, '../../.data/screenshots');
const FIXTURE = path.resolve(__dirname, '../../fixtures/programs/shelf-brackets-birch-18mm.nc');
// WebGL needs a GL: SwiftShader, which recent Chromium enables only when asked
const GL_ARGS = ['--headless', '--no-sandbox', '--use-angle=swiftshader', '--enable-unsafe-swiftshader', '--ignore-gpu-blocklist', '--disable-background-networking', '--disable-component-update', '--no-first-run'];

let server: AppServer;
let context: BrowserContext;
let profileDir: string;
let page: Page;
const consoleErrors: string[] = [];

beforeAll(async () => {
  server = await startAppServer(E2E_PORT);
  profileDir = mkdtempSync(path.join(os.tmpdir(), 'kerfcast-viewer-e2e-'));
  context = await chromium.launchPersistentContext(profileDir, { executablePath: CHROMIUM_PATH, headless: true, args: GL_ARGS, viewport: { width: 1400, height: 1000 } });
  context.setDefaultTimeout(90_000);
  page = await context.newPage();
  page.on('console', (m) => {
    if (m.type() === 'error') consoleErrors.push(m.text());
  });
  page.on('pageerror', (e) => consoleErrors.push(`uncaught: ${e.message}`));
  const signIn = new SignInPage(page, server.baseUrl);
  await signIn.open();
  await signIn.signIn('priya@alder-finch.example', DEMO_PASSWORD);
  await new AppShell(page).waitUntilSignedIn();
});

afterAll(async () => {
  await context?.close();
  if (profileDir) rmSync(profileDir, { recursive: true, force: true });
  await server?.stop();
});

const currentLine = async () => Number(await page.locator('[data-testid="source-panel"] [aria-current="true"]').getAttribute('data-line'));

describe('the viewer on /preview', () => {
  it('opens the fixture in the worker: progress to 100, a drawn canvas, the legend and the parts', async () => {
    await page.goto(`${server.baseUrl}/preview`);
    await page.getByLabel('Program file').setInputFiles(FIXTURE);
    await page.locator('[data-testid="viewer"] [role="progressbar"][aria-valuenow="100"]').waitFor();
    await page.waitForTimeout(1500); // a few frames of the demand-driven render loop
    const pixels = await page.evaluate(() => {
      const canvas = document.querySelector<HTMLCanvasElement>('[data-testid="viewer-stage"] canvas');
      const gl = canvas?.getContext('webgl2');
      if (!gl) return null;
      const w = gl.drawingBufferWidth;
      const h = gl.drawingBufferHeight;
      const px = new Uint8Array(w * h * 4);
      gl.readPixels(0, 0, w, h, gl.RGBA, gl.UNSIGNED_BYTE, px);
      const colours = new Set<number>();
      let drawn = 0;
      for (let i = 0; i < px.length; i += 4) {
        // anything but the night background (#1b2026)
        if (Math.abs(px[i] - 0x1b) + Math.abs(px[i + 1] - 0x20) + Math.abs(px[i + 2] - 0x26) > 30) drawn++;
        colours.add((px[i] << 16) | (px[i + 1] << 8) | px[i + 2]);
      }
      return { share: drawn / (w * h), colours: colours.size };
    });
    expect(pixels, 'the canvas has a WebGL2 context').not.toBeNull();
    expect(pixels!.share).toBeGreaterThan(0.02);
    expect(pixels!.colours).toBeGreaterThan(20);
    const legend = await page.getByTestId('viewer-legend').innerText();
    expect(legend).toContain('Cut');
    expect(legend).toContain('Rapid (dashed)');
    const parts = page.getByRole('table', { name: 'Parts' });
    // the fixture nests four shelf brackets (fixtures/generate.ts)
    await expect(parts.locator('tbody tr').count()).resolves.toBe(4);
    expect((await parts.locator('tbody tr').first().innerText()).startsWith('1')).toBe(true);
    await expect(page.locator('[data-part-label]').count()).resolves.toBe(4);
  });

  it('plays on the estimated clock: Elapsed advances and the highlighted line moves', async () => {
    await page.getByTestId('viewer-stage').focus();
    await page.keyboard.press('Home');
    const before = await page.getByLabel('Elapsed').innerText();
    const lineBefore = await currentLine();
    await page.getByTestId('speed').selectOption('10');
    await page.getByRole('button', { name: 'Play' }).click();
    await page.waitForTimeout(1200);
    await page.getByRole('button', { name: 'Pause' }).click();
    const after = await page.getByLabel('Elapsed').innerText();
    expect(before).toBe('0:00');
    expect(after).toMatch(/^\d+:\d\d$/);
    expect(after).not.toBe(before);
    expect(await currentLine()).toBeGreaterThan(lineBefore);
  });

  it('a finding moves the playhead to its line', async () => {
    const findings = page.getByRole('list', { name: 'Findings' }).getByRole('listitem');
    expect(await findings.count()).toBeGreaterThan(0);
    const item = findings.nth(Math.min(1, (await findings.count()) - 1));
    const line = Number(await item.getAttribute('data-line'));
    await item.getByRole('button').click();
    await expect.poll(currentLine).toBe(line);
    await expect(page.getByTestId('viewer-caution').innerText()).resolves.toMatch(/aid, not a guarantee/);
    mkdirSync(SCREENSHOT_DIR, { recursive: true });
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'viewer-preview.png'), fullPage: true });
    expect(consoleErrors).toEqual([]);
  });
});
