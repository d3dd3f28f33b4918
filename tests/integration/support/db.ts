// Database access for integration tests: the `kerfcast_test` database that `npm test`
// migrates and seeds, and throw-away scratch databases for tests that need an empty one.
// Refuses any database whose name does not end in _test or start with kerfcast_scratch_,
// so a stray DATABASE_URL can never point the tests at the development data.
import { randomBytes } from 'node:crypto';
import mysql from 'mysql2/promise';
import { drizzle } from 'drizzle-orm/mysql2';
import * as schema from '@/db/schema';
import type { Db } from '@/db/client';
import { localDatabaseUrl } from '@/lib/local-secrets';

// the install's password from .data/db-password (scripts/services-start.sh)
const fallbackUrl = localDatabaseUrl('kerfcast_test');

export function databaseName(url: string): string {
  return decodeURIComponent(new URL(url).pathname.replace(/^\//, ''));
}

export function withDatabase(url: string, name: string): string {
  const u = new URL(url);
  u.pathname = `/${encodeURIComponent(name)}`;
  return u.toString();
}

function assertTestDatabase(url: string): string {
  const name = databaseName(url);
  if (!/_test$/.test(name) && !name.startsWith('kerfcast_scratch_')) {
    throw new Error(`integration tests refuse database "${name}": use one ending in _test (npm test sets DATABASE_URL)`);
  }
  return url;
}

/** DATABASE_URL when it names a test database (npm test), else the local kerfcast_test. */
export const testDatabaseUrl = assertTestDatabase(
  process.env.DATABASE_URL && databaseName(process.env.DATABASE_URL).endsWith('_test') ? process.env.DATABASE_URL : fallbackUrl,
);

export interface TestDb {
  db: Db;
  pool: mysql.Pool;
  close(): Promise<void>;
}

/** A Drizzle handle on the test database; call close() in afterAll. */
export function connectTestDb(url: string = testDatabaseUrl): TestDb {
  const pool = mysql.createPool({ uri: assertTestDatabase(url), connectionLimit: 4, timezone: 'Z' });
  return { db: drizzle(pool, { schema, mode: 'default' }), pool, close: () => pool.end() };
}

export interface ScratchDatabase {
  name: string;
  url: string;
  drop(): Promise<void>;
}

/** Creates an empty database kerfcast_scratch_<random> (the kerfcast user may create kerfcast% databases). */
export async function createScratchDatabase(): Promise<ScratchDatabase> {
  const name = `kerfcast_scratch_${randomBytes(4).toString('hex')}`;
  const admin = await mysql.createConnection({ uri: withDatabase(testDatabaseUrl, '') });
  try {
    await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  } finally {
    await admin.end();
  }
  return {
    name,
    url: withDatabase(testDatabaseUrl, name),
    async drop() {
      const conn = await mysql.createConnection({ uri: withDatabase(testDatabaseUrl, '') });
      try {
        await conn.query(`DROP DATABASE IF EXISTS \`${name}\``);
      } finally {
        await conn.end();
      }
    },
  };
}
