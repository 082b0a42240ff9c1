import { describe, expect, it } from 'vitest';
import { assessGroup, assessMany, ASSESSMENT_RULES, checkGroupInput } from '@stats/assess-group';
import { doseFromTwa, oshaHc, twaFromDose } from '@stats/noise-criteria';
import { Z_95 } from '@stats/normal-distribution';
import type { ShiftValue } from '@stats/types';

const detected = (values: readonly number[]): ShiftValue[] => values.map((value) => ({ value, nonDetect: false }));
const below = (limit: number): ShiftValue => ({ value: limit, nonDetect: true });

describe('assessGroup refusals (issue 3, "Inputs and refusals")', () => {
  it('refuses fewer than 3 results, naming the rule and the count', () => {
    expect(() => assessGroup({ values: detected([0.1, 0.2]), oel: 1 })).toThrow(
      'assessGroup: at least 3 results are needed (rule: fewer than 3 results), got 2',
    );
  });

  it('refuses a value of 0, a negative value and a value that is not a number, naming the result', () => {
    expect(() => assessGroup({ values: detected([0.1, 0, 0.3]), oel: 1 })).toThrow('assessGroup: result 2 must be a number greater than 0, got 0');
    expect(() => assessGroup({ values: detected([0.1, 0.2, -4]), oel: 1 })).toThrow(/result 3 must be a number greater than 0, got -4/);
    expect(() => assessGroup({ values: detected([Number.NaN, 0.2, 0.4]), oel: 1 })).toThrow(/result 1 must be a number greater than 0, got NaN/);
    expect(() => assessGroup({ values: [{ value: '0.2' as unknown as number, nonDetect: false }, ...detected([0.1, 0.3])], oel: 1 })).toThrow(
      /result 1 must be a number greater than 0/,
    );
  });

  it('refuses all values equal', () => {
    expect(() => assessGroup({ values: detected([0.4, 0.4, 0.4, 0.4]), oel: 1 })).toThrow(
      'assessGroup: all 4 values are equal (0.4) (rule: all values equal); their spread cannot be estimated',
    );
  });

  it('refuses more than 80 % non-detects and accepts exactly 80 %', () => {
    const nineOfTen = [...detected([0.3]), ...Array.from({ length: 9 }, () => below(0.05))];
    expect(() => assessGroup({ values: nineOfTen, oel: 1 })).toThrow(/9 of 10 results are non-detects \(rule: more than 80 % non-detects\)/);
    const twelveOfFifteen = [...detected([0.3, 0.5, 0.9]), ...Array.from({ length: 12 }, () => below(0.05))];
    expect(() => checkGroupInput({ values: twelveOfFifteen, oel: 1 })).not.toThrow();
  });

  it('refuses fewer than 3 detected values', () => {
    expect(() => assessGroup({ values: [...detected([0.3, 0.5]), below(0.05), below(0.05)], oel: 1 })).toThrow(
      /at least 3 detected values are needed \(rule: fewer than 3 detected values\), got 2/,
    );
  });

  it('refuses a bad OEL, action level or seed', () => {
    const values = detected([0.1, 0.2, 0.4]);
    expect(() => assessGroup({ values, oel: 0 })).toThrow(/the OEL must be a number greater than 0, got 0/);
    expect(() => assessGroup({ values, oel: 1, actionLevel: -1 })).toThrow(/the action level must be a number greater than 0/);
    expect(() => assessGroup({ values, oel: 1, seed: 1.5 })).toThrow(/the seed must be an integer/);
  });

  it(`refuses a GSD above ${ASSESSMENT_RULES.maxGsd} and values outside 1e-15 to 1e15 as unit or grouping errors`, () => {
    expect(() => assessGroup({ values: detected([1e-4, 1, 1e4]), oel: 1 })).toThrow(
      /the GSD is 10000, above 100 \(rule: spread too wide for one exposure group\)/,
    );
    expect(() => assessGroup({ values: detected([1e-16, 1, 2]), oel: 1 })).toThrow(/outside 1e-15 to 1e15; check the unit/);
  });
});

