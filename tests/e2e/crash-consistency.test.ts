/**
 * Crash consistency: the real server (backend/src/server.ts) is killed with SIGKILL while it
 * imports 20,000 lab rows and while it stores a 40-hour noise log at 1 s (144,000 intervals), at
 * several moments of the request. After a restart on the same file SQLite must report
 * `PRAGMA integrity_check` = ok and each import must be wholly present or wholly absent (one
 * transaction per import; SQLite's WAL makes a commit atomic across a crash — sqlite.org
 * "Atomic Commit In SQLite" and "Write-Ahead Logging"). Which of the two outcomes a kill gives
 * depends on timing; the invariant is asserted either way and the outcomes are printed.
 */
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import BetterSqlite3 from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateNoiseDemoLog } from '@stats/noise-demo';
import { openHttpSession, type HttpSession } from '../helpers/http-session';
import { singleSampleCommit, singleSampleLabFile } from '../helpers/lab-files';
import { demoPassword, demoUsers, startServer, type TestServer } from './harness';

const labRows = 20_000;
const workersPerGroup = 10;
/** Kill moments after the lab commit is sent (inside its transaction on any machine we know). */
const labKillDelaysMs = [300, 1500, 4000];
/** Kill moments as fractions of the time an uninterrupted noise upload took. */
const killFractions = [0.3, 0.6, 0.85, 1.0];

let dataDir: string;
let server: TestServer | undefined;
let hygienist: HttpSession;
let organizationId: number;
const outcomes: string[] = [];
/** Measured by the uninterrupted noise upload; its kill delays are fractions of it. */
let noiseUploadMs = 3000;

async function start(): Promise<void> {
  server = await startServer({ dataDir, keepData: true, requireClient: false });
  hygienist = await openHttpSession(server.url, demoUsers.hygienist, demoPassword);
  const me = (await (await hygienist.get('/api/me')).json()) as { memberships: Array<{ organizationId: number; organizationSlug: string }> };
  organizationId = me.memberships.find((membership) => membership.organizationSlug === 'ridgeback-timber')!.organizationId;
}

async function killAndRestart(): Promise<void> {
  server!.child.kill('SIGKILL');
  await server!.exited();
  await start();
}

/** Opens the file beside the running server (WAL lets a reader in) and runs `check`. */
function inspect<T>(check: (database: BetterSqlite3.Database) => T): T {
  const database = new BetterSqlite3(server!.databasePath, { readonly: true, fileMustExist: true });
  try {
    return check(database);
  } finally {
    database.close();
  }
}

function integrity(): string {
  return inspect((database) => String(database.pragma('integrity_check', { simple: true })));
}

async function json<T>(response: Promise<Response>, status: number): Promise<T> {
  const answer = await response;
  const body = (await answer.json()) as T;
  if (answer.status !== status) throw new Error(`Expected ${status}, got ${answer.status}: ${JSON.stringify(body)}`);
  return body;
}

/**
 * Sends a request, SIGKILLs the server when `moment` resolves (a delay, or a sign of the write in
 * progress), restarts it; true if the answer came before the kill.
 */
async function killDuring(send: (signal: AbortSignal) => Promise<Response>, moment: number | ((answered: () => boolean) => Promise<void>)): Promise<boolean> {
  const controller = new AbortController();
  let answered = false;
  const request = send(controller.signal)
    .then(async (response) => {
      await response.arrayBuffer();
      answered = true;
    })
    .catch(() => undefined);
  if (typeof moment === 'number') await new Promise((wait) => setTimeout(wait, moment));
  else await moment(() => answered);
  const answeredBeforeKill = answered;
  await killAndRestart();
  controller.abort();
  await request;
  return answeredBeforeKill;
}

/** Bytes in the server's write-ahead log now (0 when there is none). */
function walBytes(): number {
  try {
    return statSync(`${server!.databasePath}-wal`).size;
  } catch {
    return 0;
  }
}

/**
 * Resolves once the WAL has grown by `bytes` (the open transaction spilled pages to it: SQLite is
 * in the middle of writing the import) or the request was answered.
 */
async function walGrows(bytes: number, answered: () => boolean): Promise<void> {
  const start = walBytes();
  while (!answered() && walBytes() < start + bytes) await new Promise((wait) => setTimeout(wait, 10));
}

beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'bellwether-crash-'));
  await start();
});
afterAll(async () => {
  await server?.stop();
  rmSync(dataDir, { recursive: true, force: true });
  console.log(`crash-consistency outcomes:\n  ${outcomes.join('\n  ')}`);
});

