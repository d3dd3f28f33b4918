// Machines, tools, materials and the shop's length unit through the built app's JSON
// routes, against the real MariaDB test database: a profile change makes version + 1 and a
// machine_versions row while the old snapshot stays as it was; a save that changes nothing
// makes no version; tool changes are profile changes; a machine a job names is archived,
// not deleted, and leaves the default list; another shop's ids answer 404; estimators and
// operators get 403 on every write. Rows are invented for the test and removed after.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { and, eq, like } from 'drizzle-orm';
import { callApi, DEMO_PASSWORD, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');
type Profile = import('@/lib/validation/machine-profile').MachineProfile;

let server: AppServer;
let dbm: DbModule;
let s: Schema;
const jars: Record<string, CookieJar> = {};
const PREFIX = 'Test M ';
const other = { shopId: 0, machineId: 0, toolId: 0, materialId: 0 };
let shopA = 0;
let customerA = 0;

const fixture = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../fixtures/machines/router-1.json'), 'utf8')) as Profile;
const profile = (name: string): Profile => ({ ...structuredClone(fixture), name: `${PREFIX}${name}` });

interface MachineBody {
  machine: { id: number; name: string; version: number; archivedAt: string | null; cornerToleranceMm: number; hourlyRateMinor: number; tools: { id: number; number: number; diameterMm: number; description: string }[] };
  versions: { version: number; profile: Profile }[];
}
type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string[]> } };

async function removeTestRows() {
  const { db } = dbm;
  await db.delete(s.jobs).where(like(s.jobs.title, `${PREFIX}%`));
  const ours = await db.select({ id: s.machines.id }).from(s.machines).where(like(s.machines.name, `${PREFIX}%`));
  for (const { id } of ours) {
    await db.delete(s.jobs).where(eq(s.jobs.machineId, id));
    await db.delete(s.tools).where(eq(s.tools.machineId, id));
    await db.delete(s.machineVersions).where(eq(s.machineVersions.machineId, id));
    await db.delete(s.machines).where(eq(s.machines.id, id));
  }
  await db.delete(s.materials).where(like(s.materials.name, `${PREFIX}%`));
  const [shop] = await db.select().from(s.shops).where(eq(s.shops.slug, 'test-shop-machines'));
  if (shop) {
    await db.delete(s.materials).where(eq(s.materials.shopId, shop.id));
    await db.delete(s.shops).where(eq(s.shops.id, shop.id));
  }
}

async function createOtherShop() {
  const { db } = dbm;
  [{ id: other.shopId }] = await db.insert(s.shops).values({ name: 'Test Shop M', slug: 'test-shop-machines', currency: 'EUR' }).$returningId();
  const { profileToMachineColumns } = await import('@/db/queries/machines');
  [{ id: other.machineId }] = await db.insert(s.machines).values({ ...profileToMachineColumns(profile('Other shop router')), shopId: other.shopId }).$returningId();
  [{ id: other.toolId }] = await db.insert(s.tools).values({ shopId: other.shopId, machineId: other.machineId, number: 1, diameterMm: 6, flutes: 2, kind: 'upcut' }).$returningId();
  [{ id: other.materialId }] = await db
    .insert(s.materials)
    .values({ shopId: other.shopId, name: `${PREFIX}other MDF`, thicknessMm: 6, sheetWidthMm: 1220, sheetLengthMm: 2440, costPerSheetMinor: 1800 })
    .$returningId();
}

async function create(name: string, jar = jars.ada): Promise<MachineBody['machine']> {
  const answer = await callApi<{ machine: MachineBody['machine'] }>(jar, 'POST', '/api/machines', { ...profile(name), hourlyRateMinor: 8000, defaultHoldDown: 'clamps' });
  expect(answer.status, JSON.stringify(answer.body)).toBe(201);
  return answer.body.machine;
}

const read = async (id: number) => (await callApi<MachineBody>(jars.ada, 'GET', `/api/machines/${id}`)).body;

