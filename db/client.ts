// The database connection: one mysql2 pool wrapped by Drizzle, cached on globalThis so
// Next's dev reloads do not open a new pool per edit. Free of 'server-only' on purpose:
// scripts run by tsx (migrate, seed, tests) import it too; db/queries/* carry the guard.
import mysql from 'mysql2/promise';
import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2';
import { env } from '@/lib/env';
import * as schema from './schema';

export type Db = MySql2Database<typeof schema>;

const globalForDb = globalThis as unknown as { kerfcastPool?: mysql.Pool; kerfcastDb?: Db };

export function createPool(url: string = env.DATABASE_URL): mysql.Pool {
  return mysql.createPool({
    uri: url,
    connectionLimit: 10,
    // DATETIME/TIMESTAMP values are read and written as UTC.
    timezone: 'Z',
    dateStrings: false,
  });
}

export const pool: mysql.Pool = globalForDb.kerfcastPool ?? createPool();
export const db: Db = globalForDb.kerfcastDb ?? drizzle(pool, { schema, mode: 'default' });

if (env.NODE_ENV !== 'production') {
  globalForDb.kerfcastPool = pool;
  globalForDb.kerfcastDb = db;
}

/** Ends the pool (scripts and tests call it so the process can exit). */
export async function closeDb(): Promise<void> {
  await pool.end();
  if (globalForDb.kerfcastPool === pool) {
    delete globalForDb.kerfcastPool;
    delete globalForDb.kerfcastDb;
  }
}
