// The jobs API against the built app and the real MariaDB test database: GET /api/jobs's
// filters, sort and paging (checked against the rows this test inserted, filtered and sorted
// here in plain JavaScript), the zod-checked query params (422 naming each one), create with
// the default machine, edit and status steps each leaving one job_events row, and the status
// rules of lib/jobs/status-moves.ts as HTTP answers (403 for a step the role does not own, 409
// for a step the job's status does not allow).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, asc, eq, isNull, like } from 'drizzle-orm';
import { callApi, DEMO_PASSWORD, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

let server: AppServer;
let dbm: DbModule;
let s: Schema;
const jars: Record<string, CookieJar> = {};
const PREFIX = `Jobs API check ${Date.now().toString(36)}`;
let shopId = 0;
let customerIds: number[] = [];
let machineIds: number[] = [];
const STATUSES = ['draft', 'programmed', 'quoted', 'accepted', 'scheduled'] as const;

interface Listed {
  id: number;
  title: string;
  status: string;
  customerId: number;
  machineId: number | null;
  quantity: number;
  dueDate: string | null;
}
interface ListAnswer {
  jobs: Listed[];
  total: number;
  page: number;
  perPage: number;
  pageCount: number;
}

async function removeTestJobs() {
  const rows = await dbm.db.select({ id: s.jobs.id }).from(s.jobs).where(like(s.jobs.title, `${PREFIX}%`));
  for (const r of rows) {
    await dbm.db.delete(s.jobEvents).where(eq(s.jobEvents.jobId, r.id));
    await dbm.db.delete(s.jobs).where(eq(s.jobs.id, r.id));
  }
}

beforeAll(async () => {
  server = await startAppServer();
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  const [shop] = await dbm.db.select().from(s.shops).where(eq(s.shops.slug, 'alder-finch'));
  shopId = shop.id;
  customerIds = (await dbm.db.select({ id: s.customers.id }).from(s.customers).where(eq(s.customers.shopId, shopId)).orderBy(asc(s.customers.id))).map((c) => c.id);
  machineIds = (await dbm.db.select({ id: s.machines.id }).from(s.machines).where(and(eq(s.machines.shopId, shopId), isNull(s.machines.archivedAt))).orderBy(asc(s.machines.id))).map((m) => m.id);
  await removeTestJobs();
  // 60 jobs: statuses, customers and machines in turn, quantities and due dates spread out
  await dbm.db.insert(s.jobs).values(
    Array.from({ length: 60 }, (_, i) => ({
      shopId,
      title: `${PREFIX} ${String(i).padStart(2, '0')}${i % 7 === 0 ? ' acrylic 100%_sign' : ''}`,
      customerId: customerIds[i % customerIds.length],
      machineId: machineIds[i % machineIds.length],
      sheetWidthMm: 1220,
      sheetLengthMm: 2440,
      sheetThicknessMm: 18,
      holdDown: 'clamps' as const,
      quantity: (i * 37) % 101,
      status: STATUSES[i % STATUSES.length],
      dueDate: i % 3 === 0 ? null : `2027-${String((i % 12) + 1).padStart(2, '0')}-${String((i % 28) + 1).padStart(2, '0')}`,
    })),
  );
  for (const [key, email] of [
    ['priya', 'priya@alder-finch.example'],
    ['tomas', 'tomas@alder-finch.example'],
    ['lena', 'lena@alder-finch.example'],
  ] as const) {
    const result = await signInOverHttp(email, DEMO_PASSWORD);
    expect(result.signedIn).toBe(true);
    jars[key] = result.jar;
  }
});

afterAll(async () => {
  if (dbm) {
    await removeTestJobs();
    await dbm.closeDb();
  }
  await server?.stop();
});

const list = (query: string) => callApi<ListAnswer>(jars.lena, 'GET', `/api/jobs?q=${encodeURIComponent(PREFIX)}&${query}`);

describe('GET /api/jobs', () => {
  it('pages through every job once, 25 a page, newest change first by default', async () => {
    const seen: number[] = [];
    for (let page = 1; page <= 3; page++) {
      const answer = await list(`page=${page}`);
      expect(answer.status).toBe(200);
      expect(answer.body).toMatchObject({ total: 60, perPage: 25, pageCount: 3, page });
      seen.push(...answer.body.jobs.map((j) => j.id));
    }
    expect(seen.length).toBe(60);
    expect(new Set(seen).size).toBe(60);
  });

  it('filters by status, customer and machine together', async () => {
    const answer = await list(`status=quoted&customerId=${customerIds[0]}&machineId=${machineIds[0]}&perPage=100`);
    const expected = Array.from({ length: 60 }, (_, i) => i).filter(
      (i) => STATUSES[i % STATUSES.length] === 'quoted' && i % customerIds.length === 0 && i % machineIds.length === 0,
    );
    expect(answer.body.total).toBe(expected.length);
    for (const j of answer.body.jobs) expect([j.status, j.customerId, j.machineId]).toEqual(['quoted', customerIds[0], machineIds[0]]);
  });

  it('searches text with % and _ taken literally', async () => {
    const answer = await callApi<ListAnswer>(jars.lena, 'GET', `/api/jobs?q=${encodeURIComponent('100%_sign')}&perPage=100`);
    expect(answer.body.jobs.map((j) => j.title).filter((t) => t.startsWith(PREFIX)).length).toBe(Math.ceil(60 / 7));
    // as wildcards "10_%" would match "100%_sign"; taken literally it matches none of them
    const none = await callApi<ListAnswer>(jars.lena, 'GET', `/api/jobs?q=${encodeURIComponent('10_%')}&perPage=100`);
    expect(none.body.jobs.filter((j) => j.title.startsWith(PREFIX))).toEqual([]);
  });

  it('sorts by quantity both ways and by due date with undated jobs last', async () => {
    const up = (await list('sort=quantity&dir=asc&perPage=100')).body.jobs.map((j) => j.quantity);
    expect(up).toEqual([...up].sort((a, b) => a - b));
    const down = (await list('sort=quantity&perPage=100')).body.jobs.map((j) => j.quantity);
    expect(down).toEqual([...down].sort((a, b) => b - a));
    const due = (await list('sort=due&perPage=100')).body.jobs.map((j) => j.dueDate);
    const dated = due.filter((d): d is string => d !== null);
    expect(due.slice(0, dated.length)).toEqual([...dated].sort());
    expect(due.slice(dated.length).every((d) => d === null)).toBe(true);
  });

  it('answers 422 naming each bad query param', async () => {
    const answer = await callApi<{ error: { code: string; fields: Record<string, string[]> } }>(jars.lena, 'GET', '/api/jobs?status=paused&sort=colour&page=0&perPage=7');
    expect(answer.status).toBe(422);
    expect(Object.keys(answer.body.error.fields).sort()).toEqual(['page', 'perPage', 'sort', 'status']);
  });
});

describe('create, edit and status steps', () => {
  let jobId = 0;
  const job = {
    title: `${PREFIX} created`,
    customerId: 0,
    sheetWidthMm: 1250,
    sheetLengthMm: 2500,
    sheetThicknessMm: 3,
    holdDown: 'tape-glue',
    quantity: 240,
  };

  it('creates a job on the shop\'s first machine that is not archived, with a "created" history row', async () => {
    const answer = await callApi<{ job: { id: number; machineId: number; status: string } }>(jars.priya, 'POST', '/api/jobs', { ...job, customerId: customerIds[0] });
    expect(answer.status).toBe(201);
    jobId = answer.body.job.id;
    expect(answer.body.job).toMatchObject({ machineId: machineIds[0], status: 'draft' });
    const events = await callApi<{ events: { kind: string }[] }>(jars.lena, 'GET', `/api/jobs/${jobId}/events`);
    expect(events.body.events.map((e) => e.kind)).toEqual(['created']);
  });

  it('edits the job and records which fields changed; the same form again records nothing', async () => {
    const edited = { ...job, customerId: customerIds[0], quantity: 300, dueDate: '2027-05-14', machineId: machineIds[machineIds.length - 1] };
    const answer = await callApi<{ job: { quantity: number; dueDate: string } }>(jars.priya, 'PUT', `/api/jobs/${jobId}`, edited);
    expect(answer.status).toBe(200);
    expect(answer.body.job).toMatchObject({ quantity: 300, dueDate: '2027-05-14' });
    await callApi(jars.priya, 'PUT', `/api/jobs/${jobId}`, edited);
    const events = await callApi<{ events: { kind: string; detail: string }[] }>(jars.lena, 'GET', `/api/jobs/${jobId}/events`);
    expect(events.body.events.map((e) => e.kind)).toEqual(['edited', 'created']);
    const expectedWords = machineIds.length > 1 ? 'machine, quantity, due date' : 'quantity, due date';
    expect(events.body.events[0].detail).toBe(expectedWords);
  });

  it('refuses an edit by an estimator (403) and bad fields (422 naming them)', async () => {
    expect((await callApi(jars.tomas, 'PUT', `/api/jobs/${jobId}`, { ...job, customerId: customerIds[0] })).status).toBe(403);
    const bad = await callApi<{ error: { fields: Record<string, string[]> } }>(jars.priya, 'PUT', `/api/jobs/${jobId}`, { ...job, customerId: customerIds[0], dueDate: '2027-02-30', machineId: 2_000_000 });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields)).toEqual(['dueDate']);
    const otherMachine = await callApi<{ error: { fields: Record<string, string[]> } }>(jars.priya, 'PUT', `/api/jobs/${jobId}`, { ...job, customerId: customerIds[0], machineId: 2_000_000 });
    expect(otherMachine.status).toBe(422);
    expect(Object.keys(otherMachine.body.error.fields)).toEqual(['machineId']);
  });

  it('takes status steps by their owners only, in order, each with a history row', async () => {
    // no program yet: a draft cannot be marked programmed
    const early = await callApi<{ error: { code: string } }>(jars.priya, 'PATCH', `/api/jobs/${jobId}`, { status: 'programmed' });
    expect([early.status, early.body.error.code]).toEqual([409, 'conflict:job-status']);
    // the operator never marks a job quoted: 403 whatever the status
    expect((await callApi(jars.lena, 'PATCH', `/api/jobs/${jobId}`, { status: 'quoted' })).status).toBe(403);
    // the operator starts runs, but this job is a draft: 409
    expect((await callApi(jars.lena, 'PATCH', `/api/jobs/${jobId}`, { status: 'running' })).status).toBe(409);
    // a draft may be cancelled by the office
    const cancelled = await callApi<{ job: { status: string } }>(jars.tomas, 'PATCH', `/api/jobs/${jobId}`, { status: 'cancelled' });
    expect([cancelled.status, cancelled.body.job.status]).toEqual([200, 'cancelled']);
    // and then it stays as it was
    expect((await callApi(jars.priya, 'PUT', `/api/jobs/${jobId}`, { ...job, customerId: customerIds[0] })).status).toBe(409);
    const events = await callApi<{ events: { kind: string; detail: string }[] }>(jars.lena, 'GET', `/api/jobs/${jobId}/events`);
    expect(events.body.events[0]).toMatchObject({ kind: 'status', detail: 'draft>cancelled' });
  });

  it('walks a scheduled job through its run by the operator', async () => {
    const [row] = await dbm.db.select({ id: s.jobs.id }).from(s.jobs).where(and(like(s.jobs.title, `${PREFIX} 04`), eq(s.jobs.shopId, shopId)));
    // job 04 was inserted as scheduled (STATUSES[4])
    expect((await callApi<{ job: { status: string } }>(jars.lena, 'PATCH', `/api/jobs/${row.id}`, { status: 'running' })).body.job.status).toBe('running');
    expect((await callApi<{ job: { status: string } }>(jars.lena, 'PATCH', `/api/jobs/${row.id}`, { status: 'done' })).body.job.status).toBe('done');
    const again = await callApi<{ error: { message: string } }>(jars.lena, 'PATCH', `/api/jobs/${row.id}`, { status: 'done' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe('This job is done, so it cannot be moved to done: it has no further step.');
  });
});
