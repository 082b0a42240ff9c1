import { copyFileSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, dirname, join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../backend/src/app';
import { main as backupCommand } from '../../backend/src/cli/backup';
import { backupFileName, defaultBackupPath } from '../../backend/src/db/backup';
import { databaseHealth, openMigratedDatabase } from '../../backend/src/db/client';
import { createTestContext, demoPassword, testConfig, type SignedIn, type TestContext } from '../helpers/test-app';

/*
 * `npm run backup` (backend/src/cli/backup.ts): an online copy with SQLite's backup API while the
 * app keeps writing, checked with PRAGMA integrity_check, then the restore that README "Backup and
 * restore" describes (copy the file over DATABASE_PATH with no -wal/-shm beside it, start the app).
 */

function captured() {
  const lines = { stdout: '', stderr: '' };
  return { lines, output: { stdout: (text: string) => (lines.stdout += text), stderr: (text: string) => (lines.stderr += text) } };
}

describe('npm run backup and the restore', () => {
  let context: TestContext;
  let hygienist: SignedIn;
  let base: string;
  const folder = mkdtempSync(join(tmpdir(), 'bellwether-backup-'));

  beforeAll(async () => {
    context = await createTestContext({ capture: false });
    base = `/api/orgs/${context.organizationId('ridgeback')}`;
    hygienist = await context.signInAs('hygienist');
  }, 60_000);
  afterAll(async () => {
    await context?.close();
    rmSync(folder, { recursive: true, force: true });
  });

  it('names a default backup backups/bellwether-YYYYMMDD-HHMMSS.db (UTC) beside the database', () => {
    const at = new Date('2026-03-04T05:06:07.890Z');
    expect(backupFileName(at)).toBe('bellwether-20260304-050607.db');
    expect(defaultBackupPath('data/bellwether.db', at)).toBe(join('data', 'backups', 'bellwether-20260304-050607.db'));
  });

  it('copies the database while it is being written, the copy passes integrity_check, and a restore starts with the data', async () => {
    const before = await hygienist.post(`${base}/sites`, { name: 'Written before the backup' });
    expect(before.status).toBe(201);
    const out = join(folder, 'copy.db');
    // Writes keep arriving while the backup runs (the backup API lets them in between its steps).
    let writing = true;
    let written = 0;
    const writer = (async () => {
      while (writing) {
        const answer = await hygienist.post(`${base}/sites`, { name: `Written during the backup ${written}` });
        expect(answer.status).toBe(201);
        written += 1;
      }
    })();
    while (written < 3) await new Promise((wait) => setTimeout(wait, 5));
    const { lines, output } = captured();
    const code = await backupCommand(['--out', out, '--database', context.config.databasePath], output);
    writing = false;
    await writer;
    expect(lines.stderr).toBe('');
    expect(code).toBe(0);
    expect(lines.stdout).toMatch(new RegExp(`^Backup written to ${out.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} \\(\\d+ pages, integrity_check ok\\)\\n$`));
    expect(existsSync(`${out}.partial`)).toBe(false);
    expect(existsSync(`${out}-wal`)).toBe(false);
    expect(written).toBeGreaterThanOrEqual(3);

    // Restore into a new place: copy the file as DATABASE_PATH (no -wal or -shm beside it) and start the app.
    const restoredFolder = mkdtempSync(join(tmpdir(), 'bellwether-restored-'));
    const restoredPath = join(restoredFolder, 'bellwether.db');
    copyFileSync(out, restoredPath);
    const db = openMigratedDatabase(restoredPath);
    const app = createApp({
      db,
      mailer: { send: () => Promise.reject(new Error('no e-mail in this test')), close: () => undefined },
      config: testConfig(restoredPath),
      clock: context.clock,
    });
    try {
      expect(String(db.$client.pragma('integrity_check', { simple: true }))).toBe('ok');
      expect(databaseHealth(db).ok).toBe(true);
      const agent = request.agent(app);
      const token = (await agent.get('/api/auth/csrf')).body.csrfToken as string;
      const signIn = await agent.post('/api/auth/sign-in').set('X-CSRF-Token', token).send({ email: 'hygienist@ridgeback.example', password: demoPassword });
      expect(signIn.status).toBe(200);
      const sites = await agent.get(`${base}/sites`).query({ pageSize: 200 });
      const names = (sites.body.items as Array<{ name: string }>).map((site) => site.name);
      expect(names).toContain('Written before the backup');
      expect(names).toContain('Ridgeback sawmill');
      // The copy is one snapshot: the sites written during the run are a prefix 0 … k−1 of those written.
      const during = names.filter((name) => name.startsWith('Written during the backup')).map((name) => Number(name.split(' ').at(-1)));
      expect(during.sort((a, b) => a - b)).toEqual(during.map((_, index) => index));
    } finally {
      app.dispose();
      db.$client.close();
      rmSync(restoredFolder, { recursive: true, force: true });
    }
  });

  it('refuses to overwrite an existing file and to back up a database that does not exist (exit 1, nothing written)', async () => {
    const existing = join(folder, 'copy.db');
    const first = captured();
    expect(await backupCommand(['--out', existing, '--database', context.config.databasePath], first.output)).toBe(1);
    expect(first.lines.stderr).toBe(`backup: ${existing} already exists: choose another --out file\n`);
    const missing = join(folder, 'no-such.db');
    const second = captured();
    expect(await backupCommand(['--out', join(folder, 'other.db'), '--database', missing], second.output)).toBe(1);
    expect(second.lines.stderr).toBe(`backup: ${missing}: no database file to back up\n`);
    expect(existsSync(join(folder, 'other.db'))).toBe(false);
    expect(existsSync(missing)).toBe(false);
  });

  it('without --out writes to backups/ beside DATABASE_PATH; an unknown option is a usage error (exit 2)', async () => {
    const { lines, output } = captured();
    expect(await backupCommand([], output, { DATABASE_PATH: context.config.databasePath, NODE_ENV: 'test' })).toBe(0);
    const written = lines.stdout.match(/^Backup written to (.+) \(/)?.[1];
    expect(written).toBeDefined();
    expect(dirname(written!)).toBe(join(dirname(context.config.databasePath), 'backups'));
    expect(basename(written!)).toMatch(/^bellwether-\d{8}-\d{6}\.db$/);
    expect(existsSync(written!)).toBe(true);
    const usage = captured();
    expect(await backupCommand(['--to', 'x.db'], usage.output)).toBe(2);
    expect(usage.lines.stderr).toMatch(/^backup: Unknown option '--to'/);
    expect(usage.lines.stderr).toContain('usage: npm run backup -- [--out FILE] [--database PATH]');
  });
});
