/**
 * Classical statistics benchmarks (issue 3, "Performance"): the median time of a full classical
 * report (assessGroup on complete data: descriptive statistics, Shapiro–Wilk on logs and raw
 * values, probability plot, P95 and UTL, exceedance fraction with one- and two-sided exact limits,
 * MVUE and Land's limits, EN 689, categories, judgement) at n = 6, 30 and 300; and 10,000 groups
 * of n = 10 through the assess command end to end as a child process. Data come from a seeded
 * generator (not timed). Every report computes its own K, UT and Land factors: nothing is cached
 * between single-group runs.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { assessGroup } from '../../stats/assess-group';
import { createRandom } from '../../stats/random';
import type { ShiftValue } from '../../stats/types';
import { medianMs, type BenchModule, type BenchRow, cpuMsPerRun, loadNote } from './types';

/** `count` seeded lognormal groups of `n` results (GM 0.2, GSD 2.5, every value detected). */
function groups(count: number, n: number, seed: number): ShiftValue[][] {
  const random = createRandom(seed);
  return Array.from({ length: count }, () =>
    Array.from({ length: n }, () => ({ value: Number((0.2 * Math.exp(Math.log(2.5) * random.normal())).toPrecision(4)), nonDetect: false })),
  );
}

/** CPU time per run in ms (user + system): less disturbed than wall time when other work shares the machine. */
export const run: BenchModule['run'] = async () => {
  const rows: BenchRow[] = [];
  for (const n of [6, 30, 300]) {
    // Different data for every run, cycled, so no run repeats the previous one's numbers.
    const data = groups(50, n, 1000 + n);
    let next = 0;
    const report = () => assessGroup({ values: data[next++ % data.length], oel: 1, actionLevel: 0.5 });
    const repeats = n === 300 ? 101 : 301;
    const ms = await medianMs(repeats, report, 20);
    rows.push({
      suite: 'statistics',
      name: `full classical report, n = ${n}`,
      value: ms,
      unit: 'ms',
      ...(n === 30 ? { target: 1 } : {}),
      note: `median of ${repeats} over 50 seeded groups; CPU ${cpuMsPerRun(50, report).toFixed(3)} ms/run; ${loadNote()}`,
    });
  }

  const folder = mkdtempSync(path.join(os.tmpdir(), 'statistics-bench-'));
  try {
    const file = path.join(folder, 'ten-thousand-groups.csv');
    const lines = ['group,value'];
    groups(10_000, 10, 42).forEach((values, g) => {
      for (const v of values) lines.push(`group ${g + 1},${v.value}`);
    });
    writeFileSync(file, `${lines.join('\n')}\n`);
    const root = fileURLToPath(new URL('../../', import.meta.url));
    const start = performance.now();
    const child = spawnSync('npm', ['run', '-s', 'assess', '--', '--input', file, '--oel', '1'], {
      cwd: root,
      encoding: 'utf8',
      maxBuffer: 512 * 1024 * 1024,
    });
    const seconds = (performance.now() - start) / 1000;
    if (child.status !== 0) throw new Error(`assess exited with ${child.status}: ${child.stderr}`);
    const report = JSON.parse(child.stdout) as { groups: { error: string | null }[] };
    const failed = report.groups.filter((g) => g.error !== null).length;
    if (report.groups.length !== 10_000 || failed > 0) throw new Error(`assess reported ${report.groups.length} groups, ${failed} with errors`);
    rows.push({
      suite: 'statistics',
      name: '10,000 groups of n = 10 through `npm run -s assess` (child process, end to end)',
      value: seconds,
      unit: 's',
      target: 10,
      note: `100,000 rows, ${(child.stdout.length / 1e6).toFixed(1)} MB of JSON out; npm run -s assess with its esbuild bundle step and process start; ${loadNote()}`,
    });
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
  return rows;
};
