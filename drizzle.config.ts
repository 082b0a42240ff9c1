import { defineConfig } from 'drizzle-kit';

// `npx drizzle-kit generate` diffs schema/ against the last snapshot and writes SQL into
// backend/src/db/migrations (committed). The app applies them at start with drizzle's migrator.
export default defineConfig({
  dialect: 'sqlite',
  schema: './schema/index.ts',
  out: './backend/src/db/migrations',
  dbCredentials: { url: process.env.DATABASE_PATH ?? 'data/bellwether.db' },
  strict: true,
  verbose: true,
});