beforeAll(async () => {
  server = await startAppServer();
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  await removeTestRows();
  await createOtherShop();
  [{ id: shopA }] = await dbm.db.select({ id: s.shops.id }).from(s.shops).where(eq(s.shops.slug, 'alder-finch'));
  [{ id: customerA }] = await dbm.db.select({ id: s.customers.id }).from(s.customers).where(eq(s.customers.shopId, shopA)).limit(1);
  for (const [key, email] of [
    ['ada', 'ada@alder-finch.example'],
    ['priya', 'priya@alder-finch.example'],
    ['tomas', 'tomas@alder-finch.example'],
    ['lena', 'lena@alder-finch.example'],
  ] as const) {
    const result = await signInOverHttp(email, DEMO_PASSWORD);
    expect(result.signedIn, `${email} signs in`).toBe(true);
    jars[key] = result.jar;
  }
});

afterAll(async () => {
  if (dbm) {
    await dbm.db.update(s.shops).set({ lengthUnit: 'mm' }).where(eq(s.shops.slug, 'alder-finch'));
    await removeTestRows();
    await dbm.closeDb();
  }
  await server?.stop();
});

describe('profile versions', () => {
  it('a new machine is version 1 with its snapshot, tools included', async () => {
    const machine = await create('Versions');
    expect(machine.version).toBe(1);
    const { versions } = await read(machine.id);
    expect(versions.map((v) => v.version)).toEqual([1]);
    expect(versions[0].profile).toEqual(profile('Versions'));
  });

  it('a corner tolerance change makes version 2 and a new row; the v1 snapshot is unchanged', async () => {
    const machine = await create('Corner');
    const answer = await callApi<{ version: number; versioned: boolean }>(jars.ada, 'PATCH', `/api/machines/${machine.id}`, { cornerToleranceMm: 0.03 });
    expect(answer.status).toBe(200);
    expect(answer.body).toMatchObject({ version: 2, versioned: true });
    const { machine: now, versions } = await read(machine.id);
    expect(now.version).toBe(2);
    expect(now.cornerToleranceMm).toBe(0.03);
    expect(versions.map((v) => v.version)).toEqual([2, 1]);
    expect(versions[1].profile.cornerToleranceMm).toBe(fixture.cornerToleranceMm);
    expect(versions[1].profile).toEqual(profile('Corner'));
    expect(versions[0].profile).toEqual({ ...profile('Corner'), cornerToleranceMm: 0.03 });
  });

  it('a save that alters nothing, or only the hourly rate and hold-down, makes no version', async () => {
    const machine = await create('Same');
    const same = await callApi<{ version: number; versioned: boolean }>(jars.ada, 'PATCH', `/api/machines/${machine.id}`, {
      cornerToleranceMm: fixture.cornerToleranceMm,
      travelMm: fixture.travelMm,
    });
    expect(same.body).toMatchObject({ version: 1, versioned: false });
    const settings = await callApi<{ version: number; versioned: boolean }>(jars.ada, 'PATCH', `/api/machines/${machine.id}`, { hourlyRateMinor: 9900, defaultHoldDown: 'vacuum' });
    expect(settings.body).toMatchObject({ version: 1, versioned: false });
    const { machine: now, versions } = await read(machine.id);
    expect(now.hourlyRateMinor).toBe(9900);
    expect(versions.map((v) => v.version)).toEqual([1]);
  });

  it('the vacuum level a job starts from: set, cleared, refused at 0 and past one atmosphere (101.325 kPa, ISO 2533 standard atmosphere); never a new version', async () => {
    const machine = await create('Vacuum');
    const url = `/api/machines/${machine.id}`;
    const set = await callApi<{ version: number; versioned: boolean }>(jars.ada, 'PATCH', url, { defaultVacuumKpa: 55.5 });
    expect(set.status).toBe(200);
    expect(set.body).toMatchObject({ version: 1, versioned: false });
    expect((await read(machine.id)).machine).toMatchObject({ defaultVacuumKpa: 55.5 });
    for (const bad of [0, 101.4, 'strong']) {
      const refused = await callApi<{ error: { code: string; fields: Record<string, string[]> } }>(jars.ada, 'PATCH', url, { defaultVacuumKpa: bad });
      expect(refused.status, String(bad)).toBe(422);
      expect(Object.keys(refused.body.error.fields), String(bad)).toEqual(['defaultVacuumKpa']);
    }
    expect((await read(machine.id)).machine).toMatchObject({ defaultVacuumKpa: 55.5 });
    const cleared = await callApi(jars.ada, 'PATCH', url, { defaultVacuumKpa: null });
    expect(cleared.status).toBe(200);
    expect((await read(machine.id)).machine).toMatchObject({ defaultVacuumKpa: null });
    expect((await read(machine.id)).versions.map((v) => v.version)).toEqual([1]);
  });

  it('tools: add, change and remove are new versions; a description alone is not; older snapshots keep the tool', async () => {
    const machine = await create('Tools');
    const added = await callApi<{ tool: { id: number }; version: number }>(jars.ada, 'POST', `/api/machines/${machine.id}/tools`, { number: 9, diameterMm: 3.175, flutes: 1, kind: 'downcut' });
    expect(added.status).toBe(201);
    expect(added.body.version).toBe(2);
    const toolId = added.body.tool.id;
    const described = await callApi<{ version: number; versioned: boolean }>(jars.ada, 'PATCH', `/api/machines/${machine.id}/tools/${toolId}`, { description: 'acrylic letters' });
    expect(described.body).toMatchObject({ version: 2, versioned: false });
    const changed = await callApi<{ version: number; versioned: boolean }>(jars.ada, 'PATCH', `/api/machines/${machine.id}/tools/${toolId}`, { diameterMm: 3 });
    expect(changed.body).toMatchObject({ version: 3, versioned: true });
    const removed = await callApi<{ version: number }>(jars.ada, 'DELETE', `/api/machines/${machine.id}/tools/${toolId}`);
    expect(removed.body.version).toBe(4);
    const { versions } = await read(machine.id);
    const toolIn = (v: number) => versions.find((x) => x.version === v)!.profile.tools.find((t) => t.number === 9);
    expect(toolIn(1)).toBeUndefined();
    expect(toolIn(2)).toEqual({ number: 9, diameterMm: 3.175, flutes: 1, kind: 'downcut' });
    expect(toolIn(3)).toEqual({ number: 9, diameterMm: 3, flutes: 1, kind: 'downcut' });
    expect(toolIn(4)).toBeUndefined();
  });

  it('two saves at the same moment take versions 2 and 3, each with its own snapshot', async () => {
    const machine = await create('Race');
    const [a, b] = await Promise.all([
      callApi<{ version: number }>(jars.ada, 'PATCH', `/api/machines/${machine.id}`, { toolChangeSeconds: 15 }),
      callApi<{ version: number }>(jars.ada, 'PATCH', `/api/machines/${machine.id}`, { spindleSpinUpSeconds: 7 }),
    ]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect([a.body.version, b.body.version].sort()).toEqual([2, 3]);
    const { machine: now, versions } = await read(machine.id);
    expect(versions.map((v) => v.version)).toEqual([3, 2, 1]);
    expect(versions[0].profile).toMatchObject({ toolChangeSeconds: 15, spindleSpinUpSeconds: 7 });
    expect(now.version).toBe(3);
  });
});

describe('bad input', () => {
  it('names the field in a sentence, and leaves the machine and its versions as they were', async () => {
    const machine = await create('Bad input');
    const answer = await callApi<ErrorBody>(jars.ada, 'PATCH', `/api/machines/${machine.id}`, { cornerToleranceMm: -1, lookaheadBlocks: 1.5 });
    expect(answer.status).toBe(422);
    expect(answer.body.error.fields).toEqual({
      cornerToleranceMm: ['Corner tolerance must be 0 or more.'],
      lookaheadBlocks: ['Look-ahead must be a whole number.'],
    });
    const { machine: now, versions } = await read(machine.id);
    expect(now.cornerToleranceMm).toBe(fixture.cornerToleranceMm);
    expect(versions).toHaveLength(1);
  });

  it('refuses a second machine of the same name (409 at the name) and a tool number twice', async () => {
    const machine = await create('Twice');
    const again = await callApi<ErrorBody>(jars.ada, 'POST', '/api/machines', profile('Twice'));
    expect(again.status).toBe(409);
    expect(Object.keys(again.body.error.fields ?? {})).toEqual(['name']);
    const tool = await callApi<ErrorBody>(jars.ada, 'POST', `/api/machines/${machine.id}/tools`, { number: 1, diameterMm: 6, flutes: 2, kind: 'upcut' });
    expect(tool.status).toBe(409);
    expect(tool.body.error.fields?.number?.[0]).toMatch(/Tool 1 is already/);
    expect((await read(machine.id)).versions).toHaveLength(1);
  });

  it('takes a PROFILE.json the CLI takes and refuses one it refuses, with the same field', async () => {
    const bad = await callApi<ErrorBody>(jars.ada, 'POST', '/api/machines', { ...profile('Cli bad'), chordToleranceMm: 0 });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields ?? {})).toEqual(['chordToleranceMm']);
  });
});

