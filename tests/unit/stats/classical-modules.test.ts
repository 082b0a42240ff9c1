import { describe, expect, it } from 'vitest';
import { describeShiftValues, medianOfSorted } from '@stats/descriptive';
import { en689Assessment, en689PreliminaryTest, en689ReassessmentMonths, en689StatisticalTest, en689Ut } from '@stats/en689';
import { exceedanceFraction, exceedanceFractionLimit } from '@stats/exceedance-fraction';
import { exposureCategory, exposureCategoryDescription } from '@stats/exposure-category';
import { CLASSICAL_JUDGEMENT_RULES, classicalJudgement, judgementSentence } from '@stats/judgement';
import { logScaleSummary } from '@stats/log-scale-summary';
import { blomPositions, logProbabilityPlot, logProbabilityPlotFromPositions } from '@stats/probability-plot';
import type { ShiftValue } from '@stats/types';

const detected = (values: readonly number[]): ShiftValue[] => values.map((value) => ({ value, nonDetect: false }));

describe('exposure category (bands at 1, 10, 50 and 100 % of the OEL; Hewett et al. 2006)', () => {
  it('puts a value on a band edge in the lower category and just above it in the next', () => {
    expect(exposureCategory(0.01, 1)).toBe(0);
    expect(exposureCategory(0.0100001, 1)).toBe(1);
    expect(exposureCategory(0.1, 1)).toBe(1);
    expect(exposureCategory(0.5, 1)).toBe(2);
    expect(exposureCategory(1, 1)).toBe(3);
    expect(exposureCategory(1.000001, 1)).toBe(4);
    expect(exposureCategory(0, 1)).toBe(0);
  });

  it('describes each category with its band and refuses a bad OEL', () => {
    expect(exposureCategoryDescription(2)).toBe('Category 2: the 95th percentile is above 10 % and at most 50 % of the OEL.');
    expect(() => exposureCategory(0.5, 0)).toThrow(/exposureCategory: the OEL must be/);
  });
});

describe('classical judgement', () => {
  it('is acceptable when the UTL is at or below the OEL, unacceptable when the P95 estimate is above it, else uncertain', () => {
    expect(classicalJudgement({ p95: 0.4, utl95_95: 1, oel: 1 })).toBe('acceptable');
    expect(classicalJudgement({ p95: 0.4, utl95_95: 1.01, oel: 1 })).toBe('uncertain');
    expect(classicalJudgement({ p95: 1, utl95_95: 3, oel: 1 })).toBe('uncertain');
    expect(classicalJudgement({ p95: 1.01, utl95_95: 3, oel: 1 })).toBe('unacceptable');
  });

  it('checks the unacceptable rule first, so inconsistent limits never give the milder judgement', () => {
    expect(classicalJudgement({ p95: 1.2, utl95_95: 0.9, oel: 1 })).toBe('unacceptable');
    expect(CLASSICAL_JUDGEMENT_RULES.order).toMatch(/checked first/);
  });

  it('explains each judgement to a manager in one sentence and refuses non-positive inputs', () => {
    expect(judgementSentence('acceptable')).toBe(
      'Exposures in this group are well controlled: we are 95 % confident that fewer than 5 % of shifts exceed the limit.',
    );
    expect(judgementSentence('unacceptable')).toMatch(/^Exposures in this group are too high/);
    expect(judgementSentence('uncertain')).toMatch(/more shift measurements are needed\.$/);
    expect(() => classicalJudgement({ p95: Number.NaN, utl95_95: 1, oel: 1 })).toThrow(/classicalJudgement: p95 must be a finite number > 0/);
  });
});

describe('EN 689:2018 tests', () => {
  it('preliminary test: all below 0.1 × OELV for 3 results is compliant, one above the OELV non-compliant, otherwise no decision', () => {
    expect(en689PreliminaryTest(detected([0.05, 0.08, 0.09]), 1)).toBe('compliant');
    expect(en689PreliminaryTest(detected([0.05, 0.08, 1.2]), 1)).toBe('non-compliant');
    expect(en689PreliminaryTest(detected([0.05, 0.08, 0.11]), 1)).toBe('no-decision');
    // 4 results: threshold 0.15; 5 results: 0.2 (REFERENCES.md, from memory).
    expect(en689PreliminaryTest(detected([0.05, 0.08, 0.11, 0.14]), 1)).toBe('compliant');
    expect(en689PreliminaryTest(detected([0.05, 0.08, 0.11, 0.14, 0.19]), 1)).toBe('compliant');
  });

  it('preliminary test counts a non-detect at its detection limit and never as above the OELV', () => {
    expect(en689PreliminaryTest([{ value: 0.05, nonDetect: true }, ...detected([0.02, 0.03])], 1)).toBe('compliant');
    expect(en689PreliminaryTest([{ value: 2, nonDetect: true }, ...detected([0.02, 0.03])], 1)).toBe('no-decision');
  });

  it('statistical test: UR = (ln OELV − ln GM)/ln GSD against UT, compliant exactly when UR ≥ UT', () => {
    const summary = { n: 6, mean: Math.log(0.1), sd: Math.log(2) };
    const { ur, ut, result } = en689StatisticalTest(summary, 1);
    expect(ur).toBeCloseTo(Math.log(10) / Math.log(2), 12); // 3.3219
    expect(ut).toBe(en689Ut(6));
    expect(result).toBe('compliant');
    // Move the GM so that UR sits just below UT (2.187 for n = 6, EN 689 Table F.1): non-compliant.
    const justBelow = { n: 6, mean: -(en689Ut(6) - 1e-9) * Math.log(2), sd: Math.log(2) };
    expect(en689StatisticalTest(justBelow, 1).result).toBe('non-compliant');
  });

  it('gives the reassessment interval by GM/OELV only when compliant (36/24/18/12 months, from memory)', () => {
    expect([0.05, 0.2, 0.4, 0.6].map((gm) => en689ReassessmentMonths(gm, 1))).toEqual([36, 24, 18, 12]);
    const values = detected([0.01, 0.02, 0.015]);
    expect(en689Assessment(values, logScaleSummary([0.01, 0.02, 0.015]), 1)).toMatchObject({
      test: 'preliminary',
      result: 'compliant',
      reassessmentMonths: 36,
      ur: null,
    });
    const high = detected([0.5, 2, 0.8]);
    expect(en689Assessment(high, logScaleSummary([0.5, 2, 0.8]), 1)).toMatchObject({ result: 'non-compliant', reassessmentMonths: null });
  });
});

