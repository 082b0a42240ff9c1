/**
 * Bayesian view: reproducibility, diagnostics, priors, summaries, judgement and refusals.
 *
 * Sources: the conjugate normal model (Gelman et al. 2013, Bayesian Data Analysis, 3rd ed., section 3.3)
 * for the past-data prior, which must equal pooling the past results with the new ones; Abramowitz &
 * Stegun (1964) 6.3.2, 6.3.3, 6.4.2 and 6.4.4 for ψ(1) = −γ, ψ(½) = −γ − 2 ln 2, ψ1(1) = π²/6 and
 * ψ1(½) = π²/2; the judgement rule of docs/decisions/003-bayesian-view.md. Data are invented, in the
 * demo scenario of PRODUCT.md (the demo seed holds no shift results yet, so these stand in for its groups).
 */
import { describe, expect, test } from 'vitest';
import { sampleLognormalPosterior } from '@stats/bayes-gibbs';
import { bayesianView, toAssessBayesOutput } from '@stats/bayes-view';
import { bayesianJudgement, categoryProbabilities } from '@stats/bayes-summary';
import { digamma, resolveBayesPrior, trigamma } from '@stats/bayes-priors';
import { createRandom } from '@stats/random';
import type { ShiftValue } from '@stats/types';

function group(seed: number, n: number, gm: number, gsd: number, limit = 0): ShiftValue[] {
  const random = createRandom(seed);
  return Array.from({ length: n }, () => {
    const value = Number(Math.exp(Math.log(gm) + Math.log(gsd) * random.normal()).toPrecision(4));
    return value < limit ? { value: limit, nonDetect: true } : { value, nonDetect: false };
  });
}

const FAST = { kept: 5_000, burnIn: 1_000 };

describe('reproducibility', () => {
  test('the same seed gives identical draws and an identical record; another seed gives other draws', () => {
    const data = group(1, 12, 0.4, 2.2, 0.2);
    const a = sampleLognormalPosterior(data, { settings: { seed: 42, ...FAST } });
    const b = sampleLognormalPosterior(data, { settings: { seed: 42, ...FAST } });
    const c = sampleLognormalPosterior(data, { settings: { seed: 43, ...FAST } });
    expect(Buffer.from(a.mu.buffer).equals(Buffer.from(b.mu.buffer))).toBe(true);
    expect(Buffer.from(a.sigma.buffer).equals(Buffer.from(b.sigma.buffer))).toBe(true);
    expect(Buffer.from(a.mu.buffer).equals(Buffer.from(c.mu.buffer))).toBe(false);
    expect(bayesianView(data, { oel: 1, settings: { seed: 42, ...FAST } })).toEqual(bayesianView(data, { oel: 1, settings: { seed: 42, ...FAST } }));
  });
});

describe('diagnostics on typical groups (invented, after the demo scenario)', () => {
  test.each([
    ['head sawyer, inhalable wood dust, 8 results, 2 non-detects', group(11, 8, 0.9, 2.3, 0.5), 5],
    ['cutter, respirable silica, 10 results, about 40 % non-detects', group(12, 10, 0.02, 2.6, 0.02), 0.05],
    ['planer feeder, noise dose %, 12 results', group(13, 12, 85, 1.6), 100],
    ['polisher, silica, 30 results, 30 % non-detects', group(14, 30, 0.01, 2.2, 0.008), 0.05],
    ['installer, silica, 6 results, one interval-censored', [...group(15, 5, 0.03, 2, 0.01), { value: 0.02, nonDetect: true, lower: 0.01 }], 0.05],
  ])('%s: R-hat ≤ 1.01, ESS ≥ 1,000 and no warning with the default run', (_name, data, oel) => {
    const view = bayesianView(data, { oel });
    expect(view.diagnostics.rHat.mu).toBeLessThanOrEqual(1.01);
    expect(view.diagnostics.rHat.sigma).toBeLessThanOrEqual(1.01);
    expect(view.diagnostics.effectiveSampleSize.mu).toBeGreaterThanOrEqual(1_000);
    expect(view.diagnostics.effectiveSampleSize.sigma).toBeGreaterThanOrEqual(1_000);
    expect(view.diagnostics.warnings).toEqual([]);
    expect(view.diagnostics).toMatchObject({ chains: 4, burnIn: 5_000, kept: 25_000 });
  });

  test('a run too short for heavy censoring is warned about in plain words', () => {
    const data = group(12, 10, 0.02, 2.6, 0.02);
    const view = bayesianView(data, { oel: 0.05, settings: { kept: 60, burnIn: 0, chains: 2 } });
    expect(view.diagnostics.warnings.some((w) => /effective sample size of (mu|sigma) is \d+ \(below 1000\)/.test(w))).toBe(true);
  });
});

