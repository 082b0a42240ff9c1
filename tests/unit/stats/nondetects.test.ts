import { describe, expect, it } from 'vitest';
import { censoredLimits, checkNondetectSample, fitWithNondetects, NONDETECT_RULES, simulationLogLimits } from '../../../stats/nondetects';
import { censoredLognormalMle } from '../../../stats/censored-mle';
import { robustRos } from '../../../stats/ros';
import { createRandom } from '../../../stats/random';
import { normalCdf, normalQuantile, Z_95 } from '../../../stats/normal-distribution';
import type { ShiftValue } from '../../../stats/types';

const detect = (value: number): ShiftValue => ({ value, nonDetect: false });
const below = (limit: number): ShiftValue => ({ value: limit, nonDetect: true });

/** Lognormal results with one detection limit, from a fixed seed. */
function simulated(n: number, seed: number, limit: number): ShiftValue[] {
  const random = createRandom(seed);
  return Array.from({ length: n }, () => {
    const x = Math.exp(Math.log(0.1) + Math.log(2.5) * random.normal());
    return x < limit ? below(limit) : detect(x);
  });
}

// 12 results, 4 non-detects at 0.05 (33 %).
const small = [0.05, 0.21, 0.05, 0.09, 0.33, 0.05, 0.12, 0.6, 0.05, 0.15, 0.08, 1.1].map((v, i) => ([0, 2, 5, 8].includes(i) ? below(v) : detect(v)));

describe('fitWithNondetects refuses data the rules exclude, naming the rule', () => {
  it('fewer than 3 results', () => {
    expect(() => fitWithNondetects([detect(1), detect(2)])).toThrow(/fitWithNondetects: at least 3 results are needed, got 2/);
  });

  it('a detection limit of 0 or below, naming the result', () => {
    expect(() => fitWithNondetects([detect(1), detect(2), below(0), detect(3)])).toThrow(
      /fitWithNondetects: result 3 is a non-detect with detection limit 0; a detection limit must be a number > 0/,
    );
    expect(() => fitWithNondetects([detect(1), below(-0.5), detect(2), detect(3)])).toThrow(/result 2 is a non-detect with detection limit -0.5/);
  });

  it('a value that is not a positive number, naming the result', () => {
    expect(() => fitWithNondetects([detect(1), detect(Number.NaN), detect(3)])).toThrow(
      /fitWithNondetects: result 2 has value NaN; a value must be a number > 0/,
    );
  });

  it('more than 80 % non-detects', () => {
    // 13 of 16 = 81 %, with 3 detected values so that only the share rule applies.
    const values = [...Array.from({ length: 13 }, () => below(0.05)), detect(0.1), detect(0.2), detect(0.3)];
    expect(() => fitWithNondetects(values)).toThrow(/fitWithNondetects: more than 80 % of results are non-detects \(13 of 16\)/);
  });

  it('accepts exactly 80 % non-detects when 3 values are detected', () => {
    const values = [...Array.from({ length: 12 }, () => below(0.05)), detect(0.1), detect(0.2), detect(0.3)];
    expect(fitWithNondetects(values).method).toBe('ros');
  });

  it('fewer than 3 detected values', () => {
    expect(() => fitWithNondetects([below(0.05), below(0.05), below(0.05), detect(0.1), detect(0.2)])).toThrow(
      /fitWithNondetects: at least 3 detected values are needed, got 2/,
    );
  });

  it('all detected values equal', () => {
    expect(() => fitWithNondetects([below(0.05), detect(0.2), detect(0.2), detect(0.2)])).toThrow(
      /fitWithNondetects: all detected values are equal \(0.2\); their spread cannot be estimated/,
    );
  });

  it('a result without a boolean non-detect flag', () => {
    const bad = [detect(1), detect(2), { value: 3 } as unknown as ShiftValue];
    expect(() => checkNondetectSample(bad, 'someCaller')).toThrow(/someCaller: result 3 must have a boolean nonDetect flag/);
  });
});

