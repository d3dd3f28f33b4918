// Applies the SQL migrations in db/migrations to DATABASE_URL (default: the local
// kerfcast database) and prints which ones were new. `npm run db:migrate`.
import fs from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { drizzle } from 'drizzle-orm/mysql2';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import { env } from '@/lib/env';

export const migrationsFolder = path.resolve(__dirname, 'migrations');

interface JournalEntry {
  tag: string;
  when: number;
}

/** Runs pending migrations against `url`; returns the tags it applied. */
export async function runMigrations(url: string = env.DATABASE_URL): Promise<string[]> {
  const connection = await mysql.createConnection({ uri: url, multipleStatements: false });
  try {
    const applied = async () => {
      const [rows] = await connection.query(
        "SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = '__drizzle_migrations'",
      );
      if (Number((rows as { n: number }[])[0].n) === 0) return new Set<number>();
      const [done] = await connection.query('SELECT created_at FROM `__drizzle_migrations`');
      return new Set((done as { created_at: string | number }[]).map((r) => Number(r.created_at)));
    };
    const before = await applied();
    await migrate(drizzle(connection), { migrationsFolder });
    const journal = JSON.parse(fs.readFileSync(path.join(migrationsFolder, 'meta', '_journal.json'), 'utf8')) as {
      entries: JournalEntry[];
    };
    return journal.entries.filter((e) => !before.has(e.when)).map((e) => e.tag);
  } finally {
    await connection.end();
  }
}

function describe(url: string): string {
  const u = new URL(url);
  return `${u.hostname}:${u.port || 3306}${u.pathname}`;
}

if (require.main === module) {
  const url = env.DATABASE_URL;
  runMigrations(url)
    .then((tags) => {
      if (tags.length === 0) console.log(`migrate: ${describe(url)} is up to date`);
      else for (const tag of tags) console.log(`migrate: applied ${tag} to ${describe(url)}`);
    })
    .catch((err: unknown) => {
      const message = err instanceof Error ? err.message : String(err);
      console.error(`migrate: failed on ${describe(url)}: ${message}`);
      process.exit(1);
    });
}
