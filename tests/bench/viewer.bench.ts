// `npm run bench -- viewer`: the 3D viewer on the generated 1,000,000-line program in headless
// Debian Chromium (WebGL2 in software through SwiftShader), against the built app (`next start`
// on the test database with the demo users, as the e2e tests; run `npx next build` first).
// (1) file chosen on /preview → full path drawn (progressbar at 100 and two frames later),
//     against `npm run estimate -- FILE --json` on the same file in the same run (target ≤ 1.5×);
// (2) the main thread's long tasks (PerformanceObserver 'longtask', > 50 ms) while the worker
//     parses (target: none);
// (3) memory of the tab and its worker: both run in one renderer process, so its resident set
//     (VmRSS, every ArrayBuffer included) above its figure before the file was chosen, per move
//     (target ≤ 250 bytes per move), at the peak and once drawn; and, to tell memory the page
//     keeps from memory it has let go but not yet collected, once more after a full garbage
//     collection (CDP HeapProfiler.collectGarbage); the GPU process's figure beside it
//     (SwiftShader keeps its copy of the buffers there);
// (4) frame time while playing (software WebGL: informative, not a target): the time between
//     the playback loop's own animation frames (PlaybackStore.frameTimesMs), over at least 10
//     frames or 20 s, whichever comes later, capped at 90 s. A frame of the whole path in
//     software can take seconds, so a fixed short window may hold no frame at all.
// The long tasks are split at the worker's answer (the performance mark
// 'kerfcast-viewer-result'): before it the worker parses; after it the page draws.
// Figures are printed, never asserted. BENCH_VIEWER_LINES changes the program's size;
// BENCH_VIEWER_PROFILE=1 also records the main thread's CPU profile from the file chosen to
// the path drawn (.data/bench/viewer-main.cpuprofile) and prints its heaviest functions.
import { mkdirSync, readdirSync, readFileSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
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

function rendererRss(type = 'renderer'): number {
  let best = 0;
  for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
    try {
      const cmd = readFileSync(`/proc/${pid}/cmdline`, 'utf8');
      if (!cmd.includes('chromium') || !cmd.includes(`--type=${type}`)) continue;
      const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
      if (m) best = Math.max(best, Number(m[1]) * 1024);
    } catch {
      // the process ended between the listing and the read
    }
  }
  return best;
}

const mb = (b: number) => `${(b / 1024 / 1024).toFixed(0)} MB`;

interface CpuProfile {
  nodes: { id: number; callFrame: { functionName: string; url: string; lineNumber: number }; hitCount?: number }[];
  samples: number[];
  timeDeltas: number[];
}

