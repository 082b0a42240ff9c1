/**
 * With no non-detects, the bootstrap of censoredLimits must reproduce the exact normal-theory
 * limits: its pivots then have exactly the noncentral-t distributions (see stats/nondetects.ts).
 *
 * Expected values: tests/fixtures/stats/complete-data-limits.json from
 * tests/fixtures/stats/generate-censored.R — R's qt(conf, n − 1, ncp = qnorm(0.95)·√n)/√n for the
 * UTL95%,95% factor K (NIST/SEMATECH e-Handbook 7.2.6.3 prints K = 2.911 for n = 10) and the
 * exceedance-fraction limits by inverting pt over the noncentrality (Hewett & Ganser 1997).
 *
 * Tolerance: a bootstrap limit is the 95th percentile of `replicates` random draws, so it lands at
 * the exact limit of a slightly different confidence level. With 100,000 draws that level lies
 * within 95 % ± 4·√(0.95·0.05/100,000) = ±0.28 % with probability above 0.9999; the fixture gives
 * the exact limits at both edges of that band, and the bootstrap limit must fall between them.
 */
import { describe, expect, it } from 'vitest';
import fixture from '../fixtures/stats/complete-data-limits.json';
import { censoredLimits, fitWithNondetects } from '../../stats/nondetects';

function between(actual: number, band: number[]) {
  const [low, high] = [Math.min(band[0], band[2]), Math.max(band[0], band[2])];
  expect(actual).toBeGreaterThanOrEqual(low);
  expect(actual).toBeLessThanOrEqual(high);
}

describe('for complete data the bootstrap limits equal the exact noncentral-t limits within Monte-Carlo error', () => {
  it('the fixture records its R version and the NIST tolerance factor for n = 10', () => {
    expect(fixture.r).toMatch(/^R version/);
    // NIST/SEMATECH e-Handbook 7.2.6.3 (REFERENCES.md): K(n = 10) = 2.911 to the printed 3 decimals.
    expect(fixture.cases[0].k).toBeCloseTo(2.911, 3);
  });

  for (const c of fixture.cases) {
    it(`${c.name}: UTL95%,95% and both exceedance-fraction limits fall inside the exact band`, () => {
      const values = c.values.map((value) => ({ value, nonDetect: false }));
      const fit = fitWithNondetects(values);
      expect(fit.method).toBe('complete');
      const limits = censoredLimits(values, fit, c.oel, { seed: 20240201, replicates: fixture.replicates });
      between(limits.utl95_95, c.utl95_95);
      between(limits.exceedanceFractionUpper, c.exceedanceFractionUpper);
      between(limits.exceedanceFractionLower, c.exceedanceFractionLower);
    });
  }
});
