// Shop scoping and role rules through every JSON route handler of the built app,
// against the real MariaDB test database. A second shop, "Test Shop B", gets its own
// admin, customer, material, machine with a tool, and job; a user of Alder & Finch
// must not read or change any of them (404, the same answer as a missing row), and a
// role outside lib/auth/roles.ts's table gets 403.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import { eq } from 'drizzle-orm';
import { callApi, DEMO_PASSWORD, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

let server: AppServer;
let dbm: DbModule;
let s: Schema;
const b = { shopId: 0, userId: 0, customerId: 0, materialId: 0, machineId: 0, jobId: 0 };
const a = { shopId: 0, customerId: 0, jobId: 0 };
const jars: Record<string, CookieJar> = {};

const B_EMAIL = 'admin@test-shop-b.example';

/** '/api/jobs/:jobId' → '/api/jobs/42' with the ids given. */
function withIds(route: string, ids: Record<string, number>): string {
  return route.replace(/:(\w+)/g, (_, key: string) => String(ids[key]));
}

async function removeShopB() {
  const { db } = dbm;
  const [shop] = await db.select().from(s.shops).where(eq(s.shops.slug, 'test-shop-b'));
  if (!shop) return;
  await db.delete(s.jobs).where(eq(s.jobs.shopId, shop.id));
  await db.delete(s.tools).where(eq(s.tools.shopId, shop.id));
  await db.delete(s.machineVersions).where(eq(s.machineVersions.shopId, shop.id));
  await db.delete(s.machines).where(eq(s.machines.shopId, shop.id));
  await db.delete(s.customers).where(eq(s.customers.shopId, shop.id));
  await db.delete(s.materials).where(eq(s.materials.shopId, shop.id));
  await db.delete(s.users).where(eq(s.users.shopId, shop.id));
  await db.delete(s.shops).where(eq(s.shops.id, shop.id));
}

async function createShopB() {
  const { db } = dbm;
  [{ id: b.shopId }] = await db.insert(s.shops).values({ name: 'Test Shop B', slug: 'test-shop-b', currency: 'EUR' }).$returningId();
  [{ id: b.userId }] = await db
    .insert(s.users)
    .values({ shopId: b.shopId, email: B_EMAIL, name: 'Bea Test', role: 'admin', passwordHash: await bcrypt.hash(DEMO_PASSWORD, 4) })
    .$returningId();
  [{ id: b.customerId }] = await db
    .insert(s.customers)
    .values({ shopId: b.shopId, name: 'B Only Customer', email: 'orders@b-only.example' })
    .$returningId();
  [{ id: b.materialId }] = await db
    .insert(s.materials)
    .values({ shopId: b.shopId, name: 'B 6 mm MDF', thicknessMm: 6, sheetWidthMm: 1220, sheetLengthMm: 2440, costPerSheetMinor: 1800 })
    .$returningId();
  [{ id: b.machineId }] = await db
    .insert(s.machines)
    .values({
      shopId: b.shopId,
      name: 'B Router',
      travelXMm: 1250, travelYMm: 2500, travelZMm: 150,
      maxFeedXMmPerMin: 15000, maxFeedYMmPerMin: 15000, maxFeedZMmPerMin: 5000,
      rapidXMmPerMin: 20000, rapidYMmPerMin: 20000, rapidZMmPerMin: 8000,
      accelXMmPerS2: 800, accelYMmPerS2: 800, accelZMmPerS2: 400,
      cornerToleranceMm: 0.02, lookaheadBlocks: 64, maxBlocksPerS: 500, chordToleranceMm: 0.003,
      toolChangeS: 20, spindleSpinUpS: 4,
    })
    .$returningId();
  await db.insert(s.tools).values({ shopId: b.shopId, machineId: b.machineId, number: 1, diameterMm: 6, flutes: 2, kind: 'upcut' });
  [{ id: b.jobId }] = await db
    .insert(s.jobs)
    .values({
      shopId: b.shopId, title: 'B secret job', customerId: b.customerId, materialId: b.materialId,
      sheetWidthMm: 1220, sheetLengthMm: 2440, sheetThicknessMm: 6, holdDown: 'clamps', quantity: 3,
    })
    .$returningId();
}

beforeAll(async () => {
  server = await startAppServer();
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  await removeShopB();
  await createShopB();
  const [shopA] = await dbm.db.select().from(s.shops).where(eq(s.shops.name, 'Alder & Finch Shopfitting'));
  a.shopId = shopA.id;
  [{ id: a.customerId }] = await dbm.db.select({ id: s.customers.id }).from(s.customers).where(eq(s.customers.shopId, a.shopId)).limit(1);
  [{ id: a.jobId }] = await dbm.db.select({ id: s.jobs.id }).from(s.jobs).where(eq(s.jobs.shopId, a.shopId)).limit(1);
  for (const [key, email] of [
    ['ada', 'ada@alder-finch.example'],
    ['priya', 'priya@alder-finch.example'],
    ['tomas', 'tomas@alder-finch.example'],
    ['lena', 'lena@alder-finch.example'],
    ['bea', B_EMAIL],
  ] as const) {
    const result = await signInOverHttp(email, DEMO_PASSWORD);
    expect(result.signedIn, `${email} signs in`).toBe(true);
    jars[key] = result.jar;
  }
});

afterAll(async () => {
  if (dbm) {
    await removeShopB();
    await dbm.closeDb();
  }
  await server?.stop();
});

describe('lists show only the signed-in shop', () => {
  it.each([
    ['/api/jobs', 'jobs'],
    ['/api/customers', 'customers'],
    ['/api/machines', 'machines'],
    ['/api/materials', 'materials'],
    ['/api/users', 'users'],
  ])('%s for shop A has no row of shop B, and shop B sees its own', async (route, key) => {
    const forA = await callApi<Record<string, { id: number; shopId?: number }[]>>(jars.ada, 'GET', route);
    expect(forA.status).toBe(200);
    expect(forA.body[key].length).toBeGreaterThan(0);
    const forB = await callApi<Record<string, { id: number }[]>>(jars.bea, 'GET', route);
    expect(forB.status).toBe(200);
    const idsB = new Set(forB.body[key].map((r) => r.id));
    expect(idsB.size).toBeGreaterThan(0);
    expect(forA.body[key].filter((r) => idsB.has(r.id))).toEqual([]);
  });
});

describe("another shop's rows answer 404, for reads and for writes", () => {
  it.each([
    ['GET', '/api/jobs/:jobId', undefined, 'not-found:job'],
    ['PATCH', '/api/jobs/:jobId', { status: 'cancelled' }, 'not-found:job'],
    ['GET', '/api/customers/:customerId', undefined, 'not-found:customer'],
    ['PATCH', '/api/customers/:customerId', { name: 'Taken over' }, 'not-found:customer'],
    ['GET', '/api/machines/:machineId', undefined, 'not-found:machine'],
    ['GET', '/api/users/:userId', undefined, 'not-found:user'],
    ['PATCH', '/api/users/:userId', { disabled: true }, 'not-found:user'],
    ['PATCH', '/api/users/:userId', { role: 'operator' }, 'not-found:user'],
  ] as const)("%s %s with shop B's id", async (method, route, body, code) => {
    const answer = await callApi<{ error: { code: string } }>(jars.ada, method, withIds(route, b), body);
    expect(answer.status).toBe(404);
    expect(answer.body.error.code).toBe(code);
  });

  it('leaves shop B untouched after the attempts', async () => {
    const [job] = await dbm.db.select().from(s.jobs).where(eq(s.jobs.id, b.jobId));
    const [customer] = await dbm.db.select().from(s.customers).where(eq(s.customers.id, b.customerId));
    const [user] = await dbm.db.select().from(s.users).where(eq(s.users.id, b.userId));
    expect(job.status).toBe('draft');
    expect(customer.name).toBe('B Only Customer');
    expect(user).toMatchObject({ role: 'admin', disabled: false });
  });

  it("refuses a job for shop A that points at shop B's customer or material (422, no row)", async () => {
    const answer = await callApi<{ error: { code: string; fields: Record<string, string[]> } }>(jars.priya, 'POST', '/api/jobs', {
      title: 'Cross-shop attempt', customerId: b.customerId, materialId: b.materialId,
      sheetWidthMm: 1220, sheetLengthMm: 2440, sheetThicknessMm: 18, holdDown: 'vacuum', vacuumKpa: 60, quantity: 1,
    });
    expect(answer.status).toBe(422);
    expect(Object.keys(answer.body.error.fields).sort()).toEqual(['customerId', 'materialId']);
    const rows = await dbm.db.select().from(s.jobs).where(eq(s.jobs.title, 'Cross-shop attempt'));
    expect(rows).toEqual([]);
  });

  it('shop B reads its own job (the 404s above are about the shop, not the id)', async () => {
    const answer = await callApi<{ job: { title: string } }>(jars.bea, 'GET', `/api/jobs/${b.jobId}`);
    expect(answer.status).toBe(200);
    expect(answer.body.job.title).toBe('B secret job');
  });
});

describe('roles outside the table get 403', () => {
  it.each([
    ['lena', 'GET', '/api/users', undefined, 'forbidden:user'],
    ['lena', 'GET', '/api/customers', undefined, 'forbidden:customer'],
    // the operator starts and finishes runs but never marks a job quoted (lib/auth/roles.ts)
    ['lena', 'PATCH', '/api/jobs/:jobId', { status: 'quoted' }, 'forbidden:job'],
    ['lena', 'PUT', '/api/jobs/:jobId', { title: 'Renamed by an operator' }, 'forbidden:job'],
    ['tomas', 'GET', '/api/users', undefined, 'forbidden:user'],
    ['priya', 'POST', '/api/users', { name: 'X', email: 'x@alder-finch.example', role: 'admin', password: 'long-enough-1' }, 'forbidden:user'],
    ['priya', 'PATCH', '/api/users/:userId', { role: 'admin' }, 'forbidden:user'],
  ] as const)('%s: %s %s', async (who, method, route, body, code) => {
    const answer = await callApi<{ error: { code: string } }>(jars[who], method, withIds(route, { ...a, userId: b.userId }), body);
    expect(answer.status).toBe(403);
    expect(answer.body.error.code).toBe(code);
  });

  it('an operator may read jobs and machines', async () => {
    expect((await callApi(jars.lena, 'GET', '/api/jobs')).status).toBe(200);
    expect((await callApi(jars.lena, 'GET', '/api/machines')).status).toBe(200);
  });
});

describe('input and session errors', () => {
  it('a signed-out call gets 401 JSON', async () => {
    const answer = await callApi<{ error: { code: string } }>(null, 'GET', '/api/jobs');
    expect(answer.status).toBe(401);
    expect(answer.body.error.code).toBe('unauthorized');
  });

  it('bad input gets 422 with the fields named', async () => {
    const answer = await callApi<{ error: { code: string; fields: Record<string, string[]> } }>(jars.tomas, 'POST', '/api/customers', {
      name: '',
      email: 'not-an-email',
    });
    expect(answer.status).toBe(422);
    expect(answer.body.error.code).toBe('invalid:customer');
    expect(Object.keys(answer.body.error.fields).sort()).toEqual(['email', 'name']);
  });

  it('a non-numeric id is a 404, not a crash', async () => {
    const answer = await callApi<{ error: { code: string } }>(jars.ada, 'GET', '/api/jobs/12abc');
    expect(answer.status).toBe(404);
  });

  it('an admin cannot disable themself', async () => {
    const [ada] = await dbm.db.select().from(s.users).where(eq(s.users.email, 'ada@alder-finch.example'));
    const answer = await callApi<{ error: { code: string } }>(jars.ada, 'PATCH', `/api/users/${ada.id}`, { disabled: true });
    expect(answer.status).toBe(403);
    expect(answer.body.error.code).toBe('forbidden:disable-self');
  });

  it('a customer created by shop A belongs to shop A', async () => {
    const answer = await callApi<{ customer: { id: number; shopId: number } }>(jars.tomas, 'POST', '/api/customers', {
      name: 'Scoping Check Customer',
      email: 'scoping-check@example.com',
    });
    expect(answer.status).toBe(201);
    expect(answer.body.customer.shopId).toBe(a.shopId);
    await dbm.db.delete(s.customers).where(eq(s.customers.id, answer.body.customer.id));
  });
});