describe('archive instead of delete', () => {
  it('a machine a job names is archived: readable, out of the default list, not editable until restored', async () => {
    const machine = await create('Archived');
    await dbm.db.insert(s.jobs).values({
      shopId: shopA, title: `${PREFIX}job on archived`, customerId: customerA, machineId: machine.id,
      sheetWidthMm: 1220, sheetLengthMm: 2440, sheetThicknessMm: 18, holdDown: 'vacuum', quantity: 1,
    });
    const removed = await callApi<{ result: string }>(jars.ada, 'DELETE', `/api/machines/${machine.id}`);
    expect(removed.body.result).toBe('archived');
    const { machine: now, versions } = await read(machine.id);
    expect(now.archivedAt).not.toBeNull();
    expect(versions).toHaveLength(1);
    const list = await callApi<{ machines: { id: number }[] }>(jars.ada, 'GET', '/api/machines');
    expect(list.body.machines.some((m) => m.id === machine.id)).toBe(false);
    const all = await callApi<{ machines: { id: number }[] }>(jars.ada, 'GET', '/api/machines?archived=include');
    expect(all.body.machines.some((m) => m.id === machine.id)).toBe(true);
    const edit = await callApi<ErrorBody>(jars.ada, 'PATCH', `/api/machines/${machine.id}`, { cornerToleranceMm: 0.05 });
    expect(edit.status).toBe(409);
    const restored = await callApi<MachineBody>(jars.ada, 'PATCH', `/api/machines/${machine.id}`, { archived: false });
    expect(restored.body.machine.archivedAt).toBeNull();
  });

  it('a machine only an estimate names is archived too', async () => {
    const machine = await create('Estimated');
    const { db } = dbm;
    const [{ id: jobId }] = await db
      .insert(s.jobs)
      .values({ shopId: shopA, title: `${PREFIX}job with an estimate`, customerId: customerA, sheetWidthMm: 1220, sheetLengthMm: 2440, sheetThicknessMm: 18, holdDown: 'tabs', quantity: 1 })
      .$returningId();
    const [{ id: programId }] = await db.insert(s.programs).values({ shopId: shopA, jobId, name: 'test-m.nc' }).$returningId();
    const [{ id: programVersionId }] = await db
      .insert(s.programVersions)
      .values({ shopId: shopA, programId, version: 1, objectKey: `shops/${shopA}/test-m/${programId}.nc`, sha256: 'a'.repeat(64), bytes: 10, lines: 1 })
      .$returningId();
    await db.insert(s.estimates).values({
      shopId: shopA, programId, programVersionId, programVersion: 1, machineId: machine.id, machineVersion: 1, engineVersion: 'test',
      inputKey: randomBytes(32).toString('hex'), settings: { sheet: null, zero: 'top', hold: null, vacuumKpa: null },
      // stored as failed, so the estimate queue of the running app leaves the row alone
      status: 'failed', error: 'test row, never computed',
    });
    try {
      const removed = await callApi<{ result: string }>(jars.ada, 'DELETE', `/api/machines/${machine.id}`);
      expect(removed.body.result).toBe('archived');
      expect((await read(machine.id)).machine.archivedAt).not.toBeNull();
    } finally {
      await db.delete(s.estimates).where(eq(s.estimates.programId, programId));
      await db.delete(s.programVersions).where(eq(s.programVersions.programId, programId));
      await db.delete(s.programs).where(eq(s.programs.id, programId));
      await db.delete(s.jobs).where(eq(s.jobs.id, jobId));
    }
  });

  it('a machine nothing refers to is deleted with its tools and versions', async () => {
    const machine = await create('Deleted');
    const removed = await callApi<{ result: string }>(jars.ada, 'DELETE', `/api/machines/${machine.id}`);
    expect(removed.body.result).toBe('deleted');
    expect((await callApi(jars.ada, 'GET', `/api/machines/${machine.id}`)).status).toBe(404);
    const rows = await dbm.db.select().from(s.machineVersions).where(eq(s.machineVersions.machineId, machine.id));
    expect(rows).toEqual([]);
  });
});

