// `npm run bench -- viewer`: the 3D viewer on the generated 1,000,000-line program in headless
// Debian Chromium (WebGL2 in software through SwiftShader), against the built app (`next start`
// on the test database with the demo users, as the e2e tests; run `npx next build` first).
// (1) file chosen on /preview → full path drawn (progressbar at 100 and two frames later),
//     against `npm run estimate -- FILE --json` on the same file in the same run (target ≤ 1.5×);
// (2) the main thread's long tasks (PerformanceObserver 'longtask', > 50 ms) while the worker
//     parses (target: none);
// (3) memory of the tab and its worker: both run in one renderer process, so its resident set
//     (VmRSS, every ArrayBuffer included) above its figure before the file was chosen, per move
//     (target ≤ 250 bytes per move), at the peak and once drawn;
// (4) frame time while playing (software WebGL: informative, not a target).
// Figures are printed, never asserted. BENCH_VIEWER_LINES changes the program's size.
import { readdirSync, readFileSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium } from 'playwright-core';
import { generateProgram } from '@/fixtures/program-generator';
import { DEMO_PASSWORD, startAppServer } from '../integration/support/app-server';
import { ROOT, runCli } from '../integration/support/estimates';
import { CHROMIUM_PATH } from '../e2e/support/browser';

const LINES = Number(process.env.BENCH_VIEWER_LINES ?? 1_000_000);
const PORT = Number(process.env.BENCH_VIEWER_PORT ?? 3119);
const GL_ARGS = ['--headless', '--no-sandbox', '--use-angle=swiftshader', '--enable-unsafe-swiftshader', '--ignore-gpu-blocklist', '--disable-background-networking', '--no-first-run'];

function rendererRss(): number {
  let best = 0;
  for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
    try {
      const cmd = readFileSync(`/proc/${pid}/cmdline`, 'utf8');
      if (!cmd.includes('chromium') || !cmd.includes('--type=renderer')) continue;
      const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
      if (m) best = Math.max(best, Number(m[1]) * 1024);
    } catch {
      // the process ended between the listing and the read
    }
  }
  return best;
}

const mb = (b: number) => `${(b / 1024 / 1024).toFixed(0)} MB`;

export default async function viewerBench(): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'kerfcast-viewer-bench-'));
  const file = path.join(dir, 'generated-nest.nc');
  writeFileSync(file, generateProgram(LINES, 1));
  const profile = JSON.parse(readFileSync(path.join(ROOT, 'fixtures/machines/router-1.json'), 'utf8'));
  const server = await startAppServer(PORT);
  const context = await chromium.launchPersistentContext(path.join(dir, 'profile'), { executablePath: CHROMIUM_PATH, headless: true, args: GL_ARGS, viewport: { width: 1400, height: 1000 } });
  try {
    context.setDefaultTimeout(600_000);
    const page = await context.newPage();
    // tsx compiles this file with esbuild's keepNames, which wraps named functions inside the
    // page.evaluate callbacks in a __name(fn, "name") helper that only exists in Node
    await page.addInitScript('globalThis.__name = (fn) => fn;');
    await page.addInitScript(() => {
      const w = window as unknown as { __longTasks: number[] };
      w.__longTasks = [];
      new PerformanceObserver((list) => {
        for (const e of list.getEntries()) w.__longTasks.push(e.duration);
      }).observe({ type: 'longtask', buffered: true });
    });
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').fill('priya@alder-finch.example');
    await page.keyboard.press('Tab');
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press('Enter');
    await page.getByTestId('main-nav').waitFor();
    await page.goto(`${server.baseUrl}/preview`);
    await page.getByLabel('Program file').waitFor();
    await page.waitForTimeout(1000);
    await page.evaluate(() => ((window as unknown as { __longTasks: number[] }).__longTasks = []));
    const baseline = rendererRss();
    let peak = baseline;
    const sampler = setInterval(() => (peak = Math.max(peak, rendererRss())), 100);
    const started = performance.now();
    await page.getByLabel('Program file').setInputFiles(file);
    await page.locator('[data-testid="viewer"] [role="progressbar"][aria-valuenow="100"]').waitFor();
    await page.evaluate(() => new Promise<void>((r) => requestAnimationFrame(() => requestAnimationFrame(() => r()))));
    const drawnMs = performance.now() - started;
    const longTasks = await page.evaluate(() => (window as unknown as { __longTasks: number[] }).__longTasks);
    await page.waitForTimeout(1500);
    clearInterval(sampler);
    const settled = rendererRss();

    // frame times while playing at 100×
    await page.getByTestId('speed').selectOption('100');
    await page.getByTestId('viewer-stage').focus();
    await page.keyboard.press('Home');
    const frames = await page.evaluate(async () => {
      (document.querySelector('[data-testid="play"]') as HTMLButtonElement).click();
      const times: number[] = [];
      let last = performance.now();
      await new Promise<void>((resolve) => {
        const end = last + 4000;
        const tick = (now: number) => {
          times.push(now - last);
          last = now;
          if (now < end) requestAnimationFrame(tick);
          else resolve();
        };
        requestAnimationFrame(tick);
      });
      (document.querySelector('[data-testid="play"]') as HTMLButtonElement).click();
      return times.slice(1).sort((a, b) => a - b);
    });

    const cli = await runCli(file, profile, { sheet: { widthMm: 1530, lengthMm: 3060, thicknessMm: 18 }, zero: 'top', hold: 'vacuum', vacuumKpa: 60 });
    const moves = (cli.json as { moves: number }).moves;
    const median = frames[Math.floor(frames.length / 2)] ?? NaN;
    const p95 = frames[Math.floor(frames.length * 0.95)] ?? NaN;
    console.log(`program: ${LINES.toLocaleString('en')} lines, ${moves.toLocaleString('en')} moves`);
    console.log(`(1) file chosen → path drawn ${(drawnMs / 1000).toFixed(2)} s; CLI estimate ${(cli.wallMs / 1000).toFixed(2)} s; ratio ${(drawnMs / cli.wallMs).toFixed(2)} (target ≤ 1.5)`);
    console.log(`(2) main-thread long tasks while the worker parsed: ${longTasks.length}${longTasks.length ? ` (longest ${Math.max(...longTasks).toFixed(0)} ms, sum ${longTasks.reduce((a, b) => a + b, 0).toFixed(0)} ms)` : ''} (target: none over 50 ms)`);
    console.log(`(3) renderer (tab + worker) above its ${mb(baseline)} before: peak +${mb(peak - baseline)} = ${((peak - baseline) / moves).toFixed(0)} B/move, drawn +${mb(settled - baseline)} = ${((settled - baseline) / moves).toFixed(0)} B/move (target ≤ 250 B/move); CLI process peak ${mb(cli.peakRssBytes)}`);
    console.log(`(4) frame time while playing (software WebGL): median ${median.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms over ${frames.length} frames`);
  } finally {
    await context.close();
    await server.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}