describe('fitWithNondetects chooses the method by the documented rules', () => {
  it('without non-detects returns "complete" with the mean and SD (n − 1) of the logs', () => {
    const values = [0.2, 0.5, 0.9, 0.31, 0.12].map(detect);
    const logs = values.map((v) => Math.log(v.value));
    const mean = logs.reduce((a, b) => a + b, 0) / logs.length;
    const sd = Math.sqrt(logs.reduce((a, y) => a + (y - mean) ** 2, 0) / (logs.length - 1));
    const fit = fitWithNondetects(values);
    expect(fit.method).toBe('complete');
    expect(fit.mu).toBeCloseTo(mean, 14);
    expect(fit.sigma).toBeCloseTo(sd, 14);
    expect(fit.methodNote).toMatch(/Every result was detected/);
    expect(fit.plottingPositions).toBeUndefined();
  });

  it(`uses robust ROS below ${NONDETECT_RULES.maximumLikelihoodFromResults} results and says why`, () => {
    const fit = fitWithNondetects(small);
    const ros = robustRos(small);
    expect(fit.method).toBe('ros');
    expect(fit.mu).toBe(ros.mu);
    expect(fit.sigma).toBe(ros.sigma);
    expect(fit.methodNote).toMatch(/^4 of 12 results \(33 %\) were below one detection limit \(0\.05\)\./);
    expect(fit.methodNote).toMatch(/regression on order statistics/);
    expect(fit.methodNote).toMatch(/fewer than 50 results/);
  });

  it(`uses censored maximum likelihood from ${NONDETECT_RULES.maximumLikelihoodFromResults} results and says why`, () => {
    const values = simulated(60, 4711, 0.07);
    const nonDetects = values.filter((v) => v.nonDetect).length;
    expect(nonDetects).toBeGreaterThan(0);
    const fit = fitWithNondetects(values);
    const mle = censoredLognormalMle(values);
    expect(fit.method).toBe('censored-mle');
    expect(fit.mu).toBeCloseTo(mle.mu, 12);
    expect(fit.sigma).toBeCloseTo(mle.sigma, 12);
    expect(fit.methodNote).toMatch(new RegExp(`^${nonDetects} of 60 results`));
    expect(fit.methodNote).toMatch(/Maximum likelihood for censored data/);
    expect(fit.methodNote).toMatch(/50 or more results/);
  });

  it('names the range of several detection limits in the note', () => {
    const values = [below(0.02), detect(0.05), below(0.08), detect(0.11), detect(0.3), below(0.02), detect(0.07)];
    expect(fitWithNondetects(values).methodNote).toMatch(/^3 of 7 results \(43 %\) were below 2 detection limits \(0\.02 to 0\.08\)\./);
  });

  it('gives one plotting position per result, in input order, with non-detects on the fitted line', () => {
    const ros = fitWithNondetects(small);
    expect(ros.plottingPositions).toHaveLength(small.length);
    ros.plottingPositions!.forEach((point, i) => {
      expect(point.nonDetect).toBe(small[i].nonDetect);
      if (!point.nonDetect) expect(point.value).toBe(small[i].value);
    });
    const imputed = robustRos(small)
      .points.filter((p) => p.nonDetect)
      .map((p) => p.estimate);
    expect(ros.plottingPositions!.filter((p) => p.nonDetect).map((p) => p.value)).toEqual(imputed);

    const values = simulated(60, 4711, 0.07);
    const mle = fitWithNondetects(values);
    for (const point of mle.plottingPositions!.filter((p) => p.nonDetect)) {
      expect(Math.log(point.value)).toBeCloseTo(mle.mu + mle.sigma * normalQuantile(point.p), 12);
    }
  });
});

describe('simulationLogLimits', () => {
  it('gives a non-detect its own limit and a detected result the highest reported limit not above it', () => {
    const limits = simulationLogLimits([below(0.5), detect(0.7), below(2), detect(3), detect(0.2)]);
    expect(limits).toEqual([Math.log(0.5), Math.log(0.5), Math.log(2), Math.log(2), -Infinity]);
  });
});