describe('assessGroup on complete data', () => {
  // EPA QA/G-9 (2000) Box 3-12 data (REFERENCES.md).
  const epa = detected([8.12, 7.32, 4.82, 6.52, 7.8, 11.89, 12.94, 7.51, 18.14, 4.09, 5.7, 15.57, 6.68, 8.15, 5.56]);

  it('reports Land’s UCL near EPA’s 10.97, the exact limits, category and judgement for the EPA data with an OEL of 20', () => {
    const result = assessGroup({ values: epa, oel: 20 });
    expect(Math.abs(result.amUcl95 / 10.97 - 1)).toBeLessThan(0.002); // see tests/reference/land.test.ts
    expect(result.fit.method).toBe('complete');
    expect(result.n).toBe(15);
    expect(result.nonDetects).toBe(0);
    expect(result.p95).toBeLessThan(result.utl95_95);
    expect(result.exceedanceFractionLcl95).toBeLessThan(result.exceedanceFraction);
    expect(result.exceedanceFraction).toBeLessThan(result.exceedanceFractionUcl95);
    expect(result.exceedanceFractionInterval95?.upper).toBeGreaterThan(result.exceedanceFractionUcl95);
    // P95 = exp(ȳ + 1.645 s) = 15.93 with ȳ 2.0763, s 0.4262: category 3 (50–100 % of 20); UTL 23.8 > 20: category 4.
    expect(result.categoryByP95).toBe(3);
    expect(result.categoryByUtl).toBe(4);
    expect(result.judgement).toBe('uncertain');
    expect(result.managerSentence).toMatch(/more shift measurements are needed/);
    expect(result.en689.test).toBe('statistical');
    expect(result.seed).toBeNull();
  });

  it('gives the arithmetic mean, SD, median and counts above the OEL and action level as descriptive statistics', () => {
    const result = assessGroup({ values: detected([1, 2, 3, 10]), oel: 5, actionLevel: 2.5 });
    expect(result.descriptive.arithmeticMean).toBe(4);
    expect(result.descriptive.median).toBe(2.5);
    expect(result.descriptive.countAboveOel).toBe(1);
    expect(result.descriptive.shareAboveOel).toBe(0.25);
    expect(result.descriptive.countAboveActionLevel).toBe(2);
    expect(result.am).toBe(4);
    // SD of 1, 2, 3, 10 with divisor n − 1: squared deviations 9 + 4 + 1 + 36 = 50, √(50/3) = 4.0825
    expect(Math.abs(result.sd - Math.sqrt(50 / 3))).toBeLessThan(1e-12);
  });

  it('warns that the fit is doubtful when one result stands apart, and names the outlier first', () => {
    const result = assessGroup({ values: detected([1.0, 1.2, 0.9, 1.1, 1.05, 0.95, 1.15, 1.02, 0.98, 60]), oel: 100 });
    expect(result.fitCheck.doubtful).toBe(true);
    expect(result.fitCheck.shapiroWilkLog?.p).toBeLessThan(0.05);
    expect(result.fitCheck.warning).toMatch(/do not follow a lognormal distribution well/);
    expect(result.fitCheck.likelyReasons[0]).toMatch(/^An outlier: the result 60 stands apart/);
    expect(result.fitCheck.likelyReasons.some((r) => r.startsWith('A mixed group'))).toBe(true);
  });

  it('names two processes first when the results form two separate clusters', () => {
    const result = assessGroup({ values: detected([0.1, 0.11, 0.12, 0.105, 0.115, 5, 5.5, 6, 5.2, 5.8]), oel: 10 });
    expect(result.fitCheck.doubtful).toBe(true);
    expect(result.fitCheck.likelyReasons[0]).toMatch(/^Two processes or tasks: the results form two clusters \(5 up to 0.12, 5 from 5\)/);
  });

  it('gives no warning and no reasons when the lognormal fit is fine', () => {
    const result = assessGroup({ values: epa, oel: 20 });
    expect(result.fitCheck.doubtful).toBe(false);
    expect(result.fitCheck.warning).toBeNull();
    expect(result.fitCheck.likelyReasons).toEqual([]);
  });
});

