/**
 * Split R-hat and effective sample size.
 *
 * Sources: Gelman et al. (2013), Bayesian Data Analysis, 3rd ed., sections 11.4–11.5; Vehtari et al.
 * (2021), Bayesian Analysis 16:667–718, section 3. For a stationary AR(1) chain x_t = ρ·x_{t−1} + e_t the
 * integrated autocorrelation time is (1 + ρ)/(1 − ρ), so ESS = N·(1 − ρ)/(1 + ρ) (a standard result, e.g.
 * Geyer 1992, "Practical Markov chain Monte Carlo", Statistical Science 7:473–483, section 3).
 * Tolerances: the ESS estimate of a 4 × 50,000 AR(1) run scatters by a few per cent; 10 % is used.
 */
import { describe, expect, test } from 'vitest';
import { convergenceWarnings, effectiveSampleSize, splitRHat } from '@stats/bayes-diagnostics';
import { createRandom } from '@stats/random';

function ar1(chains: number, length: number, rho: number, seed: number, offsets: number[] = []): Float64Array {
  const random = createRandom(seed);
  const out = new Float64Array(chains * length);
  const scale = Math.sqrt(1 - rho * rho);
  for (let c = 0; c < chains; c++) {
    let x = random.normal();
    for (let t = 0; t < length; t++) {
      x = rho * x + scale * random.normal();
      out[c * length + t] = x + (offsets[c] ?? 0);
    }
  }
  return out;
}

describe('split R-hat', () => {
  test('is close to 1 for chains from the same distribution', () => {
    expect(Math.abs(splitRHat(ar1(4, 20_000, 0.5, 1), 4) - 1)).toBeLessThan(0.005);
  });

  test('rises above 1.01 when one chain sits elsewhere, and the warning says so', () => {
    const rHat = splitRHat(ar1(4, 5_000, 0.5, 2, [0, 0, 0, 0.5]), 4);
    expect(rHat).toBeGreaterThan(1.01);
    expect(convergenceWarnings({ mu: rHat }, { mu: 50_000 })).toEqual([expect.stringMatching(/^R-hat of mu is \d\.\d{3} \(above 1\.01\)/)]);
  });

  test('refuses draws that do not split into equal chains', () => {
    expect(() => splitRHat(new Float64Array(10), 3)).toThrow(/cannot be split into 3 equal chains/);
  });
});

describe('effective sample size', () => {
  test.each([0, 0.5, 0.9])('for AR(1) with ρ = %s it is N(1 − ρ)/(1 + ρ) within 10 %', (rho) => {
    const n = 4 * 50_000;
    const expected = (n * (1 - rho)) / (1 + rho);
    expect(Math.abs(effectiveSampleSize(ar1(4, 50_000, rho, 3), 4) / expected - 1)).toBeLessThan(0.1);
  });
});
