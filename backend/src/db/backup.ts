import { existsSync, mkdirSync, renameSync, rmSync } from 'node:fs';
import { dirname, join } from 'node:path';
import BetterSqlite3 from 'better-sqlite3';

/** What one backup produced. */
export interface BackupResult {
  /** The finished copy. */
  path: string;
  /** Database pages copied. */
  pages: number;
  /** `PRAGMA integrity_check` of the copy: "ok" (a copy that is not ok is deleted and an error thrown). */
  integrity: string;
}

/** `bellwether-YYYYMMDD-HHMMSS.db` for `at` in UTC, so names sort by time. */
export function backupFileName(at: Date): string {
  const stamp = at.toISOString().replace(/[-:]/g, '').replace('T', '-').slice(0, 15);
  return `bellwether-${stamp}.db`;
}

/** The default place of a backup: `backups/` beside the database file (data/backups/ by default). */
export function defaultBackupPath(databasePath: string, at: Date): string {
  return join(dirname(databasePath), 'backups', backupFileName(at));
}

/**
 * Copies a live SQLite database to `outPath` with SQLite's online backup API (better-sqlite3's
 * `db.backup()`, https://www.sqlite.org/backup.html): the server may keep reading and writing while
 * the copy runs; the copy is one consistent snapshot of committed transactions (it is taken in one
 * read transaction, which sees committed WAL frames only, so nothing half-written is copied). The copy is written
 * to `outPath.partial` first, checked with `PRAGMA integrity_check`, then renamed, so a crash
 * never leaves a file that looks like a finished backup.
 */
export async function backupDatabase(databasePath: string, outPath: string): Promise<BackupResult> {
  if (!existsSync(databasePath)) throw new Error(`${databasePath}: no database file to back up`);
  if (existsSync(outPath)) throw new Error(`${outPath} already exists: choose another --out file`);
  mkdirSync(dirname(outPath), { recursive: true });
  const partial = `${outPath}.partial`;
  rmSync(partial, { force: true });
  // fileMustExist: a mistyped path must not create an empty database to back up.
  const source = new BetterSqlite3(databasePath, { fileMustExist: true });
  let pages: number;
  try {
    source.pragma('busy_timeout = 5000');
    // All remaining pages in one step: one read transaction, so one consistent snapshot. Small steps
    // would let the server's writes (another connection) restart the copy again and again; in WAL
    // mode the writers are not blocked while the step reads.
    const progress = await source.backup(partial, { progress: () => 0x7fffffff });
    pages = progress.totalPages;
  } finally {
    source.close();
  }
  const copy = new BetterSqlite3(partial, { fileMustExist: true });
  let integrity: string;
  try {
    integrity = String(copy.pragma('integrity_check', { simple: true }));
    // The copy keeps the source's WAL setting; checkpoint so the single .db file is the whole backup.
    copy.pragma('wal_checkpoint(TRUNCATE)');
  } finally {
    copy.close();
  }
  if (integrity !== 'ok') {
    rmSync(partial, { force: true });
    throw new Error(`The backup copy failed PRAGMA integrity_check (${integrity}); nothing was kept`);
  }
  for (const suffix of ['-wal', '-shm']) rmSync(`${partial}${suffix}`, { force: true });
  renameSync(partial, outPath);
  return { path: outPath, pages, integrity };
}
