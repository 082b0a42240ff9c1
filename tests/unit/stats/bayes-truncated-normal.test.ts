/**
 * Truncated standard normal draws and the AS 241 normal quantile.
 *
 * Sources: R 4.2.2 qnorm (which implements Wichura's AS 241) for the quantiles, printed to 17 digits by
 * `Rscript -e 'print(qnorm(c(1e-300, 1e-20, 0.075, 0.3)), digits = 17)'`; the mean of a truncated standard
 * normal, (φ(a) − φ(b))/(Φ(b) − Φ(a)) (Johnson, Kotz & Balakrishnan 1994, Continuous Univariate
 * Distributions vol. 1, 2nd ed., eq. 13.134), and, for the far tails, its asymptotic form; the
 * Kolmogorov–Smirnov 1 % critical value 1.628/√n (Kolmogorov's limiting distribution).
 */
import { describe, expect, test } from 'vitest';
import erfcinv from '@stdlib/math-base-special-erfcinv';
import { inverseStandardNormal, truncatedStandardNormal } from '@stats/bayes-truncated-normal';
import { normalCdf, normalDensity } from '@stats/normal-distribution';
import { createRandom } from '@stats/random';

describe('inverseStandardNormal (AS 241)', () => {
  test.each([
    [1e-300, -37.04709629936120052],
    [1e-20, -9.26234008979840517],
    [0.075, -1.43953147093845568],
    [0.3, -0.52440051270804067],
  ])('Φ⁻¹(%s) matches R qnorm to 1e-14 relative', (p, expected) => {
    expect(Math.abs(inverseStandardNormal(p) / expected - 1)).toBeLessThan(1e-14);
  });

  test('agrees with −√2·erfcinv(2p) from @stdlib (a different algorithm) across the range', () => {
    for (const p of [1e-200, 1e-50, 1e-8, 0.001, 0.02, 0.0749, 0.0751, 0.2, 0.5, 0.7, 0.9249, 0.93, 0.999, 1 - 1e-9]) {
      const reference = -Math.SQRT2 * erfcinv(2 * p);
      expect(Math.abs(inverseStandardNormal(p) - reference)).toBeLessThanOrEqual(2e-15 * Math.max(1, Math.abs(reference)));
    }
  });
});

function sampleMean(lower: number, upper: number, draws: number, seed: number): { mean: number; sd: number; all: number[] } {
  const random = createRandom(seed);
  const all: number[] = [];
  for (let i = 0; i < draws; i++) all.push(truncatedStandardNormal(random, lower, upper));
  const mean = all.reduce((a, b) => a + b, 0) / draws;
  const sd = Math.sqrt(all.reduce((a, x) => a + (x - mean) ** 2, 0) / (draws - 1));
  return { mean, sd, all };
}

describe('truncatedStandardNormal', () => {
  test.each([
    ['left-censored, inversion below zero', -Infinity, -1],
    ['upper tail, inversion above zero', 2, Infinity],
    ['straddling zero', -0.5, 1.5],
    ['narrow interval in the upper half', 1.2, 1.25],
  ])('%s: every draw lies inside the bounds and the mean matches the closed form within 4 SE', (_name, a, b) => {
    const draws = 40_000;
    const { mean, sd, all } = sampleMean(a, b, draws, 17);
    expect(all.every((x) => x > a && x < b)).toBe(true);
    const mass = normalCdf(b) - normalCdf(a);
    const expected = ((a === -Infinity ? 0 : normalDensity(a)) - (b === Infinity ? 0 : normalDensity(b))) / mass;
    expect(Math.abs(mean - expected)).toBeLessThanOrEqual((4 * sd) / Math.sqrt(draws));
  });

  test('left-censored draws follow the truncated distribution (Kolmogorov–Smirnov at 1 %)', () => {
    const b = -0.7;
    const draws = 20_000;
    const { all } = sampleMean(-Infinity, b, draws, 5);
    all.sort((x, y) => x - y);
    let distance = 0;
    all.forEach((x, i) => {
      const cdf = normalCdf(x) / normalCdf(b);
      distance = Math.max(distance, Math.abs(cdf - i / draws), Math.abs(cdf - (i + 1) / draws));
    });
    expect(distance).toBeLessThan(1.628 / Math.sqrt(draws));
  });

  test.each([
    ['far upper tail (exponential rejection)', 40, Infinity],
    ['far lower tail, mirrored', -Infinity, -40],
    ['narrow far-tail interval (uniform rejection)', 40, 40.01],
  ])('%s: draws stay inside and sit at the asymptotic mean', (_name, a, b) => {
    const { mean, all } = sampleMean(a, b, 5_000, 23);
    expect(all.every((x) => x >= a && x <= b)).toBe(true);
    // Beyond 40 SD the excess over the bound is close to exponential with rate |bound| (Mills' ratio,
    // mean about 1/40); inside (40, 40.01) it is that exponential truncated at 0.01, mean
    // 1/40 − 0.01/(e^0.4 − 1) ≈ 0.004667. Tolerances are about 5 SE of 5,000 draws.
    if (b === Infinity) expect(Math.abs(mean - (40 + 1 / 40))).toBeLessThan(0.003);
    else if (a === -Infinity) expect(Math.abs(mean + 40 + 1 / 40)).toBeLessThan(0.003);
    else expect(Math.abs(mean - (40 + 1 / 40 - 0.01 / Math.expm1(0.4)))).toBeLessThan(0.0002);
  });

  test('refuses bounds that are not increasing', () => {
    expect(() => truncatedStandardNormal(createRandom(1), 1, 1)).toThrow(RangeError);
    expect(() => truncatedStandardNormal(createRandom(1), Number.NaN, 1)).toThrow(/lower must be below upper/);
  });
});
