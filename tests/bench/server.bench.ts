// `npm run bench -- server`: the server's estimate path and its jobs list, against the built
// app (`next start`) on a scratch database and the local services (bash scripts/services-start.sh).
// (1) The generated 1,000,000-line program uploaded through POST /api/jobs/:jobId/programs,
//     timed from the first byte sent to the estimate stored (GET /api/estimates/:id done),
//     against `npm run estimate -- FILE … --json` on the same file, profile and settings in
//     the same run (target: ratio ≤ 1.3).
// (2) The server's resident memory (VmRSS of the whole process, so the estimate's worker
//     thread counts) sampled during that upload and estimate, above its idle figure before
//     it (target: < 300 MB).
// (3) 1,000 jobs in the scratch shop: GET /api/jobs with 20 concurrent clients (autocannon,
//     bounded by count), p95 latency (target: < 100 ms).
// Figures are printed, never asserted. BENCH_SERVER_LINES changes the program's size,
// BENCH_SERVER_ROUNDS the rounds of (1) (best of each side taken: the box is shared).
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, openAsBlob, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { eq } from 'drizzle-orm';
import { runMigrations } from '@/db/migrate';
import * as s from '@/db/schema';
import { generateProgram } from '@/fixtures/program-generator';
import { deleteObject } from '@/lib/storage/s3';
import { connectTestDb, createScratchDatabase } from '../integration/support/db';
import { createEstimateShop, PASSWORD, removeEstimateShop, ROOT, runCli } from '../integration/support/estimates';

const PORT = Number(process.env.BENCH_SERVER_PORT ?? 3118);
const BASE = `http://127.0.0.1:${PORT}`;
const LINES = Number(process.env.BENCH_SERVER_LINES ?? 1_000_000);
const JOBS = 1000;
const ROUNDS = Number(process.env.BENCH_SERVER_ROUNDS ?? 3);

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(0)} MB`;

function rssBytes(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const m = /VmRSS:\s+(\d+) kB/.exec(status);
  return m ? Number(m[1]) * 1024 : NaN;
}

function ensureBuild(): void {
  if (existsSync(path.join(ROOT, '.next', 'BUILD_ID')) && existsSync(path.join(ROOT, '.next', 'kerfcast', 'estimate-worker.cjs'))) return;
  console.log('no production build: running next build and the worker bundle first');
  for (const args of [['node_modules/next/dist/bin/next', 'build'], ['scripts/build-estimate-worker.mjs']]) {
    const r = spawnSync(process.execPath, args, { cwd: ROOT, stdio: 'inherit', env: { ...process.env, NEXT_TELEMETRY_DISABLED: '1' } });
    if (r.status !== 0) throw new Error(`${args.join(' ')} failed`);
  }
}

class Cookies {
  private readonly jar = new Map<string, string>();
  take(r: Response) {
    for (const line of r.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const at = pair.indexOf('=');
      this.jar.set(pair.slice(0, at).trim(), pair.slice(at + 1).trim());
    }
  }
  header() {
    return [...this.jar].map(([k, v]) => `${k}=${v}`).join('; ');
  }
}

async function signIn(email: string): Promise<Cookies> {
  const jar = new Cookies();
  const csrf = await fetch(`${BASE}/api/auth/csrf`);
  jar.take(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const r = await fetch(`${BASE}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar.header() },
    body: new URLSearchParams({ csrfToken, email, password: PASSWORD, callbackUrl: `${BASE}/jobs`, json: 'true' }),
  });
  jar.take(r);
  return jar;
}

async function startServer(databaseUrl: string): Promise<{ child: ChildProcess; log(): string; stop(): Promise<void> }> {
  const child = spawn(process.execPath, [path.join(ROOT, 'node_modules/next/dist/bin/next'), 'start', '-H', '127.0.0.1', '-p', String(PORT)], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: 'production', KERFCAST_LOCAL: '1', NEXT_TELEMETRY_DISABLED: '1', DATABASE_URL: databaseUrl, APP_URL: BASE, NEXTAUTH_URL: BASE },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  child.stdout?.on('data', (d) => (log += d));
  child.stderr?.on('data', (d) => (log += d));
  const logText = () => log;
  const deadline = Date.now() + 60_000;
  for (;;) {
    try {
      if ((await fetch(`${BASE}/api/auth/csrf`)).ok) break;
    } catch {
      // not up yet
    }
    if (child.exitCode !== null || Date.now() > deadline) throw new Error(`next start did not come up:\n${log.slice(-2000)}`);
    await sleep(200);
  }
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  return {
    child,
    log: logText,
    async stop() {
      if (child.exitCode !== null) return;
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
      await exited;
      clearTimeout(timer);
    },
  };
}

