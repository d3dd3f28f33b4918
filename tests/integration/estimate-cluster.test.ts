// Two app processes sharing the estimate work (issue 17): started by `npm run serve:cluster`'s
// launcher (scripts/serve-cluster.mjs) on ports 3121 and 3122, against one scratch database
// (so no other app server claims these rows) and the test bucket. What is checked:
// - 20 uploads, half sent to each process (one sign-in, its session cookie used on both):
//   every estimate is computed to its end exactly once and stored exactly once, and both
//   processes take a share. Counted three ways, none of them the result's own status: the
//   line each process prints for every computation that ends (stored, or dropped after a
//   lost lease; lib/estimate-server/runner.ts), the `estimate-done` job history row written
//   in the result's transaction, and the row's claim counter (`attempts`).
// - one process killed (SIGKILL) while it computes: its row stays with it until its lease
//   (ESTIMATE_LEASE_SECONDS, 6 s here) has run out by the database's clock, then the other
//   process takes it over and stores it; the killed one stored nothing.
// - the launcher refuses a port in use, and SIGTERM (what Ctrl-C or a service manager sends)
//   stops every process it started.
// The shared sign-in counters across two processes are tested in app-security-sign-in.test.ts
// ("failures counted on one process limit the other"); the queue's SQL with two connections in
// estimate-queue.test.ts; a restart on the same host in estimate-restart.test.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { runMigrations } from '@/db/migrate';
import * as s from '@/db/schema';
import { generateProgram } from '@/fixtures/program-generator';
import type { CookieJar } from './support/app-server';
import { pidAlive, runLauncher, startCluster, type Cluster, type ClusterProcess } from './support/cluster';
import { connectTestDb, createScratchDatabase, type ScratchDatabase, type TestDb } from './support/db';
import { createEstimateShop, PASSWORD, removeEstimateShop, sleep, type EstimateShop } from './support/estimates';
import { signInAt } from './support/security';

const FIRST_PORT = 3121;
const LEASE_SECONDS = 6;
const UPLOADS = 20;
/** small programs: the point is who computes what, not how long it takes */
const LINES = 4_000;

let scratch: ScratchDatabase;
let t: TestDb;
let shop: EstimateShop;
let cluster: Cluster | null = null;
let jar: CookieJar;

async function until<T>(what: string, probe: () => Promise<T | undefined | false>, timeoutMs = 90_000, everyMs = 100): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await sleep(everyMs);
  }
}

async function upload(to: ClusterProcess, name: string, text: string): Promise<{ programId: number; estimateId: number }> {
  const form = new FormData();
  form.append('file', new Blob([text]), name);
  const response = await fetch(`${to.url}/api/jobs/${shop.jobId}/programs`, { method: 'POST', headers: { cookie: jar.header() }, body: form });
  const body = (await response.json()) as { programs?: { id: number; estimate: { id: number } | null }[] };
  if (response.status !== 201 || !body.programs?.[0]?.estimate) throw new Error(`upload of ${name} to ${to.url} answered ${response.status}: ${JSON.stringify(body).slice(0, 300)}`);
  return { programId: body.programs[0].id, estimateId: body.programs[0].estimate.id };
}

/** estimate id → how many times the process's log says a computation of it ended */
function computations(p: ClusterProcess): { stored: Map<number, number>; dropped: Map<number, number> } {
  const count = (re: RegExp) => {
    const m = new Map<number, number>();
    for (const hit of p.log().matchAll(re)) m.set(Number(hit[1]), (m.get(Number(hit[1])) ?? 0) + 1);
    return m;
  };
  return {
    stored: count(/\[kerfcast\] estimate (\d+) stored: /g),
    dropped: count(/estimate (\d+) (?:was computed after this process lost its lease|was taken over by another process before it finished here)/g),
  };
}

/** estimate id → `estimate-done` history rows naming it (written in the result's transaction) */
async function doneEvents(): Promise<Map<number, number>> {
  const rows = await t.db.select({ detail: s.jobEvents.detail }).from(s.jobEvents).where(and(eq(s.jobEvents.shopId, shop.shopId), eq(s.jobEvents.kind, 'estimate-done')));
  const m = new Map<number, number>();
  for (const r of rows) {
    const id = Number(/^Estimate (\d+) of /.exec(r.detail ?? '')?.[1]);
    m.set(id, (m.get(id) ?? 0) + 1);
  }
  return m;
}

const ownerPid = (owner: string | null) => (owner ? Number(owner.split(':')[1]) : NaN);

