/**
 * Robust regression on order statistics (ROS) with Hirsch–Stedinger plotting positions.
 *
 * 1. A hand calculation from the published formulas (Helsel & Cohn 1988, as restated in Helsel
 *    2012, ch. 6) on the small data set printed in the NADA R package's documentation for its
 *    plotting positions (values only; the printed example gives no output to compare with).
 * 2. tests/fixtures/stats/ros.json from tests/fixtures/stats/generate-ros.R: an independent base-R
 *    re-implementation of the published definition. It checks that the TypeScript does what the
 *    definition says; it cannot check the method itself, since both follow the same formulas.
 *
 * No worked example from Helsel (2012) is used: none could be recalled reliably enough to serve as
 * an oracle.
 */
import { describe, expect, it } from 'vitest';
import fixture from '../fixtures/stats/ros.json';
import { robustRos } from '../../stats/ros';

describe('Hirsch–Stedinger plotting positions, hand calculation', () => {
  // Data: 0.5 (<), 0.5, 1.0, 1.5 (<), 5, 10, 100. Limits 0.5 and 1.5; no detection below 0.5.
  // DL 1.5: A = 3 (5, 10, 100), B = 2 detected below + 2 non-detects ≤ 1.5 = 4 → pe = 3/7.
  // DL 0.5: A = 2 (0.5, 1.0),  B = 0 detected below + 1 non-detect ≤ 0.5 = 1
  //         → pe = 3/7 + (2/3)(1 − 3/7) = 17/21.
  // Detected in [0.5, 1.5): 4/21 + (8/21)·r/3 → 20/63, 28/63; in [1.5, ∞): 4/7 + (3/7)·r/4 → 19/28, 22/28, 25/28.
  // Non-detects: at 0.5 (1 − 17/21)/2 = 2/21; at 1.5 (1 − 3/7)/2 = 2/7.
  const values = [0.5, 0.5, 1.0, 1.5, 5.0, 10, 100];
  const nonDetect = [true, false, false, true, false, false, false];
  const expected = [2 / 21, 20 / 63, 28 / 63, 2 / 7, 19 / 28, 22 / 28, 25 / 28];

  it('gives the hand-calculated plotting position of every result', () => {
    const fit = robustRos(values.map((value, i) => ({ value, nonDetect: nonDetect[i] })));
    // Exact fractions; 1e-12 relative allows only floating-point rounding.
    fit.points.forEach((point, i) => expect(Math.abs(point.p / expected[i] - 1)).toBeLessThan(1e-12));
  });
});

describe('robust ROS matches an independent R implementation of the published definition', () => {
  it('the fixture records the R version it was made with', () => {
    expect(fixture.r).toMatch(/^R version \d+\.\d+\.\d+/);
    expect(fixture.cases.length).toBeGreaterThanOrEqual(6);
  });

  // Same closed-form arithmetic in both languages (qnorm vs erfcinv, lm vs sums); agreement was
  // about 1e-15 when this was written. 1e-10 relative catches any difference in the counting
  // rules, which moves positions by 1 % or more.
  const RELATIVE = 1e-10;
  const close = (actual: number, expected: number) => expect(Math.abs(actual - expected)).toBeLessThanOrEqual(RELATIVE * Math.abs(expected));

  for (const c of fixture.cases) {
    it(`${c.name}: same plotting positions, fitted line, imputed values and log mean/SD`, () => {
      const fit = robustRos(c.values.map((value, i) => ({ value, nonDetect: c.nonDetect[i] })));
      fit.points.forEach((point, i) => {
        close(point.p, c.p[i]);
        close(point.estimate, c.estimate[i]);
      });
      close(fit.line.intercept, c.intercept);
      close(fit.line.slope, c.slope);
      close(fit.mu, c.mu);
      close(fit.sigma, c.sigma);
    });
  }
});
