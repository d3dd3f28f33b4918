// The role and shop rules swept through the built app (next start) and the real MariaDB
// test database, cell by cell, with the role table in lib/auth/roles.ts as the oracle:
// - every write route (each non-GET handler of tests/unit/support/handler-specs.ts, so a
//   new route joins the sweep) × every role, aimed at ANOTHER shop's rows: a role the table
//   refuses gets 403 forbidden:<subject>, a role it allows gets past the guard and hears 404,
//   the answer of a missing row; routes that take no id in the path succeed (2xx) for the
//   allowed roles, and what they make belongs to the caller's shop;
// - own-shop writes by every role: 403 and the row unchanged, or success;
// - the job status steps × every role (lib/jobs/status-moves.ts names each step's action);
// - POST /api/users and the users page's server actions: the new user lands in the
//   admin's shop whatever the body says; change role, disable and one-time password with
//   another shop's user id answer "No such user." and leave that user as it was;
// - every server action called over HTTP (the Next-Action request a form makes) by a role
//   the table refuses: the role message, nothing changed.
// Two shops of our own ("Sweep Shop S" with one user per role, "Sweep Shop O" with a row
// of every kind) keep the sweep clear of the other tests' rows.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import { and, eq } from 'drizzle-orm';
import { ACTIONS, canDo, type Action } from '@/lib/auth/roles';
import { STATUS_MOVES } from '@/lib/jobs/status-moves';
import { ROLES, type Role } from '@/lib/validation/enums';
import { ACTION_SPECS, OWN_PASSWORD, PUBLIC, ROUTE_SPECS } from '../unit/support/handler-specs';
import { callApi, DEMO_PASSWORD, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';
import { connectTestDb, type TestDb } from './support/db';
import * as s from '@/db/schema';

const ROOT = path.resolve(__dirname, '../..');
const SLUG_S = 'sweep-shop-s';
const SLUG_O = 'sweep-shop-o';
const ROLE_MESSAGE = 'Your role does not allow this.';

let server: AppServer;
let t: TestDb;
const jar = {} as Record<Role, CookieJar>;
const S = { shopId: 0, users: {} as Record<Role, number>, spareUserId: 0, changingUserId: 0, customerId: 0, materialId: 0, machineId: 0, toolId: 0, jobId: 0 };
const O = { shopId: 0, userId: 0, customerId: 0, materialId: 0, machineId: 0, toolId: 0, jobId: 0, programId: 0, estimateId: 0, quoteId: 0, runId: 0 };

/** the error code's subject, as lib/errors.ts documents it: the action's resource in the singular */
const subject = (action: string) => action.split(':')[0].replace(/s$/, '');

const machineRow = (shopId: number, name: string) => ({
  shopId, name,
  travelXMm: 1250, travelYMm: 2500, travelZMm: 150,
  maxFeedXMmPerMin: 15000, maxFeedYMmPerMin: 15000, maxFeedZMmPerMin: 5000,
  rapidXMmPerMin: 20000, rapidYMmPerMin: 20000, rapidZMmPerMin: 8000,
  accelXMmPerS2: 800, accelYMmPerS2: 800, accelZMmPerS2: 400,
  cornerToleranceMm: 0.02, lookaheadBlocks: 64, maxBlocksPerS: 500, chordToleranceMm: 0.003,
  toolChangeS: 20, spindleSpinUpS: 4,
});

/** Every row of the two sweep shops, whatever table it is in (foreign keys off on one connection). */
async function removeSweepShops() {
  const conn = await t.pool.getConnection();
  try {
    const [shops] = (await conn.query('SELECT id FROM shops WHERE slug IN (?, ?)', [SLUG_S, SLUG_O])) as unknown as [{ id: number }[]];
    if (shops.length === 0) return;
    const ids = shops.map((r) => r.id);
    await conn.query('SET FOREIGN_KEY_CHECKS = 0');
    const [users] = (await conn.query('SELECT id FROM users WHERE shop_id IN (?)', [ids])) as unknown as [{ id: number }[]];
    if (users.length > 0) await conn.query('DELETE FROM user_sessions WHERE user_id IN (?)', [users.map((u) => u.id)]);
    const [tables] = (await conn.query(
      "SELECT table_name AS name FROM information_schema.columns WHERE table_schema = DATABASE() AND column_name = 'shop_id'",
    )) as unknown as [{ name: string }[]];
    for (const { name } of tables) await conn.query(`DELETE FROM \`${name}\` WHERE shop_id IN (?)`, [ids]);
    await conn.query('DELETE FROM shops WHERE id IN (?)', [ids]);
  } finally {
    await conn.query('SET FOREIGN_KEY_CHECKS = 1');
    conn.release();
  }
}

async function createShops() {
  const { db } = t;
  const hash = await bcrypt.hash(DEMO_PASSWORD, 4);
  [{ id: S.shopId }] = await db.insert(s.shops).values({ name: 'Sweep Shop S', slug: SLUG_S, currency: 'EUR' }).$returningId();
  for (const role of ROLES) {
    [{ id: S.users[role] }] = await db.insert(s.users).values({ shopId: S.shopId, email: `${role}@sweep-s.example`, name: `Sweep ${role}`, role, passwordHash: hash }).$returningId();
  }
  [{ id: S.spareUserId }] = await db.insert(s.users).values({ shopId: S.shopId, email: 'spare@sweep-s.example', name: 'Sweep spare', role: 'operator', passwordHash: hash }).$returningId();
  [{ id: S.changingUserId }] = await db.insert(s.users).values({ shopId: S.shopId, email: 'changing@sweep-s.example', name: 'Sweep changing', role: 'operator', passwordHash: hash }).$returningId();
  [{ id: S.customerId }] = await db.insert(s.customers).values({ shopId: S.shopId, name: 'S Customer', email: 'orders@s-customer.example' }).$returningId();
  [{ id: S.materialId }] = await db.insert(s.materials).values({ shopId: S.shopId, name: 'S 18 mm birch', thicknessMm: 18, sheetWidthMm: 1220, sheetLengthMm: 2440, costPerSheetMinor: 6400 }).$returningId();
  [{ id: S.machineId }] = await db.insert(s.machines).values(machineRow(S.shopId, 'S Router')).$returningId();
  [{ id: S.toolId }] = await db.insert(s.tools).values({ shopId: S.shopId, machineId: S.machineId, number: 1, diameterMm: 6, flutes: 2, kind: 'upcut' }).$returningId();
  [{ id: S.jobId }] = await db
    .insert(s.jobs)
    .values({ shopId: S.shopId, title: 'S job', customerId: S.customerId, materialId: S.materialId, machineId: S.machineId, sheetWidthMm: 1220, sheetLengthMm: 2440, sheetThicknessMm: 18, holdDown: 'clamps', quantity: 3 })
    .$returningId();
  // the job has a program, so "mark programmed" is a step it can take
  await db.insert(s.programs).values({ shopId: S.shopId, jobId: S.jobId, name: 's-part.nc' });

  [{ id: O.shopId }] = await db.insert(s.shops).values({ name: 'Sweep Shop O', slug: SLUG_O, currency: 'EUR' }).$returningId();
  [{ id: O.userId }] = await db.insert(s.users).values({ shopId: O.shopId, email: 'admin@sweep-o.example', name: 'O admin', role: 'admin', passwordHash: hash }).$returningId();
  [{ id: O.customerId }] = await db.insert(s.customers).values({ shopId: O.shopId, name: 'O Customer', email: 'orders@o-customer.example' }).$returningId();
  [{ id: O.materialId }] = await db.insert(s.materials).values({ shopId: O.shopId, name: 'O 6 mm MDF', thicknessMm: 6, sheetWidthMm: 1220, sheetLengthMm: 2440, costPerSheetMinor: 1800 }).$returningId();
  [{ id: O.machineId }] = await db.insert(s.machines).values(machineRow(O.shopId, 'O Router')).$returningId();
  [{ id: O.toolId }] = await db.insert(s.tools).values({ shopId: O.shopId, machineId: O.machineId, number: 1, diameterMm: 6, flutes: 2, kind: 'upcut' }).$returningId();
  [{ id: O.jobId }] = await db
    .insert(s.jobs)
    .values({ shopId: O.shopId, title: 'O job', customerId: O.customerId, materialId: O.materialId, machineId: O.machineId, sheetWidthMm: 1220, sheetLengthMm: 2440, sheetThicknessMm: 6, holdDown: 'clamps', quantity: 3, status: 'scheduled' })
    .$returningId();
  [{ id: O.programId }] = await db.insert(s.programs).values({ shopId: O.shopId, jobId: O.jobId, name: 'o-part.nc' }).$returningId();
  const [{ id: versionId }] = await db
    .insert(s.programVersions)
    .values({ shopId: O.shopId, programId: O.programId, version: 1, objectKey: `shops/${O.shopId}/programs/sweep.nc`, sha256: 'b'.repeat(64), bytes: 6, lines: 1 })
    .$returningId();
  // failed, so the app's estimate queue never claims it
  [{ id: O.estimateId }] = await db
    .insert(s.estimates)
    .values({
      shopId: O.shopId, programId: O.programId, programVersionId: versionId, programVersion: 1, machineId: O.machineId, machineVersion: 1,
      engineVersion: 'sweep', inputKey: 'c'.repeat(64), settings: {} as never, status: 'failed', error: 'not run',
    })
    .$returningId();
  [{ id: O.quoteId }] = await db
    .insert(s.quotes)
    .values({ shopId: O.shopId, jobId: O.jobId, estimateId: O.estimateId, number: 'O-SWEEP-1', currency: 'EUR', totalMinor: 1000, inputs: {}, figures: {}, lines: [], validityDays: 30 } as never)
    .$returningId();
  [{ id: O.runId }] = await db
    .insert(s.runs)
    .values({ shopId: O.shopId, jobId: O.jobId, programId: O.programId, programVersion: 1, machineId: O.machineId, machineVersion: 1, operatorId: O.userId, status: 'paused', startedAt: new Date() })
    .$returningId();
}

/** '/api/jobs/[jobId]' → '/api/jobs/42' with the ids given. */
function fill(route: string, ids: Record<string, number | string>): string {
  return route.replace(/\[(\w+)\]/g, (_, key: string) => {
    if (!(key in ids)) throw new Error(`no id for [${key}] in ${route}`);
    return String(ids[key]);
  });
}

const otherIds = () => ({ jobId: O.jobId, customerId: O.customerId, machineId: O.machineId, toolId: O.toolId, materialId: O.materialId, programId: O.programId, estimateId: O.estimateId, quoteId: O.quoteId, runId: O.runId, userId: O.userId, version: 1 });

type Watched = 'customers' | 'materials' | 'machines' | 'tools' | 'jobs' | 'users' | 'runs' | 'quotes';
/** One row as stored (any of the watched tables), for before/after comparison. */
async function snapshot(table: Watched, id: number): Promise<Record<string, unknown> & { shopId: number }> {
  const [row] = await t.db.select().from(s[table] as typeof s.users).where(eq((s[table] as typeof s.users).id, id));
  return row as unknown as Record<string, unknown> & { shopId: number };
}

/** The rows of shop O that a write could touch, to compare before and after the sweep. */
async function shopOState() {
  return {
    customer: await snapshot('customers', O.customerId),
    material: await snapshot('materials', O.materialId),
    machine: await snapshot('machines', O.machineId),
    tool: await snapshot('tools', O.toolId),
    job: await snapshot('jobs', O.jobId),
    user: await snapshot('users', O.userId),
    run: await snapshot('runs', O.runId),
    quote: await snapshot('quotes', O.quoteId),
    counts: {
      tools: (await t.db.select().from(s.tools).where(eq(s.tools.shopId, O.shopId))).length,
      programs: (await t.db.select().from(s.programs).where(eq(s.programs.shopId, O.shopId))).length,
      runs: (await t.db.select().from(s.runs).where(eq(s.runs.shopId, O.shopId))).length,
      quotes: (await t.db.select().from(s.quotes).where(eq(s.quotes.shopId, O.shopId))).length,
      users: (await t.db.select().from(s.users).where(eq(s.users.shopId, O.shopId))).length,
      machineVersions: (await t.db.select().from(s.machineVersions).where(eq(s.machineVersions.shopId, O.shopId))).length,
    },
  };
}

beforeAll(async () => {
  server = await startAppServer();
  t = connectTestDb();
  await removeSweepShops();
  await createShops();
  for (const role of ROLES) {
    const result = await signInOverHttp(`${role}@sweep-s.example`, DEMO_PASSWORD);
    expect(result.signedIn, `${role} signs in`).toBe(true);
    jar[role] = result.jar;
  }
}, 120_000);

afterAll(async () => {
  if (t) {
    await removeSweepShops();
    await t.close();
  }
  await server?.stop();
});

// --- every write route × every role, with another shop's ids ---------------------------------

const WRITE_ROUTES = Object.entries(ROUTE_SPECS)
  .filter(([key, spec]) => !key.startsWith('GET ') && spec.action !== PUBLIC && spec.action !== OWN_PASSWORD)
  .map(([key, spec]) => ({ key, method: key.split(' ')[0], route: key.split(' ')[1], spec, action: spec.action as Action }));

/** Routes without an id in the path: what the allowed roles send, aimed at the caller's own shop where the body names rows. */
const OWN_BODIES: Record<string, (role: Role) => unknown> = {
  'POST /api/customers': (role) => ({ name: `Sweep customer by ${role}`, email: `${role}@sweep-customer.example` }),
  'POST /api/jobs': (role) => ({ ...(ROUTE_SPECS['POST /api/jobs'].body as object), title: `Sweep job by ${role}`, customerId: S.customerId, materialId: S.materialId, machineId: S.machineId }),
  'POST /api/machines': (role) => ({ ...(ROUTE_SPECS['POST /api/machines'].body as object), name: `Sweep machine by ${role}` }),
  'POST /api/materials': (role) => ({ ...(ROUTE_SPECS['POST /api/materials'].body as object), name: `Sweep material by ${role}` }),
  'POST /api/users': (role) => ({ ...(ROUTE_SPECS['POST /api/users'].body as object), email: `made-by-${role}@sweep-s.example`, shopId: O.shopId }),
  'PATCH /api/shop': () => ({ lengthUnit: 'mm' }),
  'PUT /api/shop/settings': () => ROUTE_SPECS['PUT /api/shop/settings'].body,
};
/** Routes without an id in the path whose body names another shop's program and machine: 404 past the guard. */
const OTHER_BODIES: Record<string, () => unknown> = {
  'POST /api/runs': () => ({ programId: O.programId, version: 1, machineId: O.machineId }),
  'POST /api/runs/manual': () => ({ ...(ROUTE_SPECS['POST /api/runs/manual'].body as object), programId: O.programId, version: 1, machineId: O.machineId }),
};
/** The table of what an allowed role makes through an id-less route: the row's shop is checked. */
const MADE_ROW: Record<string, (body: { status: number; body: Record<string, { id: number }> }) => Promise<number | undefined>> = {
  'POST /api/customers': async (a) => (await snapshot('customers', a.body.customer.id))?.shopId,
  'POST /api/jobs': async (a) => (await snapshot('jobs', a.body.job.id))?.shopId,
  'POST /api/machines': async (a) => (await snapshot('machines', a.body.machine.id))?.shopId,
  'POST /api/materials': async (a) => (await snapshot('materials', a.body.material.id))?.shopId,
  'POST /api/users': async (a) => (await snapshot('users', a.body.user.id))?.shopId,
};

describe('every write route × every role, aimed at another shop', () => {
  let before: Awaited<ReturnType<typeof shopOState>>;
  beforeAll(async () => {
    before = await shopOState();
  });

  it('sweeps every non-GET route of the specs (a new write route joins the sweep)', () => {
    // counted when this test was written: 31 write handlers besides the public and own-password ones
    expect(WRITE_ROUTES.length).toBeGreaterThanOrEqual(31);
    for (const r of WRITE_ROUTES) {
      const idLess = !r.route.includes('[');
      if (idLess) expect(r.key in OWN_BODIES || r.key in OTHER_BODIES, `${r.key} has a body for the sweep`).toBe(true);
    }
  });

  for (const r of WRITE_ROUTES) {
    for (const role of ROLES) {
      const may = canDo(role, r.action);
      const idLess = !r.route.includes('[');
      const own = idLess && r.key in OWN_BODIES;
      const expected = !may ? `403 forbidden:${subject(r.action)}` : own ? 'success in its own shop' : '404 (past the guard, not its shop)';
      it(`${r.key} as ${role} (${r.action}): ${expected}`, async () => {
        const url = fill(r.route, otherIds());
        const body = own ? OWN_BODIES[r.key](role) : idLess ? OTHER_BODIES[r.key]() : (r.spec.body ?? {});
        const answer = await callApi<{ error?: { code: string; message: string } } & Record<string, { id: number }>>(jar[role], r.method, url, body);
        if (!may) {
          expect(answer.status, JSON.stringify(answer.body)).toBe(403);
          expect(answer.body.error).toEqual({ code: `forbidden:${subject(r.action)}`, message: ROLE_MESSAGE });
        } else if (own) {
          expect(answer.status, JSON.stringify(answer.body)).toBeGreaterThanOrEqual(200);
          expect(answer.status, JSON.stringify(answer.body)).toBeLessThan(300);
          if (MADE_ROW[r.key]) expect(await MADE_ROW[r.key](answer), 'the new row belongs to the caller’s shop').toBe(S.shopId);
        } else {
          expect(answer.status, JSON.stringify(answer.body)).toBe(404);
          expect(answer.body.error?.code).toMatch(/^not-found:/);
        }
      });
    }
  }

  it("leaves every row of the other shop as it was, and adds none", async () => {
    expect(await shopOState()).toEqual(before);
  });
});

// --- own-shop writes × every role: 403 and unchanged, or success -----------------------------

interface OwnCell {
  key: string;
  action: Action;
  /** fresh target ids (a row to delete is made per call) */
  target: () => Promise<Record<string, number>>;
  body?: (role: Role) => unknown;
  /** the row the write touches, read before and after */
  read: (ids: Record<string, number>) => Promise<unknown>;
}

const freshMaterial = async () => {
  const [{ id }] = await t.db.insert(s.materials).values({ shopId: S.shopId, name: `Sweep spare sheet ${Math.random()}`, thicknessMm: 3, sheetWidthMm: 600, sheetLengthMm: 900, costPerSheetMinor: 900 }).$returningId();
  return { materialId: id };
};
const freshTool = async () => {
  const number = 10 + Math.floor(Math.random() * 80);
  await t.db.delete(s.tools).where(and(eq(s.tools.number, number), eq(s.tools.machineId, S.machineId)));
  const [{ id }] = await t.db.insert(s.tools).values({ shopId: S.shopId, machineId: S.machineId, number, diameterMm: 3, flutes: 1, kind: 'downcut' }).$returningId();
  return { machineId: S.machineId, toolId: id };
};

const OWN_CELLS: OwnCell[] = [
  { key: 'PATCH /api/customers/[customerId]', action: 'customers:write', target: async () => ({ customerId: S.customerId }), body: (role) => ({ name: `S Customer (${role})` }), read: (ids) => snapshot('customers', ids.customerId) },
  { key: 'PUT /api/jobs/[jobId]', action: 'jobs:write', target: async () => ({ jobId: S.jobId }), body: (role) => ({ ...(ROUTE_SPECS['PUT /api/jobs/[jobId]'].body as object), title: `S job (${role})`, customerId: S.customerId, materialId: S.materialId, machineId: S.machineId }), read: (ids) => snapshot('jobs', ids.jobId) },
  { key: 'PATCH /api/materials/[materialId]', action: 'materials:write', target: async () => ({ materialId: S.materialId }), body: () => ({ costPerSheetMinor: 6000 + Math.floor(Math.random() * 999) }), read: (ids) => snapshot('materials', ids.materialId) },
  { key: 'DELETE /api/materials/[materialId]', action: 'materials:write', target: freshMaterial, read: (ids) => snapshot('materials', ids.materialId) },
  { key: 'PATCH /api/machines/[machineId]', action: 'machines:write', target: async () => ({ machineId: S.machineId }), body: () => ({ cornerToleranceMm: Number((0.01 + Math.random() / 10).toFixed(3)) }), read: (ids) => snapshot('machines', ids.machineId) },
  { key: 'PATCH /api/machines/[machineId]/tools/[toolId]', action: 'machines:write', target: async () => ({ machineId: S.machineId, toolId: S.toolId }), body: () => ({ diameterMm: Number((5 + Math.random()).toFixed(2)) }), read: (ids) => snapshot('tools', ids.toolId) },
  { key: 'DELETE /api/machines/[machineId]/tools/[toolId]', action: 'machines:write', target: freshTool, read: (ids) => snapshot('tools', ids.toolId) },
  { key: 'PATCH /api/users/[userId]', action: 'users:write', target: async () => ({ userId: S.spareUserId }), body: () => ({ role: 'estimator' }), read: (ids) => snapshot('users', ids.userId) },
];

describe('own-shop writes × every role', () => {
  for (const cell of OWN_CELLS) {
    for (const role of ROLES) {
      const may = canDo(role, cell.action);
      it(`${cell.key} as ${role}: ${may ? 'succeeds and changes the row' : '403, the row unchanged'}`, async () => {
        const ids = await cell.target();
        // the spare user starts each call as an operator, so the change to estimator shows
        if (cell.key.startsWith('PATCH /api/users')) await t.db.update(s.users).set({ role: 'operator' }).where(eq(s.users.id, ids.userId));
        const before = await cell.read(ids);
        const [method, route] = cell.key.split(' ');
        const answer = await callApi(jar[role], method, fill(route, ids), cell.body?.(role));
        if (may) {
          expect(answer.status, JSON.stringify(answer.body)).toBeGreaterThanOrEqual(200);
          expect(answer.status, JSON.stringify(answer.body)).toBeLessThan(300);
          expect(await cell.read(ids), 'the row changed (or is gone)').not.toEqual(before);
        } else {
          expect(answer.status, JSON.stringify(answer.body)).toBe(403);
          expect(await cell.read(ids)).toEqual(before);
        }
      });
    }
  }
});

// --- the job status steps × every role -------------------------------------------------------

describe('each job status step × every role (the step names its action in lib/auth/roles.ts)', () => {
  for (const move of STATUS_MOVES) {
    for (const role of ROLES) {
      const may = canDo(role, move.action);
      it(`${move.from[0]} → ${move.to} as ${role} (${move.action}): ${may ? '200, moved' : '403, unmoved'}`, async () => {
        await t.db.update(s.jobs).set({ status: move.from[0] }).where(eq(s.jobs.id, S.jobId));
        const answer = await callApi<{ job?: { status: string }; error?: { code: string } }>(jar[role], 'PATCH', `/api/jobs/${S.jobId}`, { status: move.to });
        const [job] = await t.db.select().from(s.jobs).where(eq(s.jobs.id, S.jobId));
        if (may) {
          expect(answer.status, JSON.stringify(answer.body)).toBe(200);
          expect(job.status).toBe(move.to);
        } else {
          expect(answer.status, JSON.stringify(answer.body)).toBe(403);
          expect(answer.body.error?.code).toBe('forbidden:job');
          expect(job.status).toBe(move.from[0]);
        }
      });
    }
    it(`${move.from[0]} → ${move.to} on another shop's job: 404 for every role, the job unmoved`, async () => {
      for (const role of ROLES) {
        const answer = await callApi<{ error?: { code: string } }>(jar[role], 'PATCH', `/api/jobs/${O.jobId}`, { status: move.to });
        expect(answer.status, role).toBe(404);
        expect(answer.body.error?.code).toBe('not-found:job');
      }
      expect((await snapshot('jobs', O.jobId)).status).toBe('scheduled');
    });
  }
});

// --- server actions over HTTP ----------------------------------------------------------------

interface ManifestEntry { workers: Record<string, unknown>; filename: string; exportedName: string }
const manifest = JSON.parse(readFileSync(path.join(ROOT, '.next/server/server-reference-manifest.json'), 'utf8')) as { node: Record<string, ManifestEntry> };
const requireFromRoot = createRequire(path.join(ROOT, 'package.json'));
// React's own encoder of a server action's arguments, as the browser's form submission uses it
const { encodeReply } = requireFromRoot('next/dist/compiled/react-server-dom-webpack/client.edge') as { encodeReply: (v: unknown) => Promise<FormData | string> };

function actionOf(file: string, name: string): { id: string; page: string } {
  const found = Object.entries(manifest.node).find(([, e]) => e.filename === file && e.exportedName === name);
  if (!found) throw new Error(`${file} ${name} is not in the build's server-reference-manifest (rebuild?)`);
  const [id, entry] = found;
  // a page that carries the action; dynamic segments get this shop's ids
  const worker = Object.keys(entry.workers).sort((x, y) => x.split('[').length - y.split('[').length)[0];
  const page = '/' + worker.replace(/^app\//, '').replace(/\/page$/, '').replace(/\([^)]*\)\/?/g, '');
  return { id, page: fill(page, { jobId: S.jobId, machineId: S.machineId, toolId: S.toolId, materialId: S.materialId }).replace(/\/$/, '') || '/' };
}

/** The action's own answer (lib/http/action-state.ts's ActionState) in the flight text, not any text of the page. */
function actionState(text: string): { status: string; message: string } | null {
  const found = /\{"status":"(ok|error)","message":("(?:[^"\\]|\\.)*")/.exec(text);
  return found ? { status: found[1], message: JSON.parse(found[2]) as string } : null;
}

/** Calls a server action the way a form does (POST with Next-Action); the answer's text (React's flight format). */
async function callAction(who: CookieJar, file: string, name: string, form: Record<string, string>): Promise<{ status: number; text: string }> {
  const { id, page } = actionOf(file, name);
  const data = new FormData();
  for (const [k, v] of Object.entries(form)) data.set(k, v);
  const body = await encodeReply([{ status: 'idle' }, data]);
  const response = await fetch(`${server.baseUrl}${page}`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'next-action': id, accept: 'text/x-component', origin: server.baseUrl, cookie: who.header(), ...(typeof body === 'string' ? { 'content-type': 'text/plain;charset=UTF-8' } : {}) },
    body,
  });
  return { status: response.status, text: await response.text() };
}

