// `npm run bench -- cluster`: estimate throughput of one app process against two (issue 17).
// A batch of 20 generated 100,000-line programs (fixtures/program-generator.ts, seeds 1–20)
// is uploaded through POST /api/jobs/:jobId/programs, the uploads spread round-robin over the
// processes (one lane per process, each sending its share one after the other), and timed
// from the first upload sent to the last estimate stored (the estimates rows, polled every
// 250 ms). Each configuration gets a scratch database of its own and the same 20 programs,
// started by the serve:cluster launcher (scripts/serve-cluster.mjs) with the default pool
// (cores − 1 worker threads per process, at least one). Printed per configuration: the batch
// wall time, estimates per minute, the per-estimate worker time (compute_ms: read from
// storage, engine, report stored) and the per-estimate wall time (upload answered → stored,
// queueing included), and how many estimates each process stored. Before the timed batch
// each process is sent BENCH_CLUSTER_WARM_UP (5) small warm-up estimates, untimed. Not
// asserted: on a 2-core box two processes have little to gain; the point is that the work
// is shared and is not slower. BENCH_CLUSTER_LINES, BENCH_CLUSTER_PROGRAMS and
// BENCH_CLUSTER_ROUNDS (rounds of the pair, alternating, best of each taken) change the
// batch; BENCH_CLUSTER_LOG_DIR keeps the processes' output. The load average printed after
// each batch shows whether something else shared the box.
import { existsSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { inArray } from 'drizzle-orm';
import { runMigrations } from '@/db/migrate';
import * as s from '@/db/schema';
import { generateProgram } from '@/fixtures/program-generator';
import { startCluster, type Cluster } from '../integration/support/cluster';
import { connectTestDb, createScratchDatabase } from '../integration/support/db';
import { createEstimateShop, PASSWORD, removeEstimateShop, ROOT, sleep } from '../integration/support/estimates';
import { signInAt } from '../integration/support/security';
import { median } from './support';

const FIRST_PORT = Number(process.env.BENCH_CLUSTER_PORT ?? 3131);
const LINES = Number(process.env.BENCH_CLUSTER_LINES ?? 100_000);
const PROGRAMS = Number(process.env.BENCH_CLUSTER_PROGRAMS ?? 20);
const ROUNDS = Number(process.env.BENCH_CLUSTER_ROUNDS ?? 1);
/** untimed small estimates per process before the batch */
const WARM_UP = Number(process.env.BENCH_CLUSTER_WARM_UP ?? 5);

interface BatchResult {
  processes: number;
  wallMs: number;
  uploadsMs: number;
  perMinute: number;
  computeMs: number[];
  latencyMs: number[];
  storedBy: number[];
  /** the 1-minute load average when the batch ended */
  loadAfter: number;
}

async function batch(processes: number, programs: { name: string; text: string }[]): Promise<BatchResult> {
  const scratch = await createScratchDatabase();
  const t = connectTestDb(scratch.url);
  let cluster: Cluster | null = null;
  let shopId = 0;
  try {
    await runMigrations(scratch.url);
    // a shop id far from any other database's: the bucket is shared (object keys start shops/{shopId}/)
    const shop = await createEstimateShop(t.db, `cluster-${processes}`, { shopId: 1_900_000_000 + Math.floor(Math.random() * 100_000_000) });
    shopId = shop.shopId;
    cluster = await startCluster(processes, FIRST_PORT, { DATABASE_URL: scratch.url });
    const { jar } = await signInAt(cluster.processes[0].url, shop.users.programmer.email, PASSWORD);
    // warm-up, untimed: small estimates uploaded to each process, one after the other, so each
    // worker thread has loaded and compiled the engine (a thread's first few estimates are the
    // slowest: 1.5–3 s against 0.3 s later for 100,000 lines, as the JIT warms up) and each
    // process has served uploads; a deployment that has been up a while is in this state
    for (let round = 0; round < WARM_UP; round++) {
      const warm: number[] = [];
      for (const [i, p] of cluster.processes.entries()) {
        const form = new FormData();
        form.append('file', new Blob([generateProgram(20_000, 1000 + round * 10 + i)]), `warm-up-${round + 1}-${i + 1}.nc`);
        const r = await fetch(`${p.url}/api/jobs/${shop.jobId}/programs`, { method: 'POST', headers: { cookie: jar.header() }, body: form });
        warm.push(((await r.json()) as { programs: { estimate: { id: number } }[] }).programs[0].estimate.id);
      }
      for (;;) {
        const w = await t.db.select({ status: s.estimates.status }).from(s.estimates).where(inArray(s.estimates.id, warm));
        if (w.every((r) => r.status === 'done')) break;
        await sleep(100);
      }
    }
    await sleep(1000);

    const answeredAt = new Map<number, number>();
    const doneAt = new Map<number, number>();
    const started = performance.now();
    const lanes = cluster.processes.map(async (p, lane) => {
      for (let i = lane; i < programs.length; i += processes) {
        const form = new FormData();
        form.append('file', new Blob([programs[i].text]), programs[i].name);
        const r = await fetch(`${p.url}/api/jobs/${shop.jobId}/programs`, { method: 'POST', headers: { cookie: jar.header() }, body: form });
        const body = (await r.json()) as { programs?: { estimate: { id: number } | null }[] };
        const id = body.programs?.[0]?.estimate?.id;
        if (r.status !== 201 || !id) throw new Error(`upload of ${programs[i].name} answered ${r.status}: ${JSON.stringify(body).slice(0, 300)}`);
        answeredAt.set(id, performance.now());
      }
    });
    let uploadsMs = 0;
    const uploads = Promise.all(lanes).then(() => (uploadsMs = performance.now() - started));
    let rows: (typeof s.estimates.$inferSelect)[] = [];
    for (;;) {
      await sleep(250);
      const ids = [...answeredAt.keys()];
      if (ids.length === 0) continue;
      rows = await t.db.select().from(s.estimates).where(inArray(s.estimates.id, ids));
      const now = performance.now();
      for (const r of rows) {
        if (r.status === 'failed') throw new Error(`estimate ${r.id} failed: ${r.error}`);
        if (r.status === 'done' && !doneAt.has(r.id)) doneAt.set(r.id, now);
      }
      if (doneAt.size === programs.length) break;
    }
    const wallMs = performance.now() - started;
    await uploads;
    await sleep(300); // the last "stored" lines through the launcher's pipe
    const storedBy = cluster.processes.map((p) => [...p.log().matchAll(/\[kerfcast\] estimate (\d+) stored: /g)].filter((m) => answeredAt.has(Number(m[1]))).length);
    return {
      processes,
      wallMs,
      uploadsMs,
      perMinute: (programs.length / wallMs) * 60_000,
      computeMs: rows.map((r) => r.computeMs ?? NaN),
      latencyMs: [...doneAt].map(([id, at]) => at - answeredAt.get(id)!),
      storedBy,
      loadAfter: os.loadavg()[0],
    };
  } finally {
    await cluster?.stop();
    // BENCH_CLUSTER_LOG_DIR=DIR keeps what the processes printed (each estimate's worker phases)
    if (cluster && process.env.BENCH_CLUSTER_LOG_DIR) writeFileSync(path.join(process.env.BENCH_CLUSTER_LOG_DIR, `cluster-${processes}-${Date.now()}.log`), cluster.output());
    if (shopId) await removeEstimateShop(t.db, shopId).catch(() => {});
    await t.close();
    await scratch.drop();
  }
}

const sec = (ms: number) => `${(ms / 1000).toFixed(2)} s`;

function report(r: BatchResult): string {
  const mean = (a: number[]) => a.reduce((x, y) => x + y, 0) / a.length;
  return (
    `${r.processes} process${r.processes > 1 ? 'es' : ''}: batch ${sec(r.wallMs)} (uploads all answered after ${sec(r.uploadsMs)}), ` +
    `${r.perMinute.toFixed(1)} estimates/min; per estimate: worker ${sec(median(r.computeMs))} median (mean ${sec(mean(r.computeMs))}, ` +
    `max ${sec(Math.max(...r.computeMs))}), upload answered → stored ${sec(median(r.latencyMs))} median (max ${sec(Math.max(...r.latencyMs))}); ` +
    `stored by each process: ${r.storedBy.join(' + ')}; load average after: ${r.loadAfter.toFixed(1)} (anything else running on the box shows here)`
  );
}

export default async function clusterBench(): Promise<void> {
  if (!existsSync(path.join(ROOT, '.next', 'BUILD_ID')) || !existsSync(path.join(ROOT, '.next', 'kerfcast', 'estimate-worker.cjs'))) {
    throw new Error('No production build: run `npm run build` first (next build and the estimate worker bundle).');
  }
  const programs = Array.from({ length: PROGRAMS }, (_, i) => ({ name: `nest-${String(i + 1).padStart(2, '0')}.nc`, text: generateProgram(LINES, i + 1) }));
  const mb = programs.reduce((n, p) => n + Buffer.byteLength(p.text), 0) / 1024 / 1024;
  console.log(
    `${PROGRAMS} programs of ${LINES.toLocaleString('en')} lines (${mb.toFixed(0)} MB in all); ${os.availableParallelism()} cores; ` +
      `pool per process: ${process.env.ESTIMATE_POOL_SIZE ?? `default (${Math.max(1, os.availableParallelism() - 1)})`}; ${ROUNDS} round(s)`,
  );
  const results: Record<1 | 2, BatchResult[]> = { 1: [], 2: [] };
  for (let round = 1; round <= ROUNDS; round++) {
    // alternate which goes first, so a warmer box does not always favour the same side
    for (const n of round % 2 === 1 ? ([1, 2] as const) : ([2, 1] as const)) {
      const r = await batch(n, programs);
      results[n].push(r);
      console.log(`round ${round}, ${report(r)}`);
    }
  }
  const best = (a: BatchResult[]) => a.reduce((x, y) => (y.wallMs < x.wallMs ? y : x));
  const [one, two] = [best(results[1]), best(results[2])];
  console.log(`best of ${ROUNDS}: 1 process ${one.perMinute.toFixed(1)} estimates/min, 2 processes ${two.perMinute.toFixed(1)} estimates/min; ratio 2:1 = ${(two.perMinute / one.perMinute).toFixed(2)}`);
  console.log(`per-estimate worker time, median: 1 process ${sec(median(one.computeMs))}, 2 processes ${sec(median(two.computeMs))} (ratio ${(median(two.computeMs) / median(one.computeMs)).toFixed(2)})`);
}
