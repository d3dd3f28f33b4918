// The committed SQL migrations build the schema of db/schema.ts from an empty database
// on the real MariaDB, record themselves the way drizzle-orm's migrator documents
// (one __drizzle_migrations row per journal entry: sha256 of the SQL file, the entry's
// `when` as created_at), and a second run applies nothing. The demo seed is run twice on
// the same scratch database to show it is idempotent.
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getTableConfig, MySqlTable } from 'drizzle-orm/mysql-core';
import { is } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/mysql2';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import * as schema from '@/db/schema';
import { migrationsFolder, runMigrations } from '@/db/migrate';
import { seed } from '@/db/seed';
import { DEMO_PASSWORD, demoMachines } from '@/db/seed-data';
import { parseMachineProfile } from '@/lib/validation/machine-profile';
import bcrypt from 'bcryptjs';
import { connectTestDb, createScratchDatabase, type ScratchDatabase } from './support/db';

const journal = JSON.parse(fs.readFileSync(path.join(migrationsFolder, 'meta', '_journal.json'), 'utf8')) as {
  entries: { tag: string; when: number }[];
};

const fixturesDir = path.resolve(migrationsFolder, '..', '..', 'fixtures', 'machines');

const tables = (Object.values(schema) as unknown[])
  .filter((v): v is MySqlTable => is(v, MySqlTable))
  .map((t) => getTableConfig(t));

describe('migrations on an empty database', () => {
  let scratch: ScratchDatabase;
  let conn: mysql.Connection;
  let firstRun: string[];

  beforeAll(async () => {
    scratch = await createScratchDatabase();
    firstRun = await runMigrations(scratch.url);
    conn = await mysql.createConnection({ uri: scratch.url });
  });

  afterAll(async () => {
    await conn?.end();
    await scratch?.drop();
  });

  it('applies every journal entry, in order', () => {
    expect(journal.entries.length).toBeGreaterThan(0);
    expect(firstRun).toEqual(journal.entries.map((e) => e.tag));
  });

  it('creates exactly the tables of db/schema.ts plus the migration log', async () => {
    const [rows] = await conn.query('SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE()');
    const names = (rows as { name: string }[]).map((r) => r.name).sort();
    // shops, users, machines, machine_versions, tools, materials, customers, jobs,
    // programs, program_versions, estimates, job_events, user_sessions, sign_in_limits
    expect(tables.length).toBe(21);
    expect(names).toEqual([...tables.map((t) => t.name), '__drizzle_migrations'].sort());
  });

  it('gives every table the columns the schema declares', async () => {
    for (const t of tables) {
      const [rows] = await conn.query(
        'SELECT column_name AS name FROM information_schema.columns WHERE table_schema = DATABASE() AND table_name = ?',
        [t.name],
      );
      const actual = (rows as { name: string }[]).map((r) => r.name).sort();
      expect(actual, t.name).toEqual(t.columns.map((c) => c.name).sort());
    }
  });

  it('records each migration with the sha256 of its SQL and its journal time', async () => {
    const [rows] = await conn.query('SELECT hash, created_at FROM `__drizzle_migrations` ORDER BY id');
    const expected = journal.entries.map((e) => ({
      hash: createHash('sha256').update(fs.readFileSync(path.join(migrationsFolder, `${e.tag}.sql`), 'utf8')).digest('hex'),
      created_at: String(e.when),
    }));
    expect((rows as { hash: string; created_at: unknown }[]).map((r) => ({ hash: r.hash, created_at: String(r.created_at) }))).toEqual(
      expected,
    );
  });

  it('enforces the e-mail unique per shop and the shop foreign key', async () => {
    await conn.query("INSERT INTO shops (name, slug) VALUES ('Scratch shop', 'scratch'), ('Scratch shop 2', 'scratch-2')");
    const [[shop, other]] = (await conn.query("SELECT id FROM shops WHERE slug LIKE 'scratch%' ORDER BY slug")) as unknown as [{ id: number }[]];
    const user = (email: string, shopId: number) =>
      conn.query("INSERT INTO users (shop_id, email, name, password_hash, role) VALUES (?, ?, 'Test', 'x', 'operator')", [shopId, email]);
    await user('one@scratch.example', shop.id);
    await expect(user('one@scratch.example', shop.id)).rejects.toMatchObject({ code: 'ER_DUP_ENTRY' });
    // issue 18 finding 9: the same address may have an account in another shop
    await expect(user('one@scratch.example', other.id)).resolves.toBeDefined();
    await expect(user('two@scratch.example', shop.id + 999)).rejects.toMatchObject({ code: 'ER_NO_REFERENCED_ROW_2' });
  });

  it('takes the demo seed twice without duplicating a row', async () => {
    const counts = async () => {
      const out: Record<string, number> = {};
      for (const t of tables) {
        const [rows] = await conn.query(`SELECT COUNT(*) AS n FROM \`${t.name}\``);
        out[t.name] = Number((rows as { n: number }[])[0].n);
      }
      return out;
    };
    await conn.query('DELETE FROM users');
    await conn.query("DELETE FROM shops WHERE slug LIKE 'scratch%'");
    const handle = connectTestDb(scratch.url);
    try {
      await seed(handle.db);
      const once = await counts();
      await seed(handle.db);
      expect(await counts()).toEqual(once);
      // CONVENTIONS.md demo scenario: one shop, a user per role, 2 machines, 3 materials, 2 customers, 3 jobs and the 2 dated ones of db/seed-week.ts
      expect(once).toMatchObject({ shops: 1, users: 4, machines: 2, machine_versions: 2, materials: 3, customers: 2, jobs: 5 });
    } finally {
      await handle.close();
    }
  });

  it('stores bcrypt hashes of the demo password and valid machine profile snapshots', async () => {
    const [users] = await conn.query('SELECT email, password_hash AS hash FROM users ORDER BY email');
    for (const u of users as { email: string; hash: string }[]) {
      // bcrypt modular crypt format: $2a$/$2b$, cost 10
      expect(u.hash, u.email).toMatch(/^\$2[ab]\$10\$/);
      expect(await bcrypt.compare(DEMO_PASSWORD, u.hash), u.email).toBe(true);
    }
    const [versions] = await conn.query(
      'SELECT m.name, v.profile FROM machine_versions v JOIN machines m ON m.id = v.machine_id ORDER BY m.name',
    );
    const rows = versions as { name: string; profile: unknown }[];
    expect(rows).toHaveLength(demoMachines.length);
    for (const m of demoMachines) {
      const fixture = JSON.parse(fs.readFileSync(path.join(fixturesDir, m.fixture), 'utf8')) as { name: string };
      const row = rows.find((r) => r.name === fixture.name);
      // mysql2 parses MariaDB's JSON (a LONGTEXT marked json) itself on some versions
      const profile: unknown = typeof row?.profile === 'string' ? JSON.parse(row.profile) : row?.profile;
      expect(parseMachineProfile(profile).ok, m.fixture).toBe(true);
      expect(profile, m.fixture).toEqual(fixture);
    }
  });

  it('applies nothing on a second run', async () => {
    expect(await runMigrations(scratch.url)).toEqual([]);
    const [rows] = await conn.query('SELECT COUNT(*) AS n FROM `__drizzle_migrations`');
    expect(Number((rows as { n: number }[])[0].n)).toBe(journal.entries.length);
  });
});