describe('censoredLimits', () => {
  const fit = fitWithNondetects(small);

  it('gives identical limits for the same seed', () => {
    const first = censoredLimits(small, fit, 1, { seed: 20240601 });
    const second = censoredLimits(small, fit, 1, { seed: 20240601 });
    expect(second).toEqual(first);
  });

  it('gives different but similar limits for another seed', () => {
    const first = censoredLimits(small, fit, 1, { seed: 20240601 });
    const other = censoredLimits(small, fit, 1, { seed: 20240602 });
    expect(other.utl95_95).not.toBe(first.utl95_95);
    // Monte-Carlo noise of a 2,000-draw 95th percentile is a few per cent here; 15 % is far outside it.
    expect(Math.abs(other.utl95_95 / first.utl95_95 - 1)).toBeLessThan(0.15);
  });

  it('orders the limits sensibly around the point estimates', () => {
    const limits = censoredLimits(small, fit, 1, { seed: 7 });
    const p95 = Math.exp(fit.mu + Z_95 * fit.sigma);
    const exceedance = 1 - normalCdf((Math.log(1) - fit.mu) / fit.sigma);
    const mean = Math.exp(fit.mu + fit.sigma ** 2 / 2);
    expect(limits.utl95_95).toBeGreaterThan(p95);
    expect(limits.exceedanceFractionLower).toBeLessThan(exceedance);
    expect(limits.exceedanceFractionUpper).toBeGreaterThan(exceedance);
    expect(limits.exceedanceFractionUpper).toBeLessThanOrEqual(1);
    expect(limits.exceedanceFractionLower).toBeGreaterThanOrEqual(0);
    expect(limits.amLcl95).toBeLessThan(mean);
    expect(limits.amUcl95).toBeGreaterThan(mean);
  });

  it('records the method, replicate count and seed', () => {
    const limits = censoredLimits(small, fit, 1, { seed: 99, replicates: 500 });
    expect(limits.method).toMatch(/Parametric bootstrap/);
    expect(limits.method).toMatch(/500 simulated data sets of 12 results/);
    expect(limits.method).toMatch(/robust ROS/);
    expect(limits.method).toMatch(/seed 99/);
  });

  it('refits by censored maximum likelihood when the fit used it', () => {
    const values = simulated(60, 4711, 0.07);
    const mleFit = fitWithNondetects(values);
    const limits = censoredLimits(values, mleFit, 1, { seed: 3, replicates: 400 });
    expect(limits.method).toMatch(/censored maximum likelihood/);
    expect(limits.utl95_95).toBeGreaterThan(Math.exp(mleFit.mu + Z_95 * mleFit.sigma));
  });

  it('refuses a fit that was not made from these values', () => {
    const other = { ...fit, mu: fit.mu + 0.1 };
    expect(() => censoredLimits(small, other, 1, { seed: 1 })).toThrow(/censoredLimits: the fit .* is not the robust ROS estimate for these values/);
    expect(() => censoredLimits(small, { ...fit, method: 'complete' }, 1, { seed: 1 })).toThrow(
      /censoredLimits: a 'complete' fit cannot describe results that include non-detects/,
    );
  });

  it('refuses a bad OEL, seed or replicate count with messages naming them', () => {
    expect(() => censoredLimits(small, fit, 0, { seed: 1 })).toThrow(/censoredLimits: the OEL must be a number > 0, got 0/);
    expect(() => censoredLimits(small, fit, 1, { seed: 0 })).toThrow(/censoredLimits: seed must be an integer from 1 to 4294967295, got 0/);
    expect(() => censoredLimits(small, fit, 1, { seed: 1, replicates: 50 })).toThrow(
      /censoredLimits: replicates must be an integer from 200 to 1000000, got 50/,
    );
  });

  it('applies the same refusal rules to the values', () => {
    expect(() => censoredLimits([below(0.05), detect(0.2), detect(0.2), detect(0.2)], fit, 1, { seed: 1 })).toThrow(
      /censoredLimits: all detected values are equal/,
    );
  });

  it('says the limits cannot be computed when most simulated surveys would be refused', () => {
    // One non-detect at 1 and detections at 1, 1.001 and 1.02: the fit puts about half of all
    // results below the limit, so most simulated surveys have fewer than 3 detected values.
    const values = [below(1), detect(1), detect(1.001), detect(1.02)];
    expect(() => censoredLimits(values, fitWithNondetects(values), 5, { seed: 1 })).toThrow(
      /censoredLimits: more than half of \d+ simulated data sets broke the rules for non-detects .* more results are needed/,
    );
  });
});
