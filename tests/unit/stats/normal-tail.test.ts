import { describe, expect, it } from 'vitest';
import { inverseMillsRatio, logNormalCdf } from '../../../stats/normal-tail';

// Expected values: R 4.2.2, pnorm(x, log.p = TRUE) and exp(dnorm(x, log = TRUE) − pnorm(x, log.p = TRUE)),
// printed with 17 digits. Relative tolerance 1e-11: the asymptotic series used below x = −30 is
// accurate to about 2e-12 there (its first omitted term); elsewhere both sides are near 1e-15.
const cases = [
  { x: -40, logCdf: -804.6084420137538, mills: 40.024968847206338 },
  { x: -30.001, logCdf: -454.35127771545876, mills: 30.034258563698664 },
  { x: -29.999, logCdf: -454.29121119612381, mills: 30.032260771241635 },
  { x: -10, logCdf: -53.23128515051247, mills: 10.09809323396249 },
  { x: 0, logCdf: -0.6931471805599453, mills: 0.7978845608028653 },
  { x: 2, logCdf: -0.023012909328963493, mills: 0.05524786267898995 },
];

describe('lower-tail normal functions for censored likelihoods', () => {
  for (const c of cases) {
    it(`log Φ(${c.x}) and φ/Φ(${c.x}) match R to 1e-11 relative`, () => {
      expect(Math.abs(logNormalCdf(c.x) / c.logCdf - 1)).toBeLessThan(1e-11);
      expect(Math.abs(inverseMillsRatio(c.x) / c.mills - 1)).toBeLessThan(1e-11);
    });
  }

  it('stays finite far below where Φ itself underflows to 0', () => {
    expect(Number.isFinite(logNormalCdf(-1e5))).toBe(true);
    expect(inverseMillsRatio(-1e5)).toBeCloseTo(1e5, 0);
  });

  it('refuses NaN with a RangeError naming the function', () => {
    expect(() => logNormalCdf(Number.NaN)).toThrow(/logNormalCdf: x must be a number/);
    expect(() => inverseMillsRatio(Number.NaN)).toThrow(/inverseMillsRatio: x must be a number/);
  });
});
