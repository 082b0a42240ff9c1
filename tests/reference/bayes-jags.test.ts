/**
 * The Bayesian view against JAGS on the same model, prior and data (censored and interval-censored).
 *
 * Source: tests/fixtures/stats/bayes-jags.json, made by tests/fixtures/stats/generate-bayes-jags.R with
 * JAGS 4.3.1 through rjags (Debian's jags and r-cran-rjags; versions recorded in the fixture): 4 chains ×
 * 25,000 draws after 5,000, R's type-7 quantiles of each quantity, category probabilities, and coda's
 * effective sample size of each quantity.
 *
 * Tolerance, from Monte-Carlo error: two independent samplers estimate the same posterior quantile q_p.
 * Evaluated on our draws, the JAGS quantile should sit at our empirical probability p, off by the MC error
 * of both: |F̂_ours(q_JAGS) − p| ≤ 4·√(p(1 − p)·(1/ESS_ours + 1/ESS_JAGS)) (the binomial error of a
 * quantile's probability level with effective sample sizes; 4 SE, so a correct sampler fails about once in
 * 15,000 comparisons). The same bound applies to each category probability, plus 1/100,000 for a
 * probability that is exactly 0 in one sampler.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, test } from 'vitest';
import { sampleLognormalPosterior } from '@stats/bayes-gibbs';
import { effectiveSampleSize } from '@stats/bayes-diagnostics';
import { bayesianView } from '@stats/bayes-view';
import { normalQuantile, Z_95 } from '@stats/normal-distribution';
import type { ShiftValue } from '@stats/types';

interface Summary {
  lower: number;
  median: number;
  q95: number;
  upper: number;
  ess: number;
}
interface JagsCase {
  name: string;
  oel: number;
  values: number[];
  nonDetect: boolean[];
  lower: number[];
  mu: Summary;
  sigma: Summary;
  gm: Summary;
  gsd: Summary;
  p95: Summary;
  am: Summary;
  exceedanceFraction: Summary;
  categoryProbabilities: number[];
}
interface JagsFixture {
  versions: Record<string, string>;
  settings: { chains: number; burnIn: number; kept: number };
  cases: JagsCase[];
}

const fixture = JSON.parse(readFileSync(path.resolve(__dirname, '../fixtures/stats/bayes-jags.json'), 'utf8')) as JagsFixture;

function shiftValues(c: JagsCase): ShiftValue[] {
  return c.values.map((value, i) => (c.lower[i] > 0 ? { value, nonDetect: true, lower: c.lower[i] } : { value, nonDetect: c.nonDetect[i] }));
}

const LEVELS = [
  ['lower', 0.025],
  ['median', 0.5],
  ['q95', 0.95],
  ['upper', 0.975],
] as const;

describe('Bayesian view against JAGS (same model, reference prior, same data)', () => {
  test('the fixture records the JAGS, rjags and R versions and the run settings', () => {
    expect(fixture.versions.jags).toMatch(/^\d+\.\d+\.\d+$/);
    expect(fixture.versions.rjags).toBeTruthy();
    expect(fixture.versions.r).toMatch(/^R version/);
    expect(fixture.settings).toMatchObject({ chains: 4, burnIn: 5000, kept: 25000 });
  });

  test.each(fixture.cases.map((c) => [c.name, c] as const))('%s: posterior quantiles and category probabilities agree', (_name, c) => {
    const values = shiftValues(c);
    const draws = sampleLognormalPosterior(values, { settings: { seed: 777 } });
    const { mu, sigma, chains } = draws;
    const total = mu.length;
    const logOel = Math.log(c.oel);
    // Each quantity on a scale where it is a monotone function of the draw, with the JAGS value mapped onto it.
    const quantities: [string, Float64Array, Summary, (x: number) => number][] = [
      ['mu', mu, c.mu, (x) => x],
      ['sigma', sigma, c.sigma, (x) => x],
      ['gm', mu, c.gm, Math.log],
      ['gsd', sigma, c.gsd, Math.log],
      ['p95', mu.map((m, i) => m + Z_95 * sigma[i]), c.p95, Math.log],
      ['am', mu.map((m, i) => m + 0.5 * sigma[i] * sigma[i]), c.am, Math.log],
      // Exceedance fraction = Φ(w) with w = (μ − ln OEL)/σ, increasing in w; the JAGS value maps to Φ⁻¹(EF).
      ['exceedanceFraction', mu.map((m, i) => (m - logOel) / sigma[i]), c.exceedanceFraction, (x) => (x > 0 ? normalQuantile(x) : -Infinity)],
    ];
    for (const [name, series, jags, toScale] of quantities) {
      const ess = effectiveSampleSize(series, chains);
      for (const [field, p] of LEVELS) {
        const threshold = toScale(jags[field]);
        let below = 0;
        for (let i = 0; i < total; i++) if (series[i] <= threshold) below++;
        const tolerance = 4 * Math.sqrt(p * (1 - p) * (1 / ess + 1 / jags.ess));
        expect(Math.abs(below / total - p), `${name} ${field}: JAGS ${jags[field]} sits at our level ${below / total}`).toBeLessThanOrEqual(tolerance);
      }
    }
    const view = bayesianView(values, { oel: c.oel, settings: { seed: 777 } });
    const essP95 = effectiveSampleSize(quantities[4][1], chains);
    view.categoryProbabilities!.forEach((ours, k) => {
      const theirs = c.categoryProbabilities[k];
      const p = (ours + theirs) / 2;
      const tolerance = 4 * Math.sqrt(p * (1 - p) * (1 / essP95 + 1 / c.p95.ess)) + 1e-5;
      expect(Math.abs(ours - theirs), `category ${k}`).toBeLessThanOrEqual(tolerance);
    });
    expect(view.diagnostics.warnings).toEqual([]);
  });
});
