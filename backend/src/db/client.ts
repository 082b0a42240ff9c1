import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import BetterSqlite3 from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { readMigrationFiles } from 'drizzle-orm/migrator';
import * as schema from '@schema/index';

/** The app's database handle: drizzle with every table; the raw driver is `db.$client`. */
export type Db = BetterSQLite3Database<typeof schema> & { $client: BetterSqlite3.Database };

/** Migrations written by drizzle-kit (drizzle.config.ts `out`), committed with the code. */
export const migrationsFolder = fileURLToPath(new URL('./migrations', import.meta.url));

/**
 * Opens (and creates) the SQLite database at `path` — ':memory:' for a throwaway one.
 * WAL lets readers run while one writer writes; foreign keys are off by default in SQLite and
 * must be switched on per connection; busy_timeout makes a second process wait instead of
 * failing at once (e.g. `npm run db:migrate` while the server runs).
 */
export function openDatabase(path: string): Db {
  if (path !== ':memory:' && !path.startsWith('file:')) mkdirSync(dirname(path), { recursive: true });
  const sqlite = new BetterSqlite3(path);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  sqlite.pragma('synchronous = NORMAL'); // safe with WAL: a power cut may lose the last commit, never corrupt
  return drizzle(sqlite, { schema }) as Db;
}

/** Applies every migration not yet applied (drizzle records them in `__drizzle_migrations`). */
export function migrateDatabase(db: Db): void {
  migrate(db, { migrationsFolder });
}

/** Opens and migrates in one step. */
export function openMigratedDatabase(path: string): Db {
  const db = openDatabase(path);
  migrateDatabase(db);
  return db;
}

/** Migrations in this build's folder (read once: they change only with a new build). */
let shippedMigrations: number | undefined;

/** What GET /api/health reports about the database. */
export type DatabaseHealth = { ok: true; migrations: number } | { ok: false; reason: string };

/**
 * A real query, not a ping: `select 1`, then the count of applied migrations, which must be at
 * least the number of migrations this build ships (a database from a newer build is fine; an
 * older, unmigrated one is not). Any failure (closed handle, missing table, corrupt file) is
 * reported with its reason.
 */
export function databaseHealth(db: Db): DatabaseHealth {
  try {
    if (db.$client.prepare('select 1 as ok').get() === undefined) return { ok: false, reason: 'select 1 returned no row' };
    const applied = (db.$client.prepare('select count(*) as n from __drizzle_migrations').get() as { n: number }).n;
    shippedMigrations ??= readMigrationFiles({ migrationsFolder }).length;
    const shipped = shippedMigrations;
    if (applied < shipped) return { ok: false, reason: `${applied} of ${shipped} migrations applied: run npm run db:migrate` };
    return { ok: true, migrations: applied };
  } catch (error) {
    return { ok: false, reason: `the database cannot answer: ${error instanceof Error ? error.message : String(error)}` };
  }
}

/** Whether `databaseHealth` is ok. */
export function databaseIsHealthy(db: Db): boolean {
  return databaseHealth(db).ok;
}