describe("another shop's ids answer 404", () => {
  it.each([
    ['GET', '/api/machines/:machineId', undefined, 'not-found:machine'],
    ['PATCH', '/api/machines/:machineId', { cornerToleranceMm: 0.5 }, 'not-found:machine'],
    ['DELETE', '/api/machines/:machineId', undefined, 'not-found:machine'],
    ['GET', '/api/machines/:machineId/tools', undefined, 'not-found:machine'],
    ['POST', '/api/machines/:machineId/tools', { number: 5, diameterMm: 6, flutes: 2, kind: 'upcut' }, 'not-found:machine'],
    ['PATCH', '/api/machines/:machineId/tools/:toolId', { diameterMm: 8 }, 'not-found:machine'],
    ['DELETE', '/api/machines/:machineId/tools/:toolId', undefined, 'not-found:machine'],
    ['GET', '/api/materials/:materialId', undefined, 'not-found:material'],
    ['PATCH', '/api/materials/:materialId', { costPerSheetMinor: 1 }, 'not-found:material'],
    ['DELETE', '/api/materials/:materialId', undefined, 'not-found:material'],
  ] as const)('%s %s', async (method, route, body, code) => {
    const url = route.replace(':machineId', String(other.machineId)).replace(':toolId', String(other.toolId)).replace(':materialId', String(other.materialId));
    const answer = await callApi<ErrorBody>(jars.ada, method, url, body);
    expect(answer.status).toBe(404);
    expect(answer.body.error.code).toBe(code);
  });

  it("a tool of another machine of the same shop is 404 too, and the other shop's rows are untouched", async () => {
    const mine = await create('Tool owner');
    const answer = await callApi<ErrorBody>(jars.ada, 'PATCH', `/api/machines/${mine.id}/tools/${other.toolId}`, { diameterMm: 8 });
    expect(answer.status).toBe(404);
    const [tool] = await dbm.db.select().from(s.tools).where(eq(s.tools.id, other.toolId));
    const [machine] = await dbm.db.select().from(s.machines).where(eq(s.machines.id, other.machineId));
    const [material] = await dbm.db.select().from(s.materials).where(eq(s.materials.id, other.materialId));
    expect(tool.diameterMm).toBe(6);
    expect(machine).toMatchObject({ version: 1, archivedAt: null });
    expect(material.costPerSheetMinor).toBe(1800);
  });
});

