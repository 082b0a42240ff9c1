/**
 * `npm run bench`: runs every `tests/bench/*.bench.ts` module (or those named on the command line),
 * prints one table and writes bench-results/latest.json with the machine it ran on.
 *
 * Each module runs in its own Node process (`--child`), so one module's heap (the large seed of the API
 * bench holds hundreds of MB for a while) cannot slow the next one's allocations and garbage collection:
 * run in one process after the API bench, the Bayesian view measured 104–115 ms; alone, 80 ms.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { BenchModule, BenchRow } from './types';

const here = path.dirname(fileURLToPath(import.meta.url));

/** A failed module's one row: it must not hide the others' figures (it also sets the exit code). */
function failedRow(file: string, message: string): BenchRow {
  return { suite: file.replace(/\.bench\.ts$/, ''), name: `${file} did not finish`, value: Number.NaN, unit: '', note: message.split('\n')[0] };
}

// Child: run one module and write its rows (NaN as null) to the file named after it.
if (process.argv[2] === '--child') {
  const [file, out] = process.argv.slice(3) as [string, string];
  let rows: BenchRow[];
  try {
    const mod = (await import(pathToFileURL(path.join(here, file)).href)) as BenchModule;
    rows = await mod.run();
  } catch (error) {
    process.stderr.write(`${file} failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
    rows = [failedRow(file, error instanceof Error ? error.message : String(error))];
  }
  writeFileSync(out, JSON.stringify(rows));
  process.exit(0);
}

const wanted = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => wanted.length === 0 || wanted.some((w) => f.startsWith(w)))
  .sort();

const rows: BenchRow[] = [];
const loadAtStart = os.loadavg();
let failures = 0;
const scratch = mkdtempSync(path.join(os.tmpdir(), 'bench-rows-'));
for (const file of files) {
  process.stderr.write(`running ${file}\n`);
  const out = path.join(scratch, `${file}.json`);
  const child = spawnSync(process.execPath, ['--import', 'tsx', fileURLToPath(import.meta.url), '--child', file, out], {
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  let fileRows: BenchRow[];
  try {
    fileRows = (JSON.parse(readFileSync(out, 'utf8')) as BenchRow[]).map((row) => ({ ...row, value: row.value ?? Number.NaN }));
  } catch {
    fileRows = [failedRow(file, `the benchmark process ended (${child.signal ?? `exit ${child.status}`}) without its rows`)];
  }
  failures += fileRows.filter((row) => Number.isNaN(row.value) && row.name.endsWith('did not finish')).length;
  rows.push(...fileRows);
}
rmSync(scratch, { recursive: true, force: true });

const verdict = (r: BenchRow) =>
  Number.isNaN(r.value) ? 'FAILED' : r.target === undefined ? '' : (r.direction === 'min' ? r.value >= r.target : r.value <= r.target) ? 'met' : 'MISSED';
const figure = (value: number) => (Number.isNaN(value) ? '—' : Number.isInteger(value) ? String(value) : value < 10 ? value.toFixed(3) : value.toFixed(1));
const table = rows.map((r) => ({
  suite: r.suite,
  name: r.name,
  figure: figure(r.value),
  unit: r.unit,
  target: r.target === undefined ? '' : `${r.direction === 'min' ? '≥' : '≤'} ${r.target}`,
  'met?': verdict(r),
  note: r.note ?? '',
}));
console.table(table);

const machine = {
  cpus: os.cpus().length,
  cpuModel: os.cpus()[0]?.model ?? 'unknown',
  memoryGiB: Math.round(os.totalmem() / 2 ** 30),
  node: process.version,
  platform: `${os.platform()} ${os.release()}`,
  loadAverageAtStart: loadAtStart.map((load) => Number(load.toFixed(2))),
  loadAverageAtEnd: os.loadavg().map((load) => Number(load.toFixed(2))),
};
const out = path.resolve(here, '../../bench-results');
mkdirSync(out, { recursive: true });
writeFileSync(
  path.join(out, 'latest.json'),
  JSON.stringify({ ranAt: new Date().toISOString(), machine, rows: rows.map((r) => ({ ...r, verdict: verdict(r) })) }, null, 2),
);
console.log(`wrote ${path.relative(process.cwd(), path.join(out, 'latest.json'))}`);
if (failures > 0) process.exitCode = 1;