const USERS_ACTIONS = 'app/(shop)/admin/users/actions.ts';

describe('server actions over HTTP', () => {
  it('the positive control: the admin changes the role of a user of its own shop', async () => {
    await t.db.update(s.users).set({ role: 'operator' }).where(eq(s.users.id, S.spareUserId));
    const answer = await callAction(jar.admin, USERS_ACTIONS, 'changeRoleAction', { userId: String(S.spareUserId), role: 'programmer' });
    expect(actionState(answer.text)).toEqual({ status: 'ok', message: 'Sweep spare is now a programmer.' });
    expect((await snapshot('users', S.spareUserId)).role).toBe('programmer');
  });

  it("change role, disable and one-time password with another shop's user id: \"No such user.\", that user untouched", async () => {
    const before = await snapshot('users', O.userId);
    const sessionsBefore = await t.db.select().from(s.userSessions).where(eq(s.userSessions.userId, O.userId));
    for (const [name, form] of [
      ['changeRoleAction', { role: 'operator' }],
      ['setDisabledAction', { disabled: 'true' }],
      ['setOneTimePasswordAction', { oneTimePassword: 'a one-time pass phrase 4' }],
    ] as const) {
      const answer = await callAction(jar.admin, USERS_ACTIONS, name, { userId: String(O.userId), ...form });
      expect(actionState(answer.text), name).toEqual({ status: 'error', message: 'No such user.' });
    }
    expect(await snapshot('users', O.userId)).toEqual(before);
    expect(await t.db.select().from(s.userSessions).where(eq(s.userSessions.userId, O.userId))).toEqual(sessionsBefore);
  });

  it('createUserAction: the new user lands in the admin’s shop, whatever shop id the form carries', async () => {
    const answer = await callAction(jar.admin, USERS_ACTIONS, 'createUserAction', { name: 'Form made', email: 'form-made@sweep-s.example', role: 'operator', password: 'a long pass phrase 7', shopId: String(O.shopId) });
    expect(actionState(answer.text)).toEqual({ status: 'ok', message: 'Form made can now sign in as form-made@sweep-s.example.' });
    const rows = await t.db.select().from(s.users).where(eq(s.users.email, 'form-made@sweep-s.example'));
    expect(rows.map((r) => r.shopId)).toEqual([S.shopId]);
  });

  it('POST /api/users: the new user lands in the admin’s shop, whatever shop id the body carries', async () => {
    const answer = await callApi<{ user: { id: number } }>(jar.admin, 'POST', '/api/users', { name: 'Api made', email: 'api-made@sweep-s.example', role: 'estimator', password: 'a long pass phrase 7', shopId: O.shopId });
    expect(answer.status).toBe(201);
    expect((await snapshot('users', answer.body.user.id)).shopId).toBe(S.shopId);
    expect(await t.db.select().from(s.users).where(eq(s.users.email, 'api-made@sweep-s.example'))).toHaveLength(1);
  });

  // every action by every role its action refuses: the role message and nothing changed
  const cells = Object.entries(ACTION_SPECS).flatMap(([key, spec]) =>
    spec.action === OWN_PASSWORD ? [] : ROLES.filter((role) => !canDo(role, spec.action as Action)).map((role) => ({ key, spec, role })),
  );
  it('covers every action some role is refused (a new action joins)', () => {
    expect(new Set(cells.map((c) => c.key)).size).toBeGreaterThanOrEqual(17);
  });
  for (const { key, spec, role } of cells) {
    it(`${key} by ${role} (${spec.action}, held by ${ACTIONS[spec.action as Action].join(', ')}): refused with the role message, nothing changed`, async () => {
      const [file, name] = key.split(' ');
      const form = { ...spec.form };
      if ('userId' in form) form.userId = String(S.spareUserId);
      if ('machineId' in form) form.machineId = String(S.machineId);
      if ('toolId' in form) form.toolId = String(S.toolId);
      if ('materialId' in form) form.materialId = String(S.materialId);
      if ('jobId' in form) form.jobId = String(S.jobId);
      const watched = {
        spare: await snapshot('users', S.spareUserId),
        machine: await snapshot('machines', S.machineId),
        tool: await snapshot('tools', S.toolId),
        material: await snapshot('materials', S.materialId),
        job: await snapshot('jobs', S.jobId),
        users: (await t.db.select().from(s.users).where(eq(s.users.shopId, S.shopId))).length,
        customers: (await t.db.select().from(s.customers).where(eq(s.customers.shopId, S.shopId))).length,
        machines: (await t.db.select().from(s.machines).where(eq(s.machines.shopId, S.shopId))).length,
        materials: (await t.db.select().from(s.materials).where(eq(s.materials.shopId, S.shopId))).length,
        jobs: (await t.db.select().from(s.jobs).where(eq(s.jobs.shopId, S.shopId))).length,
        shop: (await t.db.select().from(s.shops).where(eq(s.shops.id, S.shopId)))[0],
      };
      const answer = await callAction(jar[role], file, name, form);
      expect(actionState(answer.text), `status ${answer.status}: ${answer.text.slice(0, 300)}`).toEqual({ status: 'error', message: ROLE_MESSAGE });
      expect({
        spare: await snapshot('users', S.spareUserId),
        machine: await snapshot('machines', S.machineId),
        tool: await snapshot('tools', S.toolId),
        material: await snapshot('materials', S.materialId),
        job: await snapshot('jobs', S.jobId),
        users: (await t.db.select().from(s.users).where(eq(s.users.shopId, S.shopId))).length,
        customers: (await t.db.select().from(s.customers).where(eq(s.customers.shopId, S.shopId))).length,
        machines: (await t.db.select().from(s.machines).where(eq(s.machines.shopId, S.shopId))).length,
        materials: (await t.db.select().from(s.materials).where(eq(s.materials.shopId, S.shopId))).length,
        jobs: (await t.db.select().from(s.jobs).where(eq(s.jobs.shopId, S.shopId))).length,
        shop: (await t.db.select().from(s.shops).where(eq(s.shops.id, S.shopId)))[0],
      }).toEqual(watched);
    });
  }
});