export default async function serverBench(): Promise<void> {
  ensureBuild();
  const scratch = await createScratchDatabase();
  const dir = mkdtempSync(path.join(os.tmpdir(), 'kerfcast-bench-'));
  let server: Awaited<ReturnType<typeof startServer>> | null = null;
  const t = connectTestDb(scratch.url);
  let shopId = 0;
  try {
    await runMigrations(scratch.url);
    // a shop id far from any other database's, since the bucket is shared (object keys start shops/{shopId}/)
    const shop = await createEstimateShop(t.db, 'bench', { shopId: 1_900_000_000 + Math.floor(Math.random() * 100_000_000) });
    shopId = shop.shopId;
    server = await startServer(scratch.url);
    const pid = server.child.pid!;
    const jar = await signIn(shop.users.programmer.email);
    await fetch(`${BASE}/api/jobs`, { headers: { cookie: jar.header() } });
    await sleep(3000);
    const idle: number[] = [];
    for (let i = 0; i < 5; i++, await sleep(200)) idle.push(rssBytes(pid));
    const idleRss = idle.sort((a, b) => a - b)[2];
    const log = server.log;

    // (1) + (2): upload → estimate stored, RSS sampled meanwhile with its peak per phase; then
    // the CLI on the same file. Each round a program of its own (another seed): the same bytes
    // would find the stored estimate instead of computing it.
    console.log(`program: ${LINES.toLocaleString('en')} lines; server pool: ${process.env.ESTIMATE_POOL_SIZE ?? `default (${os.availableParallelism()} cores)`}; ${ROUNDS} rounds`);
    const serverTimes: number[] = [];
    const cliTimes: number[] = [];
    for (let round = 1; round <= ROUNDS; round++) {
      const file = path.join(dir, `nest-${LINES}-lines-${round}.nc`);
      writeFileSync(file, generateProgram(LINES, round));
      const fileBytes = readFileSync(file).length;
      // per round: RSS is not given back at once, so a later round's peak includes the last one's heap
      const peaks = { upload: idleRss, estimate: idleRss, report: idleRss };
      let phase: keyof typeof peaks = 'upload';
      const sampler = setInterval(() => {
        const v = rssBytes(pid);
        if (v > peaks[phase]) peaks[phase] = v;
      }, 50);
      const started = performance.now();
      const form = new FormData();
      form.append('file', await openAsBlob(file), path.basename(file));
      const upload = await fetch(`${BASE}/api/jobs/${shop.jobId}/programs`, { method: 'POST', headers: { cookie: jar.header() }, body: form });
      const uploaded = (await upload.json()) as { programs?: { id: number; estimate: { id: number } | null }[]; error?: { message: string } };
      const uploadMs = performance.now() - started;
      phase = 'estimate';
      if (upload.status !== 201 || !uploaded.programs?.[0]?.estimate) throw new Error(`upload answered ${upload.status}: ${JSON.stringify(uploaded).slice(0, 300)}`);
      const programId = uploaded.programs[0].id;
      const estimateId = uploaded.programs[0].estimate.id;
      // stored = done in the program's estimate list (the light answer, without the report)
      let listed: { id: number; status: string; error?: string } | undefined;
      let leaseOwner: string | null = null;
      while (!listed || listed.status === 'pending' || listed.status === 'running') {
        // about as often as a page polling a pending estimate; more often takes CPU from the worker on a 2-core box
        await sleep(200);
        const r = await fetch(`${BASE}/api/programs/${programId}/estimates`, { headers: { cookie: jar.header() } });
        listed = ((await r.json()) as { estimates: NonNullable<typeof listed>[] }).estimates.find((e) => e.id === estimateId);
        if (!leaseOwner && listed?.status === 'running') {
          const [row] = await t.db.select({ owner: s.estimates.leaseOwner }).from(s.estimates).where(eq(s.estimates.id, estimateId));
          leaseOwner = row?.owner ?? null;
        }
      }
      const serverMs = performance.now() - started;
      if (listed.status !== 'done') throw new Error(`estimate ${estimateId} ${listed.status}: ${listed.error}`);
      phase = 'report';
      const readStarted = performance.now();
      const fullText = await (await fetch(`${BASE}/api/estimates/${estimateId}`, { headers: { cookie: jar.header() } })).text();
      const readMs = performance.now() - readStarted;
      await sleep(500);
      clearInterval(sampler);
      const stored = (JSON.parse(fullText) as { estimate: { report?: { totalSeconds: number } } }).estimate.report;

      // the profile snapshot the estimate was made with (written by its request)
      const [snapshot] = await t.db.select().from(s.machineVersions).where(eq(s.machineVersions.machineId, shop.machineId));
      const cli = await runCli(file, snapshot.profile, {
        sheet: { widthMm: shop.job.sheetWidthMm, lengthMm: shop.job.sheetLengthMm, thicknessMm: shop.job.sheetThicknessMm },
        zero: shop.job.zZero,
        hold: shop.job.holdDown,
        vacuumKpa: shop.job.vacuumKpa,
      });
      const cliTotal = (cli.json as { totalSeconds: number }).totalSeconds;
      serverTimes.push(serverMs);
      cliTimes.push(cli.wallMs);
      const phases = new RegExp(`estimate ${estimateId} stored: (\\d+) ms in the worker \\((.*?)\\)`).exec(log());
      console.log(
        `round ${round} (${mb(fileBytes)}): upload → estimate stored ${(serverMs / 1000).toFixed(2)} s (upload answered ${(uploadMs / 1000).toFixed(2)} s; worker ${phases ? `${phases[1]} ms: ${phases[2]}` : '?'}), ` +
          `CLI ${(cli.wallMs / 1000).toFixed(2)} s, ratio ${(serverMs / cli.wallMs).toFixed(2)}; same totalSeconds: ${stored?.totalSeconds === cliTotal ? 'yes' : 'NO'} (${cliTotal} s); ` +
          `report read back ${(readMs / 1000).toFixed(2)} s for ${mb(fullText.length)}${leaseOwner && Number(leaseOwner.split(':')[1]) !== pid ? ' (lease owner is not the sampled pid!)' : ''}`,
      );
      const peak = Math.max(peaks.upload, peaks.estimate);
      console.log(
        `  server RSS above idle (${mb(idleRss)}, one worker thread started): ${mb(peak - idleRss)} during upload + estimate (target < 300 MB; upload ${mb(peaks.upload - idleRss)}, estimate ${mb(peaks.estimate - idleRss)}, report read ${mb(peaks.report - idleRss)}; ` +
          `pid ${pid}, the whole process, worker thread included); the CLI process's own peak: ${mb(cli.peakRssBytes)}`,
      );
    }
    // what the process keeps once the work is done (freed memory stays with it for reuse)
    await sleep(5000);
    console.log(`server RSS 5 s after the last round: ${mb(rssBytes(pid))} (idle before the first: ${mb(idleRss)})`);
    const best = (a: number[]) => Math.min(...a);
    console.log(`upload → estimate stored, best of ${ROUNDS}: ${(best(serverTimes) / 1000).toFixed(2)} s; CLI best: ${(best(cliTimes) / 1000).toFixed(2)} s; ratio ${(best(serverTimes) / best(cliTimes)).toFixed(2)} (target ≤ 1.3)`);

    // (3) GET /api/jobs with 1,000 jobs
    const rows = Array.from({ length: JOBS }, (_, i) => ({
      shopId,
      title: `Display stand sides, batch ${i + 1}`,
      customerId: shop.customerId,
      machineId: shop.machineId,
      sheetWidthMm: 2440,
      sheetLengthMm: 1220,
      sheetThicknessMm: 18,
      holdDown: 'vacuum' as const,
      vacuumKpa: 61,
      quantity: 1 + (i % 50),
      status: (['draft', 'programmed', 'quoted', 'accepted', 'scheduled'] as const)[i % 5],
    }));
    for (let i = 0; i < rows.length; i += 250) await t.db.insert(s.jobs).values(rows.slice(i, i + 250));
    // one client first: the cost of one request, apart from queueing behind 19 others
    const single: number[] = [];
    for (let i = 0; i < 50; i++) {
      const at = performance.now();
      await (await fetch(`${BASE}/api/jobs`, { headers: { cookie: jar.header(), accept: 'application/json' } })).arrayBuffer();
      single.push(performance.now() - at);
    }
    single.sort((a, b) => a - b);
    const latencies: number[] = [];
    let non2xx = 0;
    const result = await new Promise<autocannon.Result>((resolve, reject) => {
      const instance = autocannon(
        { url: `${BASE}/api/jobs`, connections: 20, amount: 2000, timeout: 10, headers: { cookie: jar.header(), accept: 'application/json' } },
        (err, res) => (err ? reject(err) : resolve(res)),
      );
      instance.on('response', (_client, statusCode, _bytes, responseTime) => {
        latencies.push(responseTime);
        if (statusCode < 200 || statusCode > 299) non2xx++;
      });
    });
    latencies.sort((a, b) => a - b);
    const p = (q: number) => latencies[Math.min(latencies.length - 1, Math.ceil(q * latencies.length) - 1)];
    console.log(
      `GET /api/jobs, ${JOBS} jobs: one client, 50 requests: median ${single[25].toFixed(1)} ms; 20 clients, ${latencies.length} requests: p50 ${p(0.5).toFixed(1)} ms, p95 ${p(0.95).toFixed(1)} ms (target < 100 ms), p99 ${p(0.99).toFixed(1)} ms, ${result.requests.average.toFixed(0)} req/s, ${non2xx} not 2xx`,
    );
  } finally {
    await server?.stop();
    if (shopId) {
      // objects first (their keys are in the rows), then the scratch database goes whole
      await removeEstimateShop(t.db, shopId).catch(async () => {
        const keys = await t.db.select({ k: s.programVersions.objectKey }).from(s.programVersions).where(eq(s.programVersions.shopId, shopId));
        for (const { k } of keys) await deleteObject(k).catch(() => {});
      });
    }
    await t.close();
    await scratch.drop();
    rmSync(dir, { recursive: true, force: true });
  }
}
