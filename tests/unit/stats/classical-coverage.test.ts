import { describe, expect, it } from 'vitest';
import { landFactor } from '@stats/arithmetic-mean';
import { exceedanceFractionLimit } from '@stats/exceedance-fraction';
import { normalCdf, Z_95 } from '@stats/normal-distribution';
import { createRandom } from '@stats/random';
import { toleranceFactor } from '@stats/tolerance-limit';

/*
 * Coverage of the exact classical limits on seeded simulated lognormal data. Each limit is exact,
 * so its true coverage is 95 %. With 2,000 data sets the observed coverage has standard error
 * √(0.95·0.05/2000) = 0.0049; the accepted band is 95 % ± 3 standard errors = [0.9354, 0.9646]
 * (a correct method falls outside it with probability 0.27 % per check; the seeds are fixed, so
 * the outcome is reproducible). The true exceedance fractions differ from 5 %, so that the
 * exceedance-fraction check is not the UTL check in disguise (at F = 5 % the two events coincide).
 */
const DATA_SETS = 2000;
const MARGIN = 3 * Math.sqrt((0.95 * 0.05) / DATA_SETS);

interface Coverage {
  utl: number;
  exceedanceUcl: number;
  landUcl: number;
}

function simulate(n: number, gsd: number, trueExceedance: number, seed: number): Coverage {
  const random = createRandom(seed);
  const mu = Math.log(0.2);
  const sigma = Math.log(gsd);
  const trueP95 = Math.exp(mu + Z_95 * sigma);
  const trueMean = Math.exp(mu + (sigma * sigma) / 2);
  // The OEL that this true exceedance fraction implies: 1 − Φ((ln OEL − μ)/σ) = F.
  let z = 0;
  for (let step = 0; step < 100; step++) z += ((normalCdf(-z) - trueExceedance) / Math.exp(-0.5 * z * z)) * Math.sqrt(2 * Math.PI);
  const oel = Math.exp(mu + z * sigma);
  const k = toleranceFactor(n);
  let utl = 0;
  let exceedanceUcl = 0;
  let landUcl = 0;
  const logs = new Array<number>(n);
  for (let set = 0; set < DATA_SETS; set++) {
    let mean = 0;
    for (let i = 0; i < n; i++) {
      logs[i] = mu + sigma * random.normal();
      mean += logs[i];
    }
    mean /= n;
    let squares = 0;
    for (const y of logs) squares += (y - mean) ** 2;
    const sd = Math.sqrt(squares / (n - 1));
    if (Math.exp(mean + k * sd) >= trueP95) utl++;
    if (exceedanceFractionLimit({ n, mean, sd }, oel, 0.95, 'upper') >= trueExceedance) exceedanceUcl++;
    if (mean + (sd * sd) / 2 + (sd * landFactor(n, sd, 0.95)) / Math.sqrt(n - 1) >= Math.log(trueMean)) landUcl++;
  }
  return { utl: utl / DATA_SETS, exceedanceUcl: exceedanceUcl / DATA_SETS, landUcl: landUcl / DATA_SETS };
}

describe('coverage of the classical 95 % upper limits on 2,000 seeded lognormal data sets', () => {
  const cases: [number, number, number, number][] = [
    [5, 2.5, 0.03, 501],
    [10, 3.0, 0.1, 1002],
    [25, 2.0, 0.02, 2503],
  ];
  it.each(cases)(
    'for n = %i (GSD %f, true exceedance %f) the UTL95%,95%, the exceedance-fraction UCL and Land’s UCL each cover the truth 95 % ± 3 SE of the time',
    (n, gsd, trueExceedance, seed) => {
      const coverage = simulate(n, gsd, trueExceedance, seed);
      for (const [name, value] of Object.entries(coverage)) {
        expect(Math.abs(value - 0.95), `${name} coverage ${value}`).toBeLessThanOrEqual(MARGIN);
      }
    },
    180_000,
  );
});
