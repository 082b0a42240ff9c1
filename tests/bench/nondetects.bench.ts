/**
 * Non-detect benchmarks (issue 3, "Non-detects"): the censored-data fit plus every confidence limit
 * (censoredLimits, 2,000 bootstrap replicates) for one group. Target from the brief for this work:
 * the whole censored report for n = 30 well under 100 ms. Data come from a fixed seed (not timed).
 */
import { censoredLimits, fitWithNondetects } from '../../stats/nondetects';
import { createRandom } from '../../stats/random';
import { normalQuantile } from '../../stats/normal-distribution';
import type { ShiftValue } from '../../stats/types';
import { medianMs, type BenchModule, type BenchRow, loadNote } from './types';

/** n lognormal results (GM 0.1, GSD 2.5) with one detection limit at the true 30th percentile. */
function censoredGroup(n: number, seed: number): ShiftValue[] {
  const random = createRandom(seed);
  const mu = Math.log(0.1);
  const sigma = Math.log(2.5);
  const limit = Math.exp(mu + sigma * normalQuantile(0.3));
  return Array.from({ length: n }, () => {
    const x = Math.exp(mu + sigma * random.normal());
    return x < limit ? { value: limit, nonDetect: true } : { value: x, nonDetect: false };
  });
}

function report(values: readonly ShiftValue[]) {
  const fit = fitWithNondetects(values);
  return censoredLimits(values, fit, 1, { seed: 42 });
}

export const run: BenchModule['run'] = async () => {
  const rows: BenchRow[] = [];
  for (const [n, target] of [
    [10, undefined],
    [30, 100],
    [60, undefined],
  ] as const) {
    const values = censoredGroup(n, 1000 + n);
    const fit = fitWithNondetects(values);
    const nonDetects = values.filter((v) => v.nonDetect).length;
    rows.push({
      suite: 'statistics',
      name: `censored report, n = ${n} (${nonDetects} non-detects, ${fit.method}): fit + limits, 2,000 replicates`,
      value: await medianMs(15, () => report(values)),
      unit: 'ms',
      target,
      note: loadNote(),
    });
  }
  return rows;
};