describe('SIGKILL in the middle of a large lab import', () => {
  const base = () => `/api/orgs/${organizationId}`;

  /** A new group with ten members from 2015 and a 20,000-row file of single full-shift samples for it. */
  async function prepareBatch(attempt: number): Promise<number> {
    const sites = await json<{ items: Array<{ id: number }> }>(hygienist.get(`${base()}/sites`), 200);
    const agents = await json<{ items: Array<{ id: number; name: string }> }>(hygienist.get(`${base()}/agents?kind=chemical`), 200);
    const agent = agents.items[0];
    const groupName = `Crash test group ${attempt}`;
    const group = await json<{ id: number }>(
      hygienist.post(`${base()}/exposure-groups`, {
        siteId: sites.items[0].id,
        agentId: agent.id,
        name: groupName,
        oelValue: 1,
        oelUnit: 'mg/m3',
        oelSource: 'Test limit',
        oelAveragingTime: '8h-twa',
      }),
      201,
    );
    const workers = await json<{ items: Array<{ id: number; code: string }> }>(hygienist.get(`${base()}/workers?pageSize=${workersPerGroup}`), 200);
    for (const worker of workers.items) {
      await json(hygienist.post(`${base()}/group-memberships`, { workerId: worker.id, exposureGroupId: group.id, fromDate: '2015-01-01' }), 201);
    }
    const text = singleSampleLabFile({
      workerCodes: workers.items.map((worker) => worker.code),
      groupName,
      agentName: agent.name,
      rows: labRows,
      samplePrefix: `C${attempt}`,
      lab: 'Test lab',
    });
    const uploaded = await json<{ batch: { id: number } }>(
      hygienist.upload(`${base()}/lab-imports`, { name: `crash-${attempt}.csv`, type: 'text/csv', bytes: Buffer.from(text) }),
      201,
    );
    return uploaded.batch.id;
  }

  const commitBody = singleSampleCommit;

  /** Results stored for the batch and whether the batch says committed: all or nothing. */
  function batchState(batchId: number): { results: number; committed: boolean } {
    return inspect((database) => ({
      results: (database.prepare('select count(*) as n from shift_results where import_batch_id = ?').get(batchId) as { n: number }).n,
      committed: (database.prepare('select status from import_batches where id = ?').get(batchId) as { status: string }).status === 'committed',
    }));
  }

  /*
   * The commit plans and writes inside one transaction (services/lab-import.ts), and planning
   * 20,000 rows takes seconds, so a kill a little after the request is sent lands inside the open
   * write transaction. After the kills the same batch is committed without interruption, which
   * shows the file was good and the crash left nothing behind that blocks it.
   */
  let batchId = 0;
  let attempt = 0;

  it.each(labKillDelaysMs)(
    'killed %i ms into the commit: integrity ok and the import wholly present or absent',
    async (delay) => {
      if (batchId === 0 || batchState(batchId).committed) {
        attempt += 1;
        batchId = await prepareBatch(attempt);
      }
      const answered = await killDuring((signal) => hygienist.post(`${base()}/lab-imports/${batchId}/commit`, commitBody, signal), delay);
      expect(integrity()).toBe('ok');
      const state = batchState(batchId);
      expect([0, labRows]).toContain(state.results);
      expect(state.committed).toBe(state.results === labRows);
      if (answered) expect(state.results).toBe(labRows);
      outcomes.push(
        `lab commit killed after ${delay} ms: ${state.results === labRows ? 'wholly present' : 'wholly absent'}${answered ? ' (answered before the kill)' : ''}`,
      );
    },
    300_000,
  );

  it('killed while the commit transaction is writing (its pages reach the WAL): integrity ok and the import wholly present or absent', async () => {
    if (batchId === 0 || batchState(batchId).committed) {
      attempt += 1;
      batchId = await prepareBatch(attempt);
    }
    const answered = await killDuring(
      (signal) => hygienist.post(`${base()}/lab-imports/${batchId}/commit`, commitBody, signal),
      (done) => walGrows(256 * 1024, done),
    );
    expect(integrity()).toBe('ok');
    const state = batchState(batchId);
    expect([0, labRows]).toContain(state.results);
    expect(state.committed).toBe(state.results === labRows);
    if (answered) expect(state.results).toBe(labRows);
    outcomes.push(
      `lab commit killed once 256 KB reached the WAL: ${state.results === labRows ? 'wholly present' : 'wholly absent'}${answered ? ' (answered before the kill)' : ''}`,
    );
  }, 900_000);

  it('after the crashes the same 20,000-row batch commits in full', async () => {
    if (batchState(batchId).committed) {
      attempt += 1;
      batchId = await prepareBatch(attempt);
    }
    const started = performance.now();
    const committed = await hygienist.post(`${base()}/lab-imports/${batchId}/commit`, commitBody);
    expect(committed.status, (await committed.clone().text()).slice(0, 500)).toBe(201);
    expect(batchState(batchId)).toEqual({ results: labRows, committed: true });
    expect(integrity()).toBe('ok');
    outcomes.push(`lab commit uninterrupted: ${Math.round(performance.now() - started)} ms`);
  }, 900_000);
});

