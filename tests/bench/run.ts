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
for (const file of files) {
  const mod = (await import(pathToFileURL(path.join(here, file)).href)) as BenchModule;
  process.stderr.write(`running ${file}\n`);
  rows.push(...(await mod.run()));
}

const verdict = (r: BenchRow) =>
  r.target === undefined ? '' : (r.direction === 'min' ? r.value >= r.target : r.value <= r.target) ? 'met' : 'MISSED';
const table = rows.map((r) => ({
  suite: r.suite,
  benchmark: r.name,
  value: `${r.value < 10 ? r.value.toFixed(3) : r.value.toFixed(1)} ${r.unit}`,
  target: r.target === undefined ? '' : `${r.direction === 'min' ? '≥' : '≤'} ${r.target} ${r.unit}`,
  verdict: verdict(r),
  note: r.note ?? '',
}));
console.table(table);

const machine = {
  cpus: os.cpus().length,
  cpuModel: os.cpus()[0]?.model ?? 'unknown',
  memoryGiB: Math.round(os.totalmem() / 2 ** 30),
  node: process.version,
  platform: `${os.platform()} ${os.release()}`,
};
const out = path.resolve(here, '../../bench-results');
mkdirSync(out, { recursive: true });
writeFileSync(
  path.join(out, 'latest.json'),
  JSON.stringify({ ranAt: new Date().toISOString(), machine, rows: rows.map((r) => ({ ...r, verdict: verdict(r) })) }, null, 2),
);
console.log(`wrote ${path.relative(process.cwd(), path.join(out, 'latest.json'))}`);