describe('summaries, categories and judgement', () => {
  test('summaries are ordered, category probabilities sum to 1 and P(P95 > OEL) is the last of them', () => {
    const view = bayesianView(group(21, 15, 0.3, 2.5, 0.1), { oel: 1, settings: FAST });
    for (const s of [view.gm, view.gsd, view.p95, view.arithmeticMean, view.exceedanceFraction!]) {
      expect(s.lower).toBeLessThan(s.median);
      expect(s.median).toBeLessThan(s.q95);
      expect(s.q95).toBeLessThan(s.upper);
    }
    const sum = view.categoryProbabilities!.reduce((a, b) => a + b, 0);
    expect(Math.abs(sum - 1)).toBeLessThan(1e-12);
    expect(view.probabilityP95AboveOel).toBe(view.categoryProbabilities![4]);
    expect(view.prior.name).toBe('reference');
    expect(view.prior.parameters).toMatchObject({ muLower: -30, muUpper: 30, sigmaLower: 0.001, sigmaUpper: 10 });
  });

  test('without an OEL the OEL-based figures and the judgement are null', () => {
    const view = bayesianView(group(22, 8, 1, 2), { settings: FAST });
    expect(view.exceedanceFraction).toBeNull();
    expect(view.categoryProbabilities).toBeNull();
    expect(view.judgement).toBeNull();
    expect(view.gm.median).toBeGreaterThan(0);
  });

  test('the assess output has exactly the fields of PRODUCT.md', () => {
    const out = toAssessBayesOutput(bayesianView(group(23, 8, 1, 2), { oel: 5, settings: FAST }));
    expect(Object.keys(out).sort()).toEqual(['categoryProbabilities', 'exceedanceFraction', 'gm', 'gsd', 'p95']);
    expect(Object.keys(out.gm).sort()).toEqual(['lower', 'median', 'q95', 'upper']);
    expect(out.categoryProbabilities).toHaveLength(5);
  });

  test.each([
    [0.3, 0.3, 'unacceptable'],
    [0.2999, 0.3, 'uncertain'],
    [0.05, 0.3, 'acceptable'],
    [0.0501, 0.3, 'uncertain'],
    [0.2, 0.2, 'unacceptable'],
  ] as const)('P(P95 > OEL) = %s with threshold %s is judged %s', (p, threshold, expected) => {
    expect(bayesianJudgement(p, threshold)).toBe(expected);
  });

  test('a judgement threshold at or below 0.05 or above 1 is refused', () => {
    expect(() => bayesianJudgement(0.1, 0.05)).toThrow(/unacceptableThreshold must be above 0.05/);
    expect(() => bayesianView(group(24, 6, 1, 2), { oel: 1, unacceptableThreshold: 1.5 })).toThrow(RangeError);
  });

  test('category bands are closed above: a P95 exactly at 10 % of the OEL is category 1', () => {
    const oel = 2;
    const probabilities = categoryProbabilities(Float64Array.from([Math.log(0.1 * oel), Math.log(0.011 * oel), Math.log(3)]), oel);
    expect(probabilities).toEqual([0, 2 / 3, 0, 0, 1 / 3]);
  });
});