// --- requireRole / currentUser read the user row on every request ----------------------------

describe('requireRole and currentUser judge each request by the user row as it is now, not as it was at sign-in', () => {
  // The admin's paths (PATCH /api/users, the users page) also end the user's sessions
  // (tests/integration/app-security-sessions.test.ts); here the row changes under a live
  // session row, so only the guard's own reading of the user (db/queries/sessions.ts
  // readLiveSession, through next-auth's session callback) can notice.
  let changing: CookieJar;
  beforeAll(async () => {
    const result = await signInOverHttp('changing@sweep-s.example', DEMO_PASSWORD);
    expect(result.signedIn).toBe(true);
    changing = result.jar;
  });

  it('a changed role counts at the next request: the operator made estimator reads customers, and may no longer log runs', async () => {
    expect((await callApi<{ error: { code: string } }>(changing, 'GET', '/api/customers')).body.error.code).toBe('forbidden:customer');
    await t.db.update(s.users).set({ role: 'estimator' }).where(eq(s.users.id, S.changingUserId));
    expect((await callApi(changing, 'GET', '/api/customers')).status).toBe(200);
    const run = await callApi<{ error: { code: string } }>(changing, 'POST', '/api/runs', { programId: O.programId, version: 1, machineId: O.machineId });
    expect([run.status, run.body.error.code]).toEqual([403, 'forbidden:run']);
    const session = await callApi<{ user?: { role: string } }>(changing, 'GET', '/api/auth/session');
    expect(session.body.user?.role).toBe('estimator');
  });

  it('a disabled user is signed out at the next request, though the session row was never ended', async () => {
    expect((await callApi(changing, 'GET', '/api/jobs')).status).toBe(200);
    await t.db.update(s.users).set({ disabled: true }).where(eq(s.users.id, S.changingUserId));
    const [open] = await t.db.select().from(s.userSessions).where(eq(s.userSessions.userId, S.changingUserId));
    expect(open.endedAt).toBeNull();
    const answer = await callApi<{ error: { code: string } }>(changing, 'GET', '/api/jobs');
    expect([answer.status, answer.body.error.code]).toEqual([401, 'unauthorized']);
    expect((await callApi<{ user?: unknown }>(changing, 'GET', '/api/auth/session')).body.user).toBeUndefined();
    const action = await callAction(changing, 'app/(shop)/customers/actions.ts', 'createCustomerAction', { name: 'After disable', email: 'after-disable@sweep.example' });
    expect(actionState(action.text)).toEqual({ status: 'error', message: 'Sign in to continue.' });
    expect(await t.db.select().from(s.customers).where(eq(s.customers.name, 'After disable'))).toEqual([]);
  });

  it('a user whose row now belongs to another shop is signed out (the token names the shop it was issued for)', async () => {
    // control: enabled again in place (not by the admin's path, which ends sessions), the row reads again
    await t.db.update(s.users).set({ disabled: false }).where(eq(s.users.id, S.changingUserId));
    expect((await callApi(changing, 'GET', '/api/jobs')).status).toBe(200);
    await t.db.update(s.users).set({ shopId: O.shopId }).where(eq(s.users.id, S.changingUserId));
    const answer = await callApi<{ error: { code: string } }>(changing, 'GET', '/api/jobs');
    expect(answer.status).toBe(401);
  });
});
