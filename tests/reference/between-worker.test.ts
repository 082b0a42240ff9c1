/**
 * Between-worker analysis against R.
 *
 * Source: tests/fixtures/stats/between-worker.json, made by tests/fixtures/stats/generate-between-worker.R
 * (R 4.2.2 from Debian's r-base-core; version recorded in the fixture):
 * - the ANOVA table of aov(log(value) ~ factor(worker)) (checked in the script against anova(lm(...))):
 *   sums of squares, degrees of freedom, mean squares, F and Pr(>F);
 * - for balanced data, nlme::lme(..., method = "REML") variance components, which coincide with the
 *   ANOVA estimators for balanced data when those are positive (Searle, Casella & McCulloch 1992 —
 *   from memory);
 * - n0, the ANOVA components, μy, R0.95 and P(worker mean > OEL) re-implemented in R from the same
 *   formulas (an independent implementation, not a published oracle).
 * No published worked example is used: none could be recalled reliably enough to serve as an oracle.
 *
 * Tolerances: 1e-10 relative for the ANOVA figures (double-precision sums over at most 30 values);
 * 1e-8 for the p-value (two different incomplete-beta implementations, each good to about 1e-14 relative,
 * near 1e-9 in the worst case); 1e-5 relative for REML (lme's optimizer stops at about 1e-6 to 1e-7).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, test } from 'vitest';
import { betweenWorkerAnalysis } from '@stats/between-worker';

interface Case {
  name: string;
  oel: number;
  worker: string[];
  values: number[];
  degreesOfFreedomBetween: number;
  degreesOfFreedomWithin: number;
  sumOfSquaresBetween: number;
  sumOfSquaresWithin: number;
  meanSquareBetween: number;
  meanSquareWithin: number;
  fStatistic: number;
  pValue: number;
  n0: number;
  withinVariance: number;
  betweenVariance: number;
  meanLog: number;
  ratio95: number;
  probabilityWorkerMeanAboveOel: number;
  reml: { betweenVariance: number; withinVariance: number } | null;
}
const fixture = JSON.parse(readFileSync(path.resolve(__dirname, '../fixtures/stats/between-worker.json'), 'utf8')) as {
  versions: { r: string };
  cases: Case[];
};

function close(actual: number, expected: number, relative: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relative * Math.max(Math.abs(expected), 1e-300));
}

describe('between-worker analysis against R (aov, lm, nlme)', () => {
  test('the fixture records the R version', () => {
    expect(fixture.versions.r).toMatch(/^R version \d/);
  });

  test.each(fixture.cases.map((c) => [c.name, c] as const))('%s: ANOVA table, components and derived figures agree', (_name, c) => {
    const result = betweenWorkerAnalysis(
      c.values.map((value, i) => ({ value, nonDetect: false, worker: c.worker[i] })),
      { oel: c.oel },
    );
    expect(result.degreesOfFreedomBetween).toBe(c.degreesOfFreedomBetween);
    expect(result.degreesOfFreedomWithin).toBe(c.degreesOfFreedomWithin);
    for (const field of [
      'sumOfSquaresBetween',
      'sumOfSquaresWithin',
      'meanSquareBetween',
      'meanSquareWithin',
      'fStatistic',
      'n0',
      'withinVariance',
      'meanLog',
      'ratio95',
    ] as const) {
      close(result[field], c[field], 1e-10);
    }
    if (c.betweenVariance === 0) expect(result.betweenVariance).toBe(0);
    else close(result.betweenVariance, c.betweenVariance, 1e-10);
    close(result.pValue, c.pValue, 1e-8);
    close(result.probabilityWorkerMeanAboveOel!, c.probabilityWorkerMeanAboveOel, 1e-8);
    expect(result.withinGsd).toBeCloseTo(Math.exp(Math.sqrt(c.withinVariance)), 12);
    if (c.reml) {
      close(result.betweenVariance, c.reml.betweenVariance, 1e-5);
      close(result.withinVariance, c.reml.withinVariance, 1e-5);
    }
  });
});