describe('priors', () => {
  test('a past-data prior worth n0 results gives the posterior of the pooled results (conjugate update)', () => {
    const past = group(31, 10, 0.5, 2).map((v) => v.value);
    const logs = past.map(Math.log);
    const mean = logs.reduce((a, b) => a + b, 0) / logs.length;
    const sd = Math.sqrt(logs.reduce((a, y) => a + (y - mean) ** 2, 0) / (logs.length - 1));
    const current = group(32, 6, 0.7, 2);
    const withPrior = bayesianView(current, {
      prior: { kind: 'past-data', gm: Math.exp(mean), gsd: Math.exp(sd), equivalentSamples: 10 },
      settings: { seed: 5 },
    });
    const pooled = bayesianView([...current, ...past.map((value) => ({ value, nonDetect: false }))], { settings: { seed: 6 } });
    expect(withPrior.prior).toMatchObject({ name: 'past-data', parameters: { equivalentSamples: 10 } });
    // Two independent 100,000-draw runs of the same posterior: medians within 1 % (their MC error is ~0.1 %).
    for (const key of ['gm', 'gsd', 'p95'] as const) {
      expect(Math.abs(withPrior[key].median / pooled[key].median - 1)).toBeLessThan(0.01);
      expect(Math.abs(withPrior[key].upper / pooled[key].upper - 1)).toBeLessThan(0.02);
    }
  });

  test('the informative GSD prior pulls a 3-result GSD toward its median and is recorded with its parameters', () => {
    const data: ShiftValue[] = [
      { value: 1, nonDetect: false },
      { value: 1.1, nonDetect: false },
      { value: 0.95, nonDetect: false },
    ];
    const reference = bayesianView(data, { settings: FAST });
    const informed = bayesianView(data, { prior: { kind: 'informative-gsd' }, settings: FAST });
    expect(informed.gsd.median).toBeGreaterThan(reference.gsd.median);
    expect(informed.prior).toMatchObject({ name: 'informative-gsd', parameters: { medianGsd: 2.5, logSigmaSd: 0.5 } });
    expect(informed.diagnostics.sigmaAcceptanceRate).toBeGreaterThan(0);
    expect(informed.diagnostics.sigmaAcceptanceRate).toBeLessThan(1);
  });

  test('a previous posterior used as prior keeps the moments it was given (moment matching round trip)', () => {
    const earlier = bayesianView(group(33, 20, 2, 1.8), { settings: { seed: 9 } });
    const prior = resolveBayesPrior({ kind: 'previous-posterior', moments: earlier.moments });
    // For σ² ~ scaled-inv-χ²(ν0, s0²): E ln σ = ½(ln(ν0 s0²) − ψ(ν0/2) − ln 2) and Var ln σ = ψ1(ν0/2)/4.
    const s0Squared = prior.nu0s0Squared / prior.nu0;
    const logSigmaMean = 0.5 * (Math.log(prior.nu0 * s0Squared) - digamma(prior.nu0 / 2) - Math.LN2);
    expect(logSigmaMean).toBeCloseTo(earlier.moments.logSigmaMean, 10);
    expect(Math.sqrt(trigamma(prior.nu0 / 2) / 4)).toBeCloseTo(earlier.moments.logSigmaSd, 10);
    expect(prior.mean0).toBe(earlier.moments.muMean);
    // ~20 results of information in, about 20 out.
    expect(prior.kappa0).toBeGreaterThan(14);
    expect(prior.kappa0).toBeLessThan(26);
  });

  test('digamma and trigamma match their closed forms (Abramowitz & Stegun 6.3.2, 6.3.3, 6.4.2, 6.4.4)', () => {
    const gamma = 0.5772156649015329;
    expect(Math.abs(digamma(1) + gamma)).toBeLessThan(1e-14);
    expect(Math.abs(digamma(0.5) + gamma + 2 * Math.LN2)).toBeLessThan(1e-14);
    expect(Math.abs(trigamma(1) - Math.PI ** 2 / 6)).toBeLessThan(1e-14);
    expect(Math.abs(trigamma(0.5) - Math.PI ** 2 / 2)).toBeLessThan(1e-13);
  });

  test('bad prior parameters are refused with the rule', () => {
    expect(() => resolveBayesPrior({ kind: 'past-data', gm: 1, gsd: 2, equivalentSamples: 1 })).toThrow(/equivalentSamples > 1/);
    expect(() => resolveBayesPrior({ kind: 'informative-gsd', medianGsd: 0.9 })).toThrow(/medianGsd > 1/);
    expect(() => resolveBayesPrior({ kind: 'reference', bounds: { muLower: 1, muUpper: 0, sigmaLower: 0.1, sigmaUpper: 1 } })).toThrow(/muLower < muUpper/);
  });
});

describe('refusals', () => {
  test.each([
    ['fewer than 2 results', [{ value: 1, nonDetect: false }], /at least 2 results/],
    [
      'a value that is not a positive number',
      [
        { value: 1, nonDetect: false },
        { value: -2, nonDetect: false },
      ],
      /result 2: value must be a finite number > 0/,
    ],
    [
      'a single detected result',
      [
        { value: 1, nonDetect: false },
        { value: 0.5, nonDetect: true },
        { value: 0.5, nonDetect: true },
      ],
      /at least 2 detected results with different values/,
    ],
    [
      'equal detected results',
      [
        { value: 1, nonDetect: false },
        { value: 1, nonDetect: false },
      ],
      /different values/,
    ],
    [
      'an interval whose lower bound is not below the value',
      [
        { value: 1, nonDetect: false },
        { value: 2, nonDetect: false },
        { value: 1, nonDetect: true, lower: 1 },
      ],
      /result 3: interval lower bound/,
    ],
  ] as const)('%s is refused with a RangeError naming the rule', (_name, data, message) => {
    expect(() => bayesianView(data as readonly ShiftValue[], { oel: 1 })).toThrow(RangeError);
    expect(() => bayesianView(data as readonly ShiftValue[], { oel: 1 })).toThrow(message);
  });

  test('bad run settings and OEL are refused', () => {
    const data = group(41, 5, 1, 2);
    expect(() => sampleLognormalPosterior(data, { settings: { chains: 0 } })).toThrow(/chains must be an integer from 1 to 64/);
    expect(() => sampleLognormalPosterior(data, { settings: { seed: 0 } })).toThrow(/seed must be an integer/);
    expect(() => bayesianView(data, { oel: 0 })).toThrow(/oel must be a finite number > 0/);
  });
});
