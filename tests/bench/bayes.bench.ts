/**
 * Bayesian view, sample planner and `assess --bayes` benchmarks (issue 4, "Performance"):
 * - one group, n = 30 with 30 % non-detects, 4 chains × 25,000 kept draws after 5,000 burn-in: the
 *   sampler alone and the full view (summaries, category probabilities, diagnostics); target ≤ 100 ms;
 * - 20 such groups through `npm run -s assess -- --bayes`, end to end with process start; target ≤ 3 s;
 * - the sample planner for k = 1..12 (2,000 simulated futures, posterior included); target ≤ 2 s;
 * - for comparison, JAGS on the same 20 groups, read from tests/fixtures/stats/bayes-jags.json.
 * Wall times are the targets; CPU times and the load average are noted because other work may share the
 * machine. Data are seeded and not timed.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { sampleLognormalPosterior } from '../../stats/bayes-gibbs';
import { bayesianView } from '../../stats/bayes-view';
import { samplePlanner } from '../../stats/sample-planner';
import { createRandom } from '../../stats/random';
import type { ShiftValue } from '../../stats/types';
import { medianMs, type BenchModule, type BenchRow, cpuMsPerRun, loadNote } from './types';

const here = path.dirname(fileURLToPath(import.meta.url));
const root = path.resolve(here, '../..');
/** n lognormal results with the lowest 30 % reported as non-detects at one detection limit. */
function censoredGroup(seed: number, n = 30): ShiftValue[] {
  const random = createRandom(seed);
  const values = Array.from({ length: n }, () => Number(Math.exp(Math.log(0.1) + 0.8 * random.normal()).toPrecision(4)));
  const limit = [...values].sort((a, b) => a - b)[Math.round(0.3 * n)];
  return values.map((value) => (value < limit ? { value: limit, nonDetect: true } : { value, nonDetect: false }));
}

export const run: BenchModule['run'] = async () => {
  const rows: BenchRow[] = [];
  const data = censoredGroup(1);
  const nd = data.filter((v) => v.nonDetect).length;
  let seed = 1;

  const samplerMs = await medianMs(15, () => sampleLognormalPosterior(data, { settings: { seed: seed++ } }), 5);
  rows.push({
    suite: 'bayes',
    name: `Gibbs sampler, one group (n 30, ${nd} non-detects, 4 × 25,000 after 5,000)`,
    value: samplerMs,
    unit: 'ms',
    target: 100,
    note: `median of 15; CPU ${cpuMsPerRun(5, () => sampleLognormalPosterior(data, { settings: { seed: seed++ } })).toFixed(0)} ms/run; ${loadNote()}`,
  });

  const view = bayesianView(data, { oel: 1 });
  const viewMs = await medianMs(15, () => bayesianView(data, { oel: 1, settings: { seed: seed++ } }), 3);
  rows.push({
    suite: 'bayes',
    name: 'Bayesian view, one group (sampler + summaries + diagnostics)',
    value: viewMs,
    unit: 'ms',
    target: 100,
    note: `median of 15; CPU ${cpuMsPerRun(5, () => bayesianView(data, { oel: 1, settings: { seed: seed++ } })).toFixed(0)} ms/run; R-hat μ ${view.diagnostics.rHat.mu.toFixed(4)}, σ ${view.diagnostics.rHat.sigma.toFixed(4)}; ESS μ ${Math.round(view.diagnostics.effectiveSampleSize.mu)}, σ ${Math.round(view.diagnostics.effectiveSampleSize.sigma)}; ${loadNote()}`,
  });

  const uncertain: ShiftValue[] = [0.12, 0.2, 0.09, 0.3, 0.16].map((value) => ({ value, nonDetect: false }));
  const plannerMs = await medianMs(5, () => samplePlanner(uncertain, { oel: 1, seed: seed++ }), 1);
  rows.push({
    suite: 'bayes',
    name: 'Sample planner, k = 1..12, 2,000 futures (n 5, complete data)',
    value: plannerMs / 1000,
    unit: 's',
    target: 2,
    note: `median of 5; ${loadNote()}`,
  });
  const censoredSmall = censoredGroup(2, 10);
  const plannerCensoredMs = await medianMs(5, () => samplePlanner(censoredSmall, { oel: 0.5, seed: seed++ }), 1);
  rows.push({
    suite: 'bayes',
    name: 'Sample planner, k = 1..12, 2,000 futures (n 10, 3 non-detects)',
    value: plannerCensoredMs / 1000,
    unit: 's',
    target: 2,
    note: `median of 5; ${loadNote()}`,
  });

  // 20 groups through the command, process start included.
  const folder = mkdtempSync(path.join(os.tmpdir(), 'bayes-bench-'));
  try {
    const lines = ['group,value'];
    for (let g = 1; g <= 20; g++) {
      for (const v of censoredGroup(100 + g)) lines.push(`G${g},${v.nonDetect ? '<' : ''}${v.value}`);
    }
    const file = path.join(folder, 'groups.csv');
    writeFileSync(file, `${lines.join('\n')}\n`);
    const runCli = () =>
      execFileSync('npm', ['run', '-s', 'assess', '--', '--input', file, '--oel', '1', '--bayes'], {
        cwd: root,
        encoding: 'utf8',
        maxBuffer: 64 * 1024 * 1024,
      });
    const output = JSON.parse(runCli()) as { groups: { bayes: unknown }[] };
    const filled = output.groups.filter((g) => g.bayes !== null).length;
    const cliMs = await medianMs(3, runCli, 1);
    rows.push({
      suite: 'bayes',
      name: 'npm run -s assess -- --bayes: 20 groups (n 30, 30 % non-detects), end to end',
      value: cliMs / 1000,
      unit: 's',
      target: 3,
      note: `median of 3; ${filled}/20 groups with bayes; ${loadNote()}`,
    });
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }

  const fixture = JSON.parse(readFileSync(path.join(root, 'tests/fixtures/stats/bayes-jags.json'), 'utf8')) as {
    versions: { jags: string };
    jagsTiming: { cpuSeconds: number; elapsedSeconds: number } | null;
  };
  if (fixture.jagsTiming) {
    rows.push({
      suite: 'bayes',
      name: `JAGS ${fixture.versions.jags}, same 20 groups and settings (from the fixture; comparison only)`,
      value: fixture.jagsTiming.cpuSeconds,
      unit: 's',
      note: `CPU seconds recorded by generate-bayes-jags.R --time (elapsed ${fixture.jagsTiming.elapsedSeconds.toFixed(0)} s on a shared machine)`,
    });
  }
  return rows;
};
