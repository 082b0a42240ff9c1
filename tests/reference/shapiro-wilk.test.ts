import { describe, expect, it } from 'vitest';
import fixture from '../fixtures/stats/shapiro-wilk.json';
import { shapiroWilk, shapiroWilkCoefficients } from '@stats/shapiro-wilk';

describe('Shapiro–Wilk test (Royston 1995, AS R94)', () => {
  it('gives W 0.7888 and p 0.0067 for the worked example of REFERENCES.md (paper prints W 0.79)', () => {
    // REFERENCES.md, Shapiro–Wilk: 148 … 236 → W 0.7888, p 0.0067 (4 decimals: tolerance 0.00005).
    const result = shapiroWilk([148, 154, 158, 160, 161, 162, 166, 170, 182, 195, 236]);
    expect(Math.abs(result.w - 0.7888)).toBeLessThanOrEqual(0.00005);
    expect(Math.abs(result.p - 0.0067)).toBeLessThanOrEqual(0.00005);
  });

  it(`matches R shapiro.test (${fixture.R}) on ${fixture.shapiroWilk.length} seeded samples, n 3 to 5000`, () => {
    // Same algorithm (Royston 1995) in both; the only differences are rounding in the sums, so W
    // agrees to 1e-12 relative and p, which amplifies W's rounding through ln(1 − W), to 1e-9.
    for (const c of fixture.shapiroWilk) {
      const result = shapiroWilk(c.values);
      expect(Math.abs(result.w / c.w - 1), `${c.label} W`).toBeLessThan(1e-12);
      expect(Math.abs(result.p / c.p - 1), `${c.label} p`).toBeLessThan(1e-9);
    }
  });

  it('uses the exact coefficient √½ for n = 3 and coefficients whose squares sum to 1 (Royston 1995, normalization)', () => {
    expect(shapiroWilkCoefficients(3)).toEqual([Math.SQRT1_2]);
    for (const n of [4, 5, 6, 11, 50, 999]) {
      const half = shapiroWilkCoefficients(n);
      const sumOfSquares = 2 * half.reduce((sum, a) => sum + a * a, 0);
      expect(Math.abs(sumOfSquares - 1), `n=${n}`).toBeLessThan(1e-12);
    }
  });

  it('refuses fewer than 3 or more than 5000 values, equal values and non-finite values with a RangeError naming the rule', () => {
    expect(() => shapiroWilk([1, 2])).toThrow(/shapiroWilk: needs from 3 to 5000 values, got 2/);
    expect(() => shapiroWilk(Array.from({ length: 5001 }, (_, i) => i))).toThrow(/got 5001/);
    expect(() => shapiroWilk([2, 2, 2])).toThrow(/all values are equal/);
    expect(() => shapiroWilk([1, Number.NaN, 3])).toThrow(/value 2 is not a finite number/);
  });
});
