/**
 * `npm run backup -- [--out FILE] [--database PATH]`
 *
 * Copies the database (DATABASE_PATH, default data/bellwether.db) with SQLite's online backup API
 * while the server may be running, checks the copy with `PRAGMA integrity_check`, and prints the
 * copy's path. Without --out the copy goes to backups/bellwether-YYYYMMDD-HHMMSS.db (UTC) beside
 * the database. Restore: README "Backup and restore". Exit codes: 0 done, 1 failed, 2 bad usage.
 */
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { loadSettings } from '../config';
import { backupDatabase, defaultBackupPath } from '../db/backup';
import { isInvokedDirectly, processOutput, UsageError, type CliOutput } from './cli-support';

export const usage = 'usage: npm run backup -- [--out FILE] [--database PATH]';

/** Runs the command; resolves to the exit code. */
export async function main(args: readonly string[], output: CliOutput = processOutput, env: NodeJS.ProcessEnv = process.env): Promise<number> {
  let out: string | undefined;
  let database: string | undefined;
  try {
    let values: Record<string, string | boolean | undefined>;
    try {
      ({ values } = parseArgs({
        args: [...args],
        options: { out: { type: 'string' }, database: { type: 'string' }, help: { type: 'boolean', short: 'h' } },
      }));
    } catch (error) {
      throw new UsageError((error as Error).message);
    }
    if (values.help) {
      output.stdout(`${usage}\n`);
      return 0;
    }
    database = (values.database as string | undefined) ?? loadSettings(env).config.databasePath;
    out = (values.out as string | undefined) ?? defaultBackupPath(database, new Date());
    if (out.trim() === '') throw new UsageError('--out needs a file name');
  } catch (error) {
    if (error instanceof UsageError) {
      output.stderr(`backup: ${error.message}\n${usage}\n`);
      return 2;
    }
    output.stderr(`backup: ${(error as Error).message}\n`);
    return 1;
  }
  try {
    const result = await backupDatabase(resolve(database), resolve(out));
    output.stdout(`Backup written to ${result.path} (${result.pages} pages, integrity_check ${result.integrity})\n`);
    return 0;
  } catch (error) {
    output.stderr(`backup: ${(error as Error).message}\n`);
    return 1;
  }
}

if (isInvokedDirectly(import.meta.url)) {
  void main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}