describe('assessGroup with non-detects', () => {
  const values = [below(0.05), ...detected([0.12, 0.3, 0.08, 0.21, 0.15]), below(0.05), ...detected([0.4, 0.09])];

  it('uses the non-detect module’s fit and bootstrap limits, says which method, and records the seed', () => {
    const result = assessGroup({ values, oel: 1, seed: 42 });
    expect(result.nonDetects).toBe(2);
    expect(['ros', 'censored-mle']).toContain(result.fit.method);
    expect(result.fit.methodNote).toMatch(/2 of 9 results/);
    expect(result.methods.some((m) => m.startsWith('Confidence limits: Parametric bootstrap'))).toBe(true);
    expect(result.seed).toBe(42);
    expect(result.exceedanceFractionInterval95).toBeNull();
    expect(result.descriptive.arithmeticMean).toBeNull();
    expect(result.fitCheck.basis).toMatch(/The 7 detected values only/);
    expect(result.probabilityPlot.plottingPositions).toBe('supplied');
    expect(result.probabilityPlot.points.filter((p) => p.nonDetect)).toHaveLength(2);
  });

  it('gives the same limits for the same seed and different ones for another seed', () => {
    const first = assessGroup({ values, oel: 1, seed: 42 });
    const again = assessGroup({ values, oel: 1, seed: 42 });
    const other = assessGroup({ values, oel: 1, seed: 43 });
    expect(again.utl95_95).toBe(first.utl95_95);
    expect(other.utl95_95).not.toBe(first.utl95_95);
  });
});

describe('assessGroup on noise dose % (OEL 100 %, action level 50 %)', () => {
  it('treats doses as lognormal exactly when TWAs are normal: the P95 dose converts back to mean TWA + 1.645 SD', () => {
    // OSHA hearing-conservation set (29 CFR 1910.95 App. A): dose = 100·2^((TWA − 90)/5), so ln(dose)
    // is linear in TWA; the P95 of the doses must be the dose at the normal P95 of the TWAs.
    const twas = [82.1, 84.5, 86.0, 83.3, 88.7, 85.2, 87.9, 81.4];
    const doses = twas.map((twa) => doseFromTwa(twa, oshaHc));
    const result = assessGroup({ values: detected(doses), oel: 100, actionLevel: 50 });
    const mean = twas.reduce((a, b) => a + b, 0) / twas.length;
    const sd = Math.sqrt(twas.reduce((a, b) => a + (b - mean) ** 2, 0) / (twas.length - 1));
    expect(Math.abs((twaFromDose(result.p95, oshaHc) as number) - (mean + Z_95 * sd))).toBeLessThan(1e-9);
    // 50 % dose is 85 dBA TWA on the 5 dB exchange rate: 4 of the 8 TWAs lie above 85.
    expect(result.descriptive.countAboveActionLevel).toBe(4);
    expect(result.descriptive.countAboveOel).toBe(0);
    expect(result.actionLevel).toBe(50);
  });
});

describe('assessMany', () => {
  it('reports each group, and a refused group gets its message without stopping the others', () => {
    const results = assessMany([
      { group: 'planer feeder', values: detected([0.2, 0.35, 0.5, 0.28]), oel: 1 },
      { group: 'saw filer', values: detected([0.2, 0.2, 0.2]), oel: 1 },
      { group: 'edger operator', values: detected([0.4, 0.6]), oel: 1 },
      { group: 'head sawyer', values: detected([0.3, 0.45, 0.9, 0.6, 0.5, 0.7]), oel: 1 },
    ]);
    expect(results.map((r) => r.group)).toEqual(['planer feeder', 'saw filer', 'edger operator', 'head sawyer']);
    expect(results[0].assessment?.n).toBe(4);
    expect(results[1].error).toMatch(/rule: all values equal/);
    expect(results[2].error).toMatch(/rule: fewer than 3 results/);
    expect(results[3].assessment?.en689.test).toBe('statistical');
  });
});
