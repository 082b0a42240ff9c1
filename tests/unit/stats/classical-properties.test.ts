import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { assessGroup, type GroupAssessment } from '@stats/assess-group';
import { exceedanceFraction, exceedanceFractionLimit } from '@stats/exceedance-fraction';
import { exposureCategory } from '@stats/exposure-category';
import { logScaleSummary } from '@stats/log-scale-summary';
import { percentile95, upperToleranceLimit } from '@stats/tolerance-limit';
import type { ShiftValue } from '@stats/types';

// Valid complete groups: 3–40 results spread over four decades around 1, not all equal, and an
// OEL within three decades of them — the range real shift results and limits fall in.
const logValue = fc.double({ min: -4.5, max: 4.5, noNaN: true });
const logSets = fc.array(logValue, { minLength: 3, maxLength: 40 }).filter((logs) => logs.some((y) => Math.abs(y - logs[0]) > 1e-6));
const logOel = fc.double({ min: -3, max: 3, noNaN: true });
const detected = (logs: readonly number[]): ShiftValue[] => logs.map((y) => ({ value: Math.exp(y), nonDetect: false }));

/** Every number anywhere in the assessment, with its path. */
function numbersIn(value: unknown, path = 'assessment'): [string, number][] {
  if (typeof value === 'number') return [[path, value]];
  if (Array.isArray(value)) return value.flatMap((item, i) => numbersIn(item, `${path}[${i}]`));
  if (value !== null && typeof value === 'object') return Object.entries(value).flatMap(([key, item]) => numbersIn(item, `${path}.${key}`));
  return [];
}

function expectAllFinite(assessment: GroupAssessment): void {
  for (const [path, number] of numbersIn(assessment)) expect(Number.isFinite(number), `${path} = ${number}`).toBe(true);
  for (const share of [assessment.exceedanceFraction, assessment.exceedanceFractionLcl95, assessment.exceedanceFractionUcl95]) {
    expect(share).toBeGreaterThanOrEqual(0);
    expect(share).toBeLessThanOrEqual(1);
  }
}