describe('roles', () => {
  it.each(['priya', 'tomas', 'lena'] as const)('%s may read machines and materials but gets 403 on every write (set-up is for the admin alone, PRODUCT.md step 1)', async (who) => {
    const target = await create(`Role target ${who}`);
    const toolId = target.tools[0].id;
    expect((await callApi(jars[who], 'GET', `/api/machines/${target.id}`)).status).toBe(200);
    expect((await callApi(jars[who], 'GET', '/api/materials')).status).toBe(200);
    const writes: [string, string, unknown][] = [
      ['POST', '/api/machines', profile(`By ${who}`)],
      ['PATCH', `/api/machines/${target.id}`, { cornerToleranceMm: 0.04 }],
      ['DELETE', `/api/machines/${target.id}`, undefined],
      ['POST', `/api/machines/${target.id}/tools`, { number: 8, diameterMm: 6, flutes: 2, kind: 'upcut' }],
      ['PATCH', `/api/machines/${target.id}/tools/${toolId}`, { diameterMm: 8 }],
      ['DELETE', `/api/machines/${target.id}/tools/${toolId}`, undefined],
      ['POST', '/api/materials', { name: `${PREFIX}by ${who}`, thicknessMm: 3, sheetWidthMm: 1000, sheetLengthMm: 2000, costPerSheetMinor: 100 }],
      ['PATCH', '/api/shop', { lengthUnit: 'inch' }],
    ];
    for (const [method, route, body] of writes) {
      const answer = await callApi<ErrorBody>(jars[who], method, route, body);
      expect(answer.status, `${method} ${route}`).toBe(403);
      expect(answer.body.error.code).toMatch(/^forbidden:/);
    }
    expect((await read(target.id)).machine.version).toBe(1);
  });

  it('only an admin sets the length unit; stored values stay mm', async () => {
    expect((await callApi(jars.priya, 'PATCH', '/api/shop', { lengthUnit: 'inch' })).status).toBe(403);
    const set = await callApi<{ shop: { lengthUnit: string } }>(jars.ada, 'PATCH', '/api/shop', { lengthUnit: 'inch' });
    expect(set.status).toBe(200);
    expect(set.body.shop.lengthUnit).toBe('inch');
    const machine = await create('Inch shop');
    expect((await read(machine.id)).machine.cornerToleranceMm).toBe(fixture.cornerToleranceMm);
    const back = await callApi<{ shop: { lengthUnit: string } }>(jars.ada, 'PATCH', '/api/shop', { lengthUnit: 'mm' });
    expect(back.body.shop.lengthUnit).toBe('mm');
    expect((await callApi(jars.ada, 'PATCH', '/api/shop', { lengthUnit: 'furlong' })).status).toBe(422);
  });
});

