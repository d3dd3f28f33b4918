// The committed SQL migrations build the schema of db/schema.ts from an empty database
// on the real MariaDB, record themselves the way drizzle-orm's migrator documents
// (one __drizzle_migrations row per journal entry: sha256 of the SQL file, the entry's
// `when` as created_at), and a second run applies nothing. The demo seed is run twice on
// the same scratch database to show it is idempotent.
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getTableConfig, MySqlTable } from 'drizzle-orm/mysql-core';
import { is } from 'drizzle-orm';
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
    expect(tables.length).toBe(8);
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

  it('enforces the unique e-mail and the shop foreign key', async () => {
    await conn.query("INSERT INTO shops (name, slug) VALUES ('Scratch shop', 'scratch')");
    const [[shop]] = (await conn.query("SELECT id FROM shops WHERE slug = 'scratch'")) as unknown as [{ id: number }[]];
    const user = (email: string, shopId: number) =>
      conn.query("INSERT INTO users (shop_id, email, name, password_hash, role) VALUES (?, ?, 'Test', 'x', 'operator')", [shopId, email]);
    await user('one@scratch.example', shop.id);
    await expect(user('one@scratch.example', shop.id)).rejects.toMatchObject({ code: 'ER_DUP_ENTRY' });
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
    await conn.query("DELETE FROM shops WHERE slug = 'scratch'");
    const handle = connectTestDb(scratch.url);
    try {
      await seed(handle.db);
      const once = await counts();
      await seed(handle.db);
      expect(await counts()).toEqual(once);
      // CONVENTIONS.md demo scenario: one shop, a user per role, 2 machines, 3 materials, 2 customers, 3 jobs
      expect(once).toMatchObject({ shops: 1, users: 4, machines: 2, machine_versions: 2, materials: 3, customers: 2, jobs: 3 });
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
