// No estimate stays stuck: a server killed while computing leaves its row running under its
// lease; the next server started on this host queues it again at start and finishes it, and
// finishes what was requested while no server ran. A row whose lease ran out on another host
// is taken over; one whose lease still runs there is left alone. Runs its own `next start`
// on a port of its own, so it can kill that server outright (SIGKILL, no clean-up).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, inArray, sql } from 'drizzle-orm';
import * as s from '@/db/schema';
import { generateProgram } from '@/fixtures/program-generator';
import { jobEstimateSettings, requestEstimate } from '@/lib/estimate-server';
import { callApi, signInOverHttp, startAppServer, type AppServer } from './support/app-server';
import { connectTestDb, type TestDb } from './support/db';
import { addProgramVersion, createEstimateShop, PASSWORD, removeEstimateShop, sleep, type EstimateShop, type StoredProgram } from './support/estimates';

const PORT = 3117;

let t: TestDb;
let shop: EstimateShop;
const servers: AppServer[] = [];

async function row(id: number) {
  const [r] = await t.db.select().from(s.estimates).where(eq(s.estimates.id, id));
  return r;
}

async function until<T>(what: string, probe: () => Promise<T | undefined | false>, timeoutMs = 90_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await sleep(25);
  }
}

async function answers(): Promise<boolean> {
  try {
    return (await fetch(`http://127.0.0.1:${PORT}/api/auth/csrf`, { signal: AbortSignal.timeout(2000) })).ok;
  } catch {
    return false;
  }
}

function request(program: StoredProgram) {
  return t.db.transaction((tx) =>
    requestEstimate(tx, {
      shopId: shop.shopId,
      programId: program.programId,
      programVersionId: program.programVersionId,
      programVersion: program.version,
      sha256: program.sha256,
      machineId: shop.machineId,
      requestedBy: null,
      settings: jobEstimateSettings(shop.job),
    }),
  );
}

beforeAll(async () => {
  t = connectTestDb();
  shop = await createEstimateShop(t.db, 'restart');
});

afterAll(async () => {
  for (const server of servers) await server.stop();
  if (t) {
    if (shop) await removeEstimateShop(t.db, shop.shopId);
    await t.close();
  }
});

describe('a server restart', () => {
  it('finishes the estimate a killed server was computing and the ones requested meanwhile', async () => {
    expect(await answers()).toBe(false);
    // large enough that the first server is still computing when it is killed
    const big = await addProgramVersion(t.db, shop, 'display-sides-nest.nc', Buffer.from(generateProgram(300_000, 5)));
    const small = await addProgramVersion(t.db, shop, 'shelf-bracket-single.nc', Buffer.from(generateProgram(2_000, 6)));
    const takenOver = await addProgramVersion(t.db, shop, 'tag-holder-row.nc', Buffer.from(generateProgram(3_000, 7)));
    const heldElsewhere = await addProgramVersion(t.db, shop, 'letter-set.nc', Buffer.from(generateProgram(1_000, 8)));

    servers.push(await startAppServer(PORT));
    const signed = await signInOverHttp(shop.users.programmer.email, PASSWORD);
    const posted = await callApi<{ estimate: { id: number } }>(signed.jar, 'POST', `/api/programs/${big.programId}/estimates`, { machineId: shop.machineId });
    expect(posted.status).toBe(202);
    const bigId = posted.body.estimate.id;
    const claimed = await until('the first server to claim the estimate', async () => {
      const r = await row(bigId);
      return r.status === 'running' && r.leaseOwner ? r : undefined;
    });
    expect(claimed.status).toBe('running');
    // the process that holds the lease is the server: kill it without a chance to clean up
    const pid = Number(claimed.leaseOwner!.split(':')[1]);
    process.kill(pid, 'SIGKILL');
    await until('the first server to stop answering', async () => !(await answers()));
    // its lease would still run for minutes: only the restart's requeue can free the row soon
    await t.db.execute(sql`UPDATE estimates SET lease_until = NOW(3) + INTERVAL 10 MINUTE WHERE id = ${bigId}`);
    expect(await row(bigId)).toMatchObject({ status: 'running', attempts: 1 });

    // while no server runs: a new request, a row another host left with a lease run out, and
    // a row another host holds under a running lease
    const meanwhile = await request(small);
    const expired = await request(takenOver);
    await t.db.execute(sql`UPDATE estimates SET status = 'running', lease_owner = 'other-host:4242:gone', lease_until = NOW(3) - INTERVAL 1 SECOND, attempts = 1 WHERE id = ${expired.id}`);
    const held = await request(heldElsewhere);
    await t.db.execute(sql`UPDATE estimates SET status = 'running', lease_owner = 'other-host:4243:live', lease_until = NOW(3) + INTERVAL 10 MINUTE, attempts = 1 WHERE id = ${held.id}`);

    servers.push(await startAppServer(PORT));
    const ids = [bigId, meanwhile.id, expired.id];
    const done = await until('the restarted server to finish all three', async () => {
      const rows = await t.db.select().from(s.estimates).where(inArray(s.estimates.id, ids));
      if (rows.some((r) => r.status === 'failed')) throw new Error(`failed: ${rows.map((r) => r.error).join('; ')}`);
      return rows.every((r) => r.status === 'done') ? rows : undefined;
    });
    const byId = new Map(done.map((r) => [r.id, r]));
    // computed a second time, after the killed server's attempt; nothing half-written kept
    expect(byId.get(bigId)).toMatchObject({ status: 'done', attempts: 2, leaseOwner: null, progress: 1 });
    expect(byId.get(bigId)!.totalSeconds).toBeGreaterThan(0);
    expect(byId.get(expired.id)).toMatchObject({ status: 'done', attempts: 2 });
    expect(byId.get(meanwhile.id)).toMatchObject({ status: 'done', attempts: 1 });
    // the report of the killed one is readable like any other
    const signedAgain = await signInOverHttp(shop.users.operator.email, PASSWORD);
    const read = await callApi<{ estimate: { status: string; report: { totalSeconds: number; file: { name: string } } } }>(signedAgain.jar, 'GET', `/api/estimates/${bigId}`);
    expect(read.body.estimate.report.file.name).toBe('display-sides-nest.nc');
    expect(read.body.estimate.report.totalSeconds).toBe(byId.get(bigId)!.totalSeconds);
    // the other host's live lease was respected
    expect(await row(held.id)).toMatchObject({ status: 'running', leaseOwner: 'other-host:4243:live' });
  }, 240_000);
});