describe('properties of the classical engine (fast-check)', () => {
  it('multiplying the data and the OEL by the same factor leaves the exceedance fraction, its limit and both categories unchanged', () => {
    fc.assert(
      fc.property(logSets, logOel, fc.double({ min: -7, max: 7, noNaN: true }), (logs, lnOel, lnFactor) => {
        const factor = Math.exp(lnFactor);
        const oel = Math.exp(lnOel);
        const base = logScaleSummary(logs.map(Math.exp));
        const scaled = logScaleSummary(logs.map((y) => Math.exp(y) * factor));
        // Rounding of exp, log and the sums: agreement to 1e-9 relative (or 1e-12 absolute near 0).
        const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b)) + 1e-12;
        expect(close(exceedanceFraction(base, oel), exceedanceFraction(scaled, oel * factor))).toBe(true);
        if (base.n >= 3) {
          expect(close(exceedanceFractionLimit(base, oel, 0.95, 'upper'), exceedanceFractionLimit(scaled, oel * factor, 0.95, 'upper'))).toBe(true);
          const ratioUtl = upperToleranceLimit(base) / oel;
          // Away from a band edge by more than the rounding, the category cannot change.
          const nearEdge = [0.01, 0.1, 0.5, 1].some((edge) => Math.abs(ratioUtl / edge - 1) < 1e-9);
          if (!nearEdge) expect(exposureCategory(upperToleranceLimit(scaled), oel * factor)).toBe(exposureCategory(upperToleranceLimit(base), oel));
        }
        const ratioP95 = percentile95(base) / oel;
        const nearEdge = [0.01, 0.1, 0.5, 1].some((edge) => Math.abs(ratioP95 / edge - 1) < 1e-9);
        if (!nearEdge) expect(exposureCategory(percentile95(scaled), oel * factor)).toBe(exposureCategory(percentile95(base), oel));
      }),
      { numRuns: 200, seed: 20240611 },
    );
  });

  it('raising a value at or above the geometric mean never lowers the P95 estimate or the UTL', () => {
    // d(ȳ + z·s)/dy_i = 1/n + z·(y_i − ȳ)/((n − 1)·s) > 0 whenever y_i ≥ ȳ, and y_i only moves up.
    fc.assert(
      fc.property(logSets, fc.nat(), fc.double({ min: 1e-6, max: 5, noNaN: true }), (logs, pick, raise) => {
        const mean = logs.reduce((a, b) => a + b, 0) / logs.length;
        const candidates = logs.map((y, i) => [y, i] as const).filter(([y]) => y >= mean);
        const [, index] = candidates[pick % candidates.length];
        const raised = logs.map((y, i) => (i === index ? y + raise : y));
        const before = logScaleSummary(logs.map(Math.exp));
        const after = logScaleSummary(raised.map(Math.exp));
        expect(percentile95(after)).toBeGreaterThanOrEqual(percentile95(before) * (1 - 1e-12));
        expect(upperToleranceLimit(after)).toBeGreaterThanOrEqual(upperToleranceLimit(before) * (1 - 1e-12));
      }),
      { numRuns: 300, seed: 20240612 },
    );
  });

  it('raising the lowest value can lower the P95 estimate, because the spread shrinks (why the property above is limited)', () => {
    // logs 0, 1, 1: ȳ + 1.645·s = 0.667 + 1.645·0.577 = 1.616; logs 0.5, 1, 1: 0.833 + 1.645·0.289 = 1.308.
    const before = percentile95(logScaleSummary([Math.exp(0), Math.exp(1), Math.exp(1)]));
    const after = percentile95(logScaleSummary([Math.exp(0.5), Math.exp(1), Math.exp(1)]));
    expect(after).toBeLessThan(before);
  });

  it('gives finite numbers everywhere, and shares between 0 and 1, for any valid complete group', () => {
    fc.assert(
      fc.property(logSets, logOel, (logs, lnOel) => {
        expectAllFinite(assessGroup({ values: detected(logs), oel: Math.exp(lnOel), actionLevel: Math.exp(lnOel) / 2 }));
      }),
      { numRuns: 150, seed: 20240613 },
    );
  });

  it('gives finite numbers everywhere for valid groups with non-detects (up to 80 % of results)', () => {
    // Fewer runs: each censored group runs a 2,000-replicate bootstrap.
    const withNonDetects = fc
      .record({
        detectedLogs: fc.array(logValue, { minLength: 3, maxLength: 12 }).filter((logs) => logs.some((y) => Math.abs(y - logs[0]) > 1e-3)),
        limitLogs: fc.array(fc.double({ min: -4.5, max: 2, noNaN: true }), { minLength: 1, maxLength: 8 }),
      })
      .filter(({ detectedLogs, limitLogs }) => limitLogs.length / (limitLogs.length + detectedLogs.length) <= 0.8);
    fc.assert(
      fc.property(withNonDetects, logOel, ({ detectedLogs, limitLogs }, lnOel) => {
        const values: ShiftValue[] = [...detected(detectedLogs), ...limitLogs.map((y) => ({ value: Math.exp(y), nonDetect: true }))];
        let assessment: GroupAssessment;
        try {
          assessment = assessGroup({ values, oel: Math.exp(lnOel), seed: 7 });
        } catch (error) {
          // The censored-data limits may refuse data too thin to bound (a RangeError saying so); never anything else.
          expect(error).toBeInstanceOf(RangeError);
          expect((error as Error).message).toMatch(/assessGroup|censoredLimits|fitWithNondetects/);
          return;
        }
        expectAllFinite(assessment);
      }),
      { numRuns: 12, seed: 20240614 },
    );
  }, 120_000);

  it('refuses every invalid group with a RangeError that names the rule', () => {
    const invalid = fc.oneof(
      fc.array(logValue, { minLength: 0, maxLength: 2 }).map((logs) => ({ values: detected(logs), rule: /fewer than 3 results/ })),
      fc.tuple(logSets, fc.constantFrom(0, -1, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY), fc.nat()).map(([logs, bad, at]) => {
        const values = detected(logs);
        values[at % values.length] = { value: bad, nonDetect: false };
        return { values, rule: /must be a number greater than 0/ };
      }),
      fc
        .tuple(fc.integer({ min: 3, max: 20 }), fc.double({ min: 1e-3, max: 1e3, noNaN: true }))
        .map(([n, value]) => ({ values: Array.from({ length: n }, () => ({ value, nonDetect: false })), rule: /all values equal/ })),
      fc.integer({ min: 3, max: 6 }).map((detectedCount) => ({
        values: [
          ...detected(Array.from({ length: detectedCount }, (_, i) => i * 0.3)),
          ...Array.from({ length: 5 * detectedCount }, () => ({ value: 0.5, nonDetect: true })),
        ],
        rule: /more than 80 % non-detects/,
      })),
      // 1 or 2 detected values with at most 80 % non-detects, so that only this rule is broken.
      fc.tuple(fc.integer({ min: 1, max: 2 }), fc.integer({ min: 2, max: 8 })).map(([detectedCount, nonDetectCount]) => ({
        values: [
          ...detected(Array.from({ length: detectedCount }, (_, i) => i * 0.3)),
          ...Array.from({ length: Math.min(nonDetectCount, 4 * detectedCount) }, () => ({ value: 0.5, nonDetect: true })),
        ],
        rule: /fewer than 3 detected values/,
      })),
    );
    fc.assert(
      fc.property(invalid, ({ values, rule }) => {
        expect(() => assessGroup({ values, oel: 1 })).toThrow(RangeError);
        expect(() => assessGroup({ values, oel: 1 })).toThrow(rule);
      }),
      { numRuns: 200, seed: 20240615 },
    );
  });
});