describe('exceedance fraction', () => {
  it('is 5 % when the OEL sits at the true 95th percentile of the fitted model, and its limits bracket it', () => {
    const summary = { n: 10, mean: 0, sd: 1 };
    const oel = Math.exp(1.6448536269514722);
    expect(Math.abs(exceedanceFraction(summary, oel) - 0.05)).toBeLessThan(1e-15);
    expect(exceedanceFractionLimit(summary, oel, 0.95, 'lower')).toBeLessThan(0.05);
    expect(exceedanceFractionLimit(summary, oel, 0.95, 'upper')).toBeGreaterThan(0.05);
  });

  it('reports 0 and 1 where the limit is beyond double precision instead of searching forever', () => {
    // OEL 10^40 GSDs above the GM: the upper limit is below 1e-300.
    expect(exceedanceFractionLimit({ n: 30, mean: 0, sd: 0.01 }, Math.exp(50), 0.95, 'upper')).toBe(0);
    expect(exceedanceFractionLimit({ n: 30, mean: 0, sd: 0.01 }, Math.exp(-50), 0.95, 'lower')).toBe(1);
  });
});

describe('descriptive statistics', () => {
  it('gives the median of odd and even counts and leaves sample statistics null with non-detects', () => {
    expect(medianOfSorted([1, 2, 9])).toBe(2);
    expect(medianOfSorted([1, 2, 4, 9])).toBe(3);
    const withNd = describeShiftValues([{ value: 0.05, nonDetect: true }, { value: 3, nonDetect: true }, ...detected([0.2, 2])], { oel: 1 });
    expect(withNd).toMatchObject({
      n: 4,
      nonDetects: 2,
      minimum: 0.2,
      maximum: 2,
      arithmeticMean: null,
      geometricMean: null,
      countAboveOel: 1,
      nonDetectsAboveOel: 1,
    });
    expect(withNd.detectionLimits).toEqual({ lowest: 0.05, highest: 3 });
  });

  it('computes GM and GSD as the exponentials of the mean and SD of the logs', () => {
    const result = describeShiftValues(detected([1, 10, 100]), { oel: 50 });
    expect(result.geometricMean).toBeCloseTo(10, 12);
    expect(result.geometricStandardDeviation).toBeCloseTo(10, 12); // ln-scale SD of 0, ln10, 2·ln10 is ln 10
  });
});

describe('log-probability plot', () => {
  it('uses Blom positions (i − 3/8)/(n + 1/4) and a fitted line through the GM at z = 0', () => {
    expect(blomPositions(3)).toEqual([0.625 / 3.25, 0.5, 2.625 / 3.25]);
    const plot = logProbabilityPlot([4, 1, 2], { mu: Math.log(2), sigma: 0.7 });
    expect(plot.points.map((p) => p.value)).toEqual([1, 2, 4]);
    expect(Math.abs(plot.points[1].z)).toBe(0); // Φ⁻¹(0.5) = 0 (returned as −0)
    expect(plot.line.intercept).toBe(Math.log(2));
    expect(Math.exp(plot.line.intercept + plot.line.slope * plot.points[1].z)).toBeCloseTo(2, 12);
  });

  it('plots supplied censored-data positions sorted by position and keeps the non-detect flag', () => {
    const plot = logProbabilityPlotFromPositions(
      [
        { value: 0.3, p: 0.7, nonDetect: false },
        { value: 0.02, p: 0.2, nonDetect: true },
      ],
      { mu: -2, sigma: 1 },
    );
    expect(plot.plottingPositions).toBe('supplied');
    expect(plot.points.map((p) => p.nonDetect)).toEqual([true, false]);
    expect(() => logProbabilityPlotFromPositions([{ value: 1, p: 1, nonDetect: false }], { mu: 0, sigma: 1 })).toThrow(/strictly between 0 and 1/);
  });
});