describe('materials', () => {
  it('adds, changes and removes one; refuses to remove one a job uses', async () => {
    const created = await callApi<{ material: { id: number } }>(jars.ada, 'POST', '/api/materials', {
      name: `${PREFIX}ABS 4 mm`, thicknessMm: 4, sheetWidthMm: 1000, sheetLengthMm: 2000, costPerSheetMinor: 4250,
    });
    expect(created.status).toBe(201);
    const id = created.body.material.id;
    const changed = await callApi<{ material: { costPerSheetMinor: number } }>(jars.ada, 'PATCH', `/api/materials/${id}`, { costPerSheetMinor: 4400 });
    expect(changed.body.material.costPerSheetMinor).toBe(4400);
    const bad = await callApi<ErrorBody>(jars.ada, 'POST', '/api/materials', { name: `${PREFIX}bad`, thicknessMm: 0, sheetWidthMm: 7000, sheetLengthMm: 2000, costPerSheetMinor: 1.5 });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields ?? {}).sort()).toEqual(['costPerSheetMinor', 'sheetWidthMm', 'thicknessMm']);

    await dbm.db.insert(s.jobs).values({
      shopId: shopA, title: `${PREFIX}job on ABS`, customerId: customerA, materialId: id,
      sheetWidthMm: 1000, sheetLengthMm: 2000, sheetThicknessMm: 4, holdDown: 'clamps', quantity: 1,
    });
    const inUse = await callApi<ErrorBody>(jars.ada, 'DELETE', `/api/materials/${id}`);
    expect(inUse.status).toBe(409);
    expect(inUse.body.error.message).toMatch(/1 job uses it/);
    await dbm.db.delete(s.jobs).where(and(eq(s.jobs.shopId, shopA), eq(s.jobs.materialId, id)));
    const removed = await callApi<{ result: string }>(jars.ada, 'DELETE', `/api/materials/${id}`);
    expect(removed.body.result).toBe('deleted');
    expect((await callApi(jars.ada, 'GET', `/api/materials/${id}`)).status).toBe(404);
  });
});
