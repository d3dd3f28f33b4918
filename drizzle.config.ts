// drizzle-kit settings: `npm run db:generate` writes SQL migrations from db/schema.ts
// into db/migrations (committed); db/migrate.ts applies them.
import { defineConfig } from 'drizzle-kit';
import { localDatabaseUrl } from './lib/local-secrets';

export default defineConfig({
  dialect: 'mysql',
  schema: './db/schema.ts',
  out: './db/migrations',
  dbCredentials: {
    url: process.env.DATABASE_URL || localDatabaseUrl('kerfcast'),
  },
  strict: true,
  verbose: true,
});
