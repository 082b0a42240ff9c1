/**
 * `npm run bench`: runs every `tests/bench/*.bench.ts` module (or those named on the command line),
 * prints one table and writes bench-results/latest.json with the machine it ran on.
 */
import { mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { BenchModule, BenchRow } from './types';

const here = path.dirname(fileURLToPath(import.meta.url));
const wanted = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => wanted.length === 0 || wanted.some((w) => f.startsWith(w)))
  .sort();

const rows: BenchRow[] = [];
const loadAtStart = os.loadavg();
let failures = 0;
for (const file of files) {
  process.stderr.write(`running ${file}\n`);
  try {
    const mod = (await import(pathToFileURL(path.join(here, file)).href)) as BenchModule;
    rows.push(...(await mod.run()));
  } catch (error) {
    // One broken benchmark must not hide the others' figures: it shows as a failed row and the exit code.
    failures += 1;
    process.stderr.write(`${file} failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
    rows.push({
      suite: file.replace(/\.bench\.ts$/, ''),
      name: `${file} did not finish`,
      value: Number.NaN,
      unit: '',
      note: error instanceof Error ? error.message.split('\n')[0] : String(error),
    });
  }
}

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