describe('SIGKILL in the middle of a 40-hour noise-log upload', () => {
  const base = () => `/api/orgs/${organizationId}`;
  // 40 h at 1 s (144,000 intervals): an invented log (stats/noise-demo.ts), several MB of CSV.
  const log = generateNoiseDemoLog({ seed: 40, hours: 40, intervalSeconds: 1, worker: 'RT-014' });
  const bytes = Buffer.from(log.text);

  async function fields(shiftDate: string) {
    const groups = await json<{ items: Array<{ id: number; name: string }> }>(
      hygienist.get(`${base()}/exposure-groups?q=${encodeURIComponent('Forklift driver')}`),
      200,
    );
    const workers = await json<{ items: Array<{ id: number }> }>(hygienist.get(`${base()}/workers?q=RT-014`), 200);
    return { exposureGroupId: groups.items[0].id, workerId: workers.items[0].id, instrument: 'CRASH-TEST', shiftDate };
  }

  /** Logs stored for the date, each with its channels and how many of them hold every interval (8 bytes each). */
  function logsOn(shiftDate: string): Array<{ intervals: number; channels: number; completeChannels: number }> {
    return inspect((database) =>
      (
        database.prepare("select id, interval_count as intervals from noise_logs where instrument = 'CRASH-TEST' and shift_date = ?").all(shiftDate) as Array<{
          id: number;
          intervals: number;
        }>
      ).map((row) => {
        const lengths = database.prepare('select length(data) as n from noise_log_channels where noise_log_id = ?').all(row.id) as Array<{ n: number }>;
        return { intervals: row.intervals, channels: lengths.length, completeChannels: lengths.filter((length) => length.n === row.intervals * 8).length };
      }),
    );
  }

  /** A stored 40-hour log: every interval, and every channel (time, level, peak, three axes, acceleration peak) complete. */
  const wholeLog = { intervals: 144_000, channels: 7, completeChannels: 7 };

  function orphans(): number {
    return inspect(
      (database) =>
        (database.prepare('select count(*) as n from noise_log_channels where noise_log_id not in (select id from noise_logs)').get() as { n: number }).n +
        (database.prepare('select count(*) as n from noise_masks where noise_log_id not in (select id from noise_logs)').get() as { n: number }).n,
    );
  }

  it('an uninterrupted 40-hour upload stores the log with all 144,000 intervals (the timing for the kills)', async () => {
    expect(log.log.length).toBe(144_000);
    const started = performance.now();
    const answer = await hygienist.upload(`${base()}/noise-logs`, { name: 'forty-hours.csv', type: 'text/csv', bytes }, await fields('2025-03-10'));
    const elapsed = performance.now() - started;
    expect(answer.status, await answer.clone().text()).toBe(201);
    expect(logsOn('2025-03-10')).toEqual([wholeLog]);
    outcomes.push(`noise upload uninterrupted: ${Math.round(elapsed)} ms for ${(bytes.byteLength / 1024 / 1024).toFixed(1)} MB`);
    noiseUploadMs = elapsed;
  });

  it.each(killFractions.map((fraction, index) => ({ fraction, shiftDate: `2025-03-${String(11 + index).padStart(2, '0')}` })))(
    'killed at $fraction of the upload time: integrity ok and the log wholly present or absent',
    async ({ fraction, shiftDate }) => {
      const delay = Math.round(noiseUploadMs * fraction);
      const form = await fields(shiftDate);
      const answered = await killDuring(
        (signal) => hygienist.upload(`${base()}/noise-logs`, { name: 'forty-hours.csv', type: 'text/csv', bytes }, form, signal),
        delay,
      );
      expect(integrity()).toBe('ok');
      const stored = logsOn(shiftDate);
      expect(stored.length).toBeLessThanOrEqual(1);
      if (stored.length === 1) expect(stored[0]).toEqual(wholeLog);
      if (answered) expect(stored.length).toBe(1);
      expect(orphans()).toBe(0);
      outcomes.push(
        `noise upload killed after ${delay} ms: ${stored.length === 1 ? 'wholly present' : 'wholly absent'}${answered ? ' (answered before the kill)' : ''}`,
      );
    },
    180_000,
  );

  it('the restarted server answers /api/health from the same database', async () => {
    const health = await json<{ ok: boolean; database: { migrations: number } }>(hygienist.get('/api/health'), 200);
    expect(health.ok).toBe(true);
    expect(health.database.migrations).toBeGreaterThan(0);
  });
});