beforeAll(async () => {
  scratch = await createScratchDatabase();
  await runMigrations(scratch.url);
  t = connectTestDb(scratch.url);
  // a shop id of its own: the bucket is shared with the test database, whose ids start at 1
  shop = await createEstimateShop(t.db, 'cluster', { shopId: 1_800_000_000 + Math.floor(Math.random() * 90_000_000) });
  cluster = await startCluster(2, FIRST_PORT, { DATABASE_URL: scratch.url, ESTIMATE_POOL_SIZE: '1', ESTIMATE_LEASE_SECONDS: String(LEASE_SECONDS) });
  jar = (await signInAt(cluster.processes[0].url, shop.users.programmer.email, PASSWORD)).jar;
}, 180_000);

afterAll(async () => {
  await cluster?.stop();
  // CLUSTER_TEST_LOG=FILE keeps every line the processes printed, for a look after a failure
  if (process.env.CLUSTER_TEST_LOG) (await import('node:fs')).writeFileSync(process.env.CLUSTER_TEST_LOG, cluster?.output() ?? '');
  if (t) {
    if (shop) await removeEstimateShop(t.db, shop.shopId).catch(() => {});
    await t.close();
  }
  await scratch?.drop();
});

describe('two processes, one database and one bucket', () => {
  it('a session made on one process is good on the other (signed token + session row, one AUTH_SECRET)', async () => {
    const [one, two] = cluster!.processes;
    expect(one.pid).not.toBe(two.pid);
    for (const p of [one, two]) {
      const r = await fetch(`${p.url}/api/jobs/${shop.jobId}`, { headers: { cookie: jar.header(), accept: 'application/json' } });
      expect(r.status).toBe(200);
    }
  });

  it('20 uploads over both: every estimate computed and stored exactly once, and both processes take a share', async () => {
    const [one, two] = cluster!.processes;
    // two lanes, one per process, each sending its uploads one after the other
    const lanes = [one, two].map(async (p, lane) => {
      const ids: number[] = [];
      for (let i = lane; i < UPLOADS; i += 2) ids.push((await upload(p, `bracket-${String(i + 1).padStart(2, '0')}.nc`, generateProgram(LINES, 100 + i))).estimateId);
      return ids;
    });
    const ids = (await Promise.all(lanes)).flat();
    expect(new Set(ids).size).toBe(UPLOADS);

    const rows = await until('all 20 estimates to end', async () => {
      const r = await t.db.select().from(s.estimates).where(inArray(s.estimates.id, ids));
      if (r.some((e) => e.status === 'failed')) throw new Error(`failed: ${r.map((e) => e.error).filter(Boolean).join('; ')}`);
      return r.length === UPLOADS && r.every((e) => e.status === 'done') ? r : undefined;
    });
    // claimed once each: no lease ran out, nothing taken over
    expect(rows.map((r) => r.attempts)).toEqual(ids.map(() => 1));
    // the result's transaction wrote one history row per estimate
    const events = await doneEvents();
    for (const id of ids) expect(events.get(id) ?? 0).toBe(1);
    expect([...events.values()].reduce((a, b) => a + b, 0)).toBe(UPLOADS);
    // the processes' own lines: one ended computation per estimate over both, none dropped
    await sleep(300); // the last line may still be on its way through the launcher's pipe
    const [a, b] = [computations(one), computations(two)];
    for (const id of ids) {
      expect((a.stored.get(id) ?? 0) + (b.stored.get(id) ?? 0)).toBe(1);
      expect((a.dropped.get(id) ?? 0) + (b.dropped.get(id) ?? 0)).toBe(0);
    }
    expect(a.stored.size + b.stored.size).toBe(UPLOADS);
    // both did part of the work (each has one worker thread; an idle one takes the next row)
    console.log(`estimates stored by process 1: ${a.stored.size}, by process 2: ${b.stored.size}`);
    expect(a.stored.size).toBeGreaterThanOrEqual(2);
    expect(b.stored.size).toBeGreaterThanOrEqual(2);
  }, 120_000);

  it('a process killed mid-estimate: the other finishes it once the lease has run out, and the killed one stored nothing', async () => {
    const { processes } = cluster!;
    // large enough to be still computing when its process is killed (about 1 s of worker time per
    // 500,000 lines here, and the kill follows the claim within a few polls of 25 ms)
    const { estimateId } = await upload(processes[0], 'display-sides-nest.nc', generateProgram(500_000, 17));
    const running = await until('a process to claim the estimate', async () => {
      const [r] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, estimateId));
      return r.status === 'running' && r.leaseOwner ? r : undefined;
    }, 30_000, 25);
    const victim = processes.find((p) => p.pid === ownerPid(running.leaseOwner));
    expect(victim, `lease owner ${running.leaseOwner} is one of the cluster's processes`).toBeDefined();
    const survivor = processes.find((p) => p !== victim)!;
    process.kill(victim!.pid, 'SIGKILL');
    await until('the killed process to be gone', async () => !pidAlive(victim!.pid), 10_000, 50);
    await until('the launcher to report it', async () => cluster!.output().includes(`pid ${victim!.pid} ended (signal SIGKILL); 1 of 2 still serving`), 10_000, 50);
    await sleep(200); // a renewal it sent just before dying has landed by now
    const [held] = (await t.db.execute(sql`SELECT lease_owner AS owner, lease_until AS until, NOW(3) AS now FROM estimates WHERE id = ${estimateId}`))[0] as unknown as {
      owner: string;
      until: Date;
      now: Date;
    }[];
    expect(held.owner).toBe(running.leaseOwner);
    const leaseEnd = new Date(held.until).getTime();

    // watch the row by the database's clock until it is done: before the lease end it stays
    // with the dead owner; after it, the survivor claims it (a second attempt) and stores it
    const seen: { owner: string | null; status: string; nowMs: number }[] = [];
    const done = await until('the survivor to finish the estimate', async () => {
      const [r] = (await t.db.execute(sql`SELECT lease_owner AS owner, status, attempts, NOW(3) AS now FROM estimates WHERE id = ${estimateId}`))[0] as unknown as {
        owner: string | null;
        status: string;
        attempts: number;
        now: Date;
      }[];
      seen.push({ owner: r.owner, status: r.status, nowMs: new Date(r.now).getTime() });
      if (r.status === 'failed') throw new Error('the estimate failed');
      return r.status === 'done' ? r : undefined;
    }, LEASE_SECONDS * 1000 + 90_000, 100);
    for (const o of seen.filter((x) => x.nowMs < leaseEnd)) expect(o).toMatchObject({ owner: running.leaseOwner, status: 'running' });
    const takenOver = seen.find((x) => x.owner !== running.leaseOwner);
    expect(takenOver, 'the row left the dead owner').toBeDefined();
    expect(takenOver!.nowMs).toBeGreaterThanOrEqual(leaseEnd);
    for (const o of seen.filter((x) => x.owner !== running.leaseOwner && x.owner !== null)) expect(ownerPid(o.owner)).toBe(survivor.pid);
    expect(Number(done.attempts)).toBe(2);

    await sleep(300);
    expect(computations(survivor).stored.get(estimateId)).toBe(1);
    expect(computations(victim!).stored.get(estimateId)).toBeUndefined();
    expect((await doneEvents()).get(estimateId)).toBe(1);
    // the stored report is served like any other, by the process still running
    const read = await fetch(`${survivor.url}/api/estimates/${estimateId}`, { headers: { cookie: jar.header(), accept: 'application/json' } });
    const body = (await read.json()) as { estimate: { status: string; totalSeconds: number; report: { totalSeconds: number; file: { name: string } } } };
    expect(body.estimate.report.file.name).toBe('display-sides-nest.nc');
    expect(body.estimate.report.totalSeconds).toBe(body.estimate.totalSeconds);
    expect(body.estimate.totalSeconds).toBeGreaterThan(0);
  }, 150_000);

  it('the launcher refuses a port in use, and SIGTERM stops every process it started', async () => {
    const survivor = cluster!.processes.find((p) => pidAlive(p.pid))!;
    const refused = await runLauncher(['1', '--port', String(survivor.port)]);
    expect(refused.code).toBe(1);
    expect(refused.output).toContain(`port ${survivor.port} on 127.0.0.1 is already in use`);

    const pids = cluster!.processes.map((p) => p.pid);
    const ended = await cluster!.stop();
    expect(ended).toEqual({ code: 0, signal: null });
    expect(cluster!.output()).toContain('[serve:cluster] all processes stopped');
    for (const pid of pids) expect(pidAlive(pid)).toBe(false);
    for (const p of cluster!.processes) await expect(fetch(`${p.url}/api/auth/csrf`, { signal: AbortSignal.timeout(2000) })).rejects.toThrow();
  }, 60_000);
});