// 0001 renames three machine columns and the keys of stored profile snapshots; a shop's
// data written under 0000 must come through it unchanged apart from the names. The names
// before 0001 are read from the migration itself (its snapshot's rename record and its SQL),
// since applied migrations are the only place they are still kept.
const renamedColumns = (() => {
  const snapshot = JSON.parse(fs.readFileSync(path.join(migrationsFolder, 'meta', '0001_snapshot.json'), 'utf8')) as {
    _meta: { columns: Record<string, string> };
  };
  const column = (quoted: string) => quoted.split('.')[1].replace(/"/g, '');
  return new Map(Object.entries(snapshot._meta.columns).map(([from, to]) => [column(to), column(from)]));
})();
const renamedKeys = (() => {
  const sql = fs.readFileSync(path.join(migrationsFolder, '0001_machine-profile-names.sql'), 'utf8');
  return new Map([...sql.matchAll(/'"(\w+)"\[\[:space:\]\]\*:', '"(\w+)":'/g)].map((m) => [m[2], m[1]]));
})();

/** The same object with each key named as it was before 0001. */
function withOldKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(withOldKeys);
  if (value && typeof value === 'object')
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [renamedKeys.get(k) ?? k, withOldKeys(v)]));
  return value;
}

describe('migration 0001 (machine profile names) on a database at 0000', () => {
  let scratch: ScratchDatabase;
  let conn: mysql.Connection;
  let onlyInit: string;

  beforeAll(async () => {
    scratch = await createScratchDatabase();
    conn = await mysql.createConnection({ uri: scratch.url });
    // a migrations folder holding 0000 alone, so the database stops where a shop's would have
    onlyInit = fs.mkdtempSync(path.join(os.tmpdir(), 'kerfcast-0000-'));
    fs.mkdirSync(path.join(onlyInit, 'meta'));
    fs.copyFileSync(path.join(migrationsFolder, '0000_init.sql'), path.join(onlyInit, '0000_init.sql'));
    fs.writeFileSync(
      path.join(onlyInit, 'meta', '_journal.json'),
      JSON.stringify({ ...journal, entries: journal.entries.filter((e) => e.tag === '0000_init') }),
    );
    await migrate(drizzle(conn), { migrationsFolder: onlyInit });
  });

  afterAll(async () => {
    await conn?.end();
    await scratch?.drop();
    if (onlyInit) fs.rmSync(onlyInit, { recursive: true, force: true });
  });

  it('records the renames of the three columns and the ten profile keys', () => {
    expect([...renamedColumns.keys()].sort()).toEqual(['chord_tolerance_mm', 'corner_tolerance_mm', 'max_blocks_per_s']);
    expect([...renamedKeys.keys()].sort()).toEqual(
      ['accelMmPerS2', 'chordToleranceMm', 'cornerToleranceMm', 'diameterMm', 'homeMm', 'lookaheadBlocks', 'maxBlocksPerS',
        'maxFeedMmPerMin', 'rapidMmPerMin', 'travelMm'].sort(),
    );
    for (const [to, from] of [...renamedColumns, ...renamedKeys]) expect(from, to).not.toBe(to);
  });

  it('keeps every machine value and rewrites only the snapshot key names', async () => {
    await conn.query("INSERT INTO shops (name, slug) VALUES ('Scratch shop', 'scratch')");
    const [[shop]] = (await conn.query("SELECT id FROM shops WHERE slug = 'scratch'")) as unknown as [{ id: number }[]];
    const old = (column: string) => `\`${renamedColumns.get(column)}\``;
    await conn.query(
      `INSERT INTO machines (shop_id, name, travel_x_mm, travel_y_mm, travel_z_mm, max_feed_x_mm_per_min, max_feed_y_mm_per_min,
         max_feed_z_mm_per_min, rapid_x_mm_per_min, rapid_y_mm_per_min, rapid_z_mm_per_min, accel_x_mm_per_s2, accel_y_mm_per_s2,
         accel_z_mm_per_s2, ${old('corner_tolerance_mm')}, lookahead_blocks, ${old('max_blocks_per_s')}, ${old('chord_tolerance_mm')},
         tool_change_s, spindle_spin_up_s)
       VALUES (?, 'Old router', 2500, 1250, 150, 15000, 15000, 5000, 20000, 20000, 8000, 800, 800, 400, 0.017, 32, 450, 0.004, 20, 4)`,
      [shop.id],
    );
    const [[machine]] = (await conn.query('SELECT id FROM machines')) as unknown as [{ id: number }[]];
    // the name spells an old key inside a string value: values must come through untouched
    const expected = {
      name: 'Old router "travel": "diameter" : test',
      travelMm: { x: 2500, y: 1250, z: 150 },
      homeMm: { x: 0, y: 0, z: 0 },
      maxFeedMmPerMin: { x: 15000, y: 15000, z: 5000 },
      rapidMmPerMin: { x: 20000, y: 20000, z: 8000 },
      accelMmPerS2: { x: 800, y: 800, z: 400 },
      cornerToleranceMm: 0.017,
      lookaheadBlocks: 32,
      maxBlocksPerS: 450,
      chordToleranceMm: 0.004,
      toolChangeSeconds: 20,
      spindleSpinUpSeconds: 4,
      timeFactor: 1,
      tools: [
        { number: 1, diameterMm: 6, flutes: 2, kind: 'upcut' },
        { number: 2, diameterMm: 3.175, flutes: 1, kind: 'v' },
      ],
    };
    // written as the code before 0001 wrote it (JSON.stringify of the old keys)
    await conn.query('INSERT INTO machine_versions (shop_id, machine_id, version, profile) VALUES (?, ?, 1, ?)', [
      shop.id,
      machine.id,
      JSON.stringify(withOldKeys(expected)),
    ]);

    expect(await runMigrations(scratch.url)).toEqual(journal.entries.filter((e) => e.tag !== '0000_init').map((e) => e.tag));

    const [[row]] = (await conn.query(
      'SELECT corner_tolerance_mm AS c, lookahead_blocks AS l, max_blocks_per_s AS b, chord_tolerance_mm AS a FROM machines',
    )) as unknown as [{ c: number; l: number; b: number; a: number }[]];
    expect(row).toEqual({ c: 0.017, l: 32, b: 450, a: 0.004 });
    const [[version]] = (await conn.query('SELECT profile FROM machine_versions')) as unknown as [{ profile: unknown }[]];
    const profile: unknown = typeof version.profile === 'string' ? JSON.parse(version.profile) : version.profile;
    expect(profile).toEqual(expected);
  });
});