/** the heaviest functions of a CPU profile by self time */
function topSelf(profile: CpuProfile, count: number): string[] {
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const self = new Map<string, number>();
  profile.samples.forEach((id, i) => {
    const n = byId.get(id);
    if (!n) return;
    const f = n.callFrame;
    const key = `${f.functionName || '(anonymous)'} ${f.url.split('/').slice(-1)[0]}:${f.lineNumber + 1}`;
    self.set(key, (self.get(key) ?? 0) + (profile.timeDeltas[i] ?? 0) / 1000);
  });
  return [...self.entries()].sort((a, b) => b[1] - a[1]).slice(0, count).map(([k, ms]) => `${ms.toFixed(0).padStart(7)} ms  ${k}`);
}

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
      const w = window as unknown as { __longTasks: { start: number; ms: number }[] };
      w.__longTasks = [];
      new PerformanceObserver((list) => {
        for (const e of list.getEntries()) w.__longTasks.push({ start: e.startTime, ms: e.duration });
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
    await page.evaluate(() => ((window as unknown as { __longTasks: unknown[] }).__longTasks = []));
    const profiling = process.env.BENCH_VIEWER_PROFILE === '1';
    const cdp = await context.newCDPSession(page);
    const gpuBefore = rendererRss('gpu-process');
    if (profiling) {
      await cdp.send('Profiler.enable');
      await cdp.send('Profiler.setSamplingInterval', { interval: 500 });
      await cdp.send('Profiler.start');
    }
    const baseline = rendererRss();
    let peak = baseline;
    const sampler = setInterval(() => (peak = Math.max(peak, rendererRss())), 100);
    const started = performance.now();
    await page.getByLabel('Program file').setInputFiles(file);
    await page.locator('[data-testid="viewer"] [role="progressbar"][aria-valuenow="100"]').waitFor();
    await page.evaluate(() => new Promise<void>((r) => requestAnimationFrame(() => requestAnimationFrame(() => r()))));
    const drawnMs = performance.now() - started;
    const { tasks, resultAt, openedMs, timings } = await page.evaluate(() => ({
      tasks: (window as unknown as { __longTasks: { start: number; ms: number }[] }).__longTasks,
      resultAt: performance.getEntriesByName('kerfcast-viewer-result')[0]?.startTime ?? Infinity,
      openedMs: (window as unknown as { __kerfcastViewerOpenedMs?: number }).__kerfcastViewerOpenedMs ?? NaN,
      timings: (window as unknown as { __kerfcastViewerTimings?: { read: number; engine: number; path: number } }).__kerfcastViewerTimings ?? null,
    }));
    const parsing = tasks.filter((t) => t.start < resultAt).map((t) => t.ms);
    const drawing = tasks.filter((t) => t.start >= resultAt).map((t) => t.ms);
    // the first frame as the software rasteriser finishes it: a read of one pixel waits for it
    const rasterMs = await page.evaluate(() => {
      const t = performance.now();
      const gl = document.querySelector<HTMLCanvasElement>('[data-testid="viewer-stage"] canvas')?.getContext('webgl2');
      gl?.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, new Uint8Array(4));
      return performance.now() - t;
    });
    let profileTop: string[] = [];
    if (profiling) {
      const { profile } = (await cdp.send('Profiler.stop')) as unknown as { profile: CpuProfile };
      const out = path.join(ROOT, '.data/bench');
      mkdirSync(out, { recursive: true });
      writeFileSync(path.join(out, 'viewer-main.cpuprofile'), JSON.stringify(profile));
      profileTop = topSelf(profile, 25);
    }
    await page.waitForTimeout(1500);
    clearInterval(sampler);
    const settled = rendererRss();
    await cdp.send('HeapProfiler.collectGarbage');
    await page.waitForTimeout(500);
    const collected = rendererRss();
    const gpu = rendererRss('gpu-process');

    // frame times while playing at 100×
    await page.getByTestId('speed').selectOption('100');
    await page.getByTestId('viewer-stage').focus();
    await page.keyboard.press('Home');
    await page.getByTestId('play').click();
    const playStarted = Date.now();
    for (;;) {
      await page.waitForTimeout(1000);
      const n = await page.evaluate(() => (window as unknown as { __kerfcastPlayback?: { frameTimesMs: number[] } }).__kerfcastPlayback?.frameTimesMs.length ?? 0);
      const waited = Date.now() - playStarted;
      if ((n >= 11 && waited >= 20_000) || waited >= 90_000) break;
    }
    await page.getByTestId('play').click();
    // the first interval runs from the click to the first frame; the rest are frame to frame
    const frames = (await page.evaluate(() => (window as unknown as { __kerfcastPlayback?: { frameTimesMs: number[] } }).__kerfcastPlayback?.frameTimesMs.slice(1) ?? [])).sort((a, b) => a - b);

    const cli = await runCli(file, profile, { sheet: { widthMm: 1530, lengthMm: 3060, thicknessMm: 18 }, zero: 'top', hold: 'vacuum', vacuumKpa: 60 });
    const moves = (cli.json as { moves: number }).moves;
    const median = frames[Math.floor(frames.length / 2)] ?? NaN;
    const p95 = frames[Math.floor(frames.length * 0.95)] ?? NaN;
    console.log(`program: ${LINES.toLocaleString('en')} lines, ${moves.toLocaleString('en')} moves`);
    console.log(`(1) file chosen → path drawn ${(drawnMs / 1000).toFixed(2)} s; CLI estimate ${(cli.wallMs / 1000).toFixed(2)} s; ratio ${(drawnMs / cli.wallMs).toFixed(2)} (target ≤ 1.5); the software rasteriser finished that first frame ${(rasterMs / 1000).toFixed(2)} s later`);
    console.log(`    of which the worker's answer ${(openedMs / 1000).toFixed(2)} s (its read ${timings?.read} ms, engine ${timings?.engine} ms, path ${timings?.path} ms), the page after it ${((drawnMs - openedMs) / 1000).toFixed(2)} s`);
    const taskLine = (list: number[]) => `${list.length}${list.length ? ` (longest ${Math.max(...list).toFixed(0)} ms, sum ${list.reduce((a, b) => a + b, 0).toFixed(0)} ms)` : ''}`;
    console.log(`(2) main-thread long tasks while the worker parsed: ${taskLine(parsing)} (target: none over 50 ms); after its answer, while drawing: ${taskLine(drawing)}`);
    console.log(`(3) renderer (tab + worker) above its ${mb(baseline)} before: peak +${mb(peak - baseline)} = ${((peak - baseline) / moves).toFixed(0)} B/move, drawn +${mb(settled - baseline)} = ${((settled - baseline) / moves).toFixed(0)} B/move (target ≤ 250 B/move), after a full collection +${mb(collected - baseline)} = ${((collected - baseline) / moves).toFixed(0)} B/move; GPU process +${mb(gpu - gpuBefore)}; CLI process peak ${mb(cli.peakRssBytes)}`);
    console.log(`(4) frame time while playing (software WebGL): median ${median.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms over ${frames.length} frames`);
    if (profileTop.length) console.log(`main thread, file chosen → drawn, heaviest self time:\n${profileTop.join('\n')}`);
  } finally {
    await context.close();
    await server.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}