// 0005 gives jobs made before jobs named their machine the shop's first machine (issue 12:
// "a job names its machine … default the shop's first machine"): the unarchived one with the
// lowest id; a job that names one keeps it; a shop with no machine leaves its jobs without.
describe('migration 0005 (a machine for every job) on a database at 0004', () => {
  let scratch: ScratchDatabase;
  let conn: mysql.Connection;
  let upTo0004: string;

  beforeAll(async () => {
    scratch = await createScratchDatabase();
    conn = await mysql.createConnection({ uri: scratch.url });
    upTo0004 = fs.mkdtempSync(path.join(os.tmpdir(), 'kerfcast-0004-'));
    fs.mkdirSync(path.join(upTo0004, 'meta'));
    const entries = journal.entries.filter((e) => Number(e.tag.slice(0, 4)) <= 4);
    for (const e of entries) fs.copyFileSync(path.join(migrationsFolder, `${e.tag}.sql`), path.join(upTo0004, `${e.tag}.sql`));
    fs.writeFileSync(path.join(upTo0004, 'meta', '_journal.json'), JSON.stringify({ ...journal, entries }));
    await migrate(drizzle(conn), { migrationsFolder: upTo0004 });
  });

  afterAll(async () => {
    await conn?.end();
    await scratch?.drop();
    if (upTo0004) fs.rmSync(upTo0004, { recursive: true, force: true });
  });

  it('sets the first unarchived machine of the job\'s own shop, and nothing else', async () => {
    const machineSql = `INSERT INTO machines (shop_id, name, travel_x_mm, travel_y_mm, travel_z_mm, max_feed_x_mm_per_min, max_feed_y_mm_per_min,
         max_feed_z_mm_per_min, rapid_x_mm_per_min, rapid_y_mm_per_min, rapid_z_mm_per_min, accel_x_mm_per_s2, accel_y_mm_per_s2,
         accel_z_mm_per_s2, corner_tolerance_mm, lookahead_blocks, max_blocks_per_s, chord_tolerance_mm, tool_change_s, spindle_spin_up_s, archived_at)
       VALUES (?, ?, 2500, 1250, 150, 15000, 15000, 5000, 20000, 20000, 8000, 800, 800, 400, 0.015, 32, 450, 0.003, 20, 4, ?)`;
    const id = async (query: string, params: unknown[]) => ((await conn.query(query, params)) as unknown as [{ insertId: number }])[0].insertId;
    const shopA = await id("INSERT INTO shops (name, slug) VALUES ('Shop A', 'shop-a')", []);
    const shopB = await id("INSERT INTO shops (name, slug) VALUES ('Shop B', 'shop-b')", []);
    const shopC = await id("INSERT INTO shops (name, slug) VALUES ('Shop C', 'shop-c')", []);
    const archived = await id(machineSql, [shopA, 'Old router', new Date()]);
    const first = await id(machineSql, [shopA, 'Router A1', null]);
    const second = await id(machineSql, [shopA, 'Router A2', null]);
    const other = await id(machineSql, [shopB, 'Router B1', null]);
    expect(archived).toBeLessThan(first);
    const job = async (shop: number, title: string, machine: number | null) => {
      const customer = await id("INSERT INTO customers (shop_id, name, email) VALUES (?, 'Customer', 'c@example.test')", [shop]);
      return id(
        `INSERT INTO jobs (shop_id, title, customer_id, sheet_width_mm, sheet_length_mm, sheet_thickness_mm, hold_down, quantity, machine_id)
         VALUES (?, ?, ?, 1220, 2440, 18, 'vacuum', 1, ?)`,
        [shop, title, customer, machine],
      );
    };
    const none = await job(shopA, 'no machine yet', null);
    const named = await job(shopA, 'already on A2', second);
    const inB = await job(shopB, 'shop B, no machine', null);
    const inC = await job(shopC, 'shop without machines', null);

    await conn.query("UPDATE jobs SET updated_at = '2026-01-02 03:04:05'");
    expect(await runMigrations(scratch.url)).toEqual(journal.entries.filter((e) => Number(e.tag.slice(0, 4)) > 4).map((e) => e.tag));
    const [rows] = (await conn.query('SELECT id, machine_id AS machineId FROM jobs ORDER BY id')) as unknown as [{ id: number; machineId: number | null }[]];
    const [stamps] = (await conn.query("SELECT DATE_FORMAT(updated_at, '%Y-%m-%d %H:%i:%s') AS t FROM jobs")) as unknown as [{ t: string }[]];
    expect(new Set(stamps.map((r) => r.t))).toEqual(new Set(['2026-01-02 03:04:05'])); // naming the default is not an edit
    expect(rows).toEqual([
      { id: none, machineId: first },
      { id: named, machineId: second },
      { id: inB, machineId: other },
      { id: inC, machineId: null },
    ]);
  });
});
