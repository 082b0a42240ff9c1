import { checkLogScaleSummary, type LogScaleSummary } from './log-scale-summary';
import { Z_95 } from './normal-distribution';
import { noncentralTQuantile } from './noncentral-t';
import type { ShiftValue } from './types';

/**
 * EN 689:2018, "Workplace exposure — Measurement of exposure by inhalation to chemical agents —
 * Strategy for testing compliance with occupational exposure limit values", §5.5 and Annex F:
 * - preliminary test (§5.5.2) for 3, 4 or 5 results: all below 0.1, 0.15 or 0.2 × OELV →
 *   compliant; any above the OELV → non-compliant; otherwise no decision (more results needed).
 *   (Thresholds as in REFERENCES.md, marked there "from memory".)
 * - statistical test (§5.5.3, Annex F) from 6 results: UR = (ln OELV − ln GM)/ln GSD is compared
 *   with UT = t′0.70(n − 1, z0.95·√n)/√n, the 70%-confidence tolerance factor; UR ≥ UT → compliant
 *   (70% confident that fewer than 5% of exposures exceed the OELV), otherwise non-compliant.
 * - periodic reassessment interval by GM/OELV (EN 689:2018 Annex I; REFERENCES.md, from memory):
 *   GM < 0.1 OELV 36 months, < 0.25 OELV 24 months, < 0.5 OELV 18 months, otherwise 12 months.
 */

export type En689Result = 'compliant' | 'non-compliant' | 'no-decision';

/** Preliminary-test thresholds as a fraction of the OELV, by number of results (EN 689:2018 §5.5.2; from memory). */
export const EN689_PRELIMINARY_THRESHOLDS: Readonly<Record<3 | 4 | 5, number>> = Object.freeze({ 3: 0.1, 4: 0.15, 5: 0.2 });

export interface En689Outcome {
  test: 'preliminary' | 'statistical';
  /** UR = (ln OELV − ln GM)/ln GSD; null for the preliminary test. */
  ur: number | null;
  /** UT for n results at 70% confidence; null for the preliminary test. */
  ut: number | null;
  result: En689Result;
  /** Suggested months to the next periodic assessment when compliant, else null (from memory). */
  reassessmentMonths: number | null;
  /** One sentence on how the result was reached. */
  explanation: string;
}

function checkOelv(functionName: string, oelv: number): void {
  if (!(oelv > 0) || !Number.isFinite(oelv)) throw new RangeError(`${functionName}: the OELV must be a finite number > 0, got ${oelv}`);
}

/**
 * EN 689 UT = t′0.70(n − 1, z0.95·√n)/√n (EN 689:2018 Annex F, computed from the noncentral t).
 * en689Ut(6) → 2.187 (EN 689:2018 Table F.1)
 */
export function en689Ut(n: number): number {
  if (!Number.isInteger(n) || n < 6) throw new RangeError(`en689Ut: the statistical test needs an integer n of at least 6, got ${n}`);
  const root = Math.sqrt(n);
  return noncentralTQuantile(0.7, n - 1, Z_95 * root) / root;
}

/**
 * The preliminary test for 3 to 5 results. A non-detect counts at its detection limit: it is below
 * the threshold only if its limit is; it is never "above the OELV" (its true value is below the limit).
 */
export function en689PreliminaryTest(values: readonly ShiftValue[], oelv: number): En689Result {
  checkOelv('en689PreliminaryTest', oelv);
  const n = values.length;
  if (n < 3 || n > 5) throw new RangeError(`en689PreliminaryTest: the preliminary test takes 3 to 5 results, got ${n}`);
  const threshold = EN689_PRELIMINARY_THRESHOLDS[n as 3 | 4 | 5] * oelv;
  if (values.some((v) => !v.nonDetect && v.value > oelv)) return 'non-compliant';
  if (values.every((v) => v.value < threshold)) return 'compliant';
  return 'no-decision';
}

/**
 * The statistical test from 6 results on the log-scale summary (GM = exp(ȳ), GSD = exp(s)).
 * `ut` may be passed when the caller already has en689Ut(n) (a batch of groups of one size).
 */
export function en689StatisticalTest(summary: LogScaleSummary, oelv: number, ut: number = en689Ut(summary.n)): { ur: number; ut: number; result: En689Result } {
  checkLogScaleSummary('en689StatisticalTest', summary, 6);
  checkOelv('en689StatisticalTest', oelv);
  const ur = (Math.log(oelv) - summary.mean) / summary.sd;
  return { ur, ut, result: ur >= ut ? 'compliant' : 'non-compliant' };
}

/** Months to the next periodic assessment by GM/OELV (EN 689:2018 Annex I, from memory). */
export function en689ReassessmentMonths(geometricMean: number, oelv: number): number {
  checkOelv('en689ReassessmentMonths', oelv);
  if (!(geometricMean > 0) || !Number.isFinite(geometricMean)) {
    throw new RangeError(`en689ReassessmentMonths: the GM must be a finite number > 0, got ${geometricMean}`);
  }
  const ratio = geometricMean / oelv;
  if (ratio < 0.1) return 36;
  if (ratio < 0.25) return 24;
  if (ratio < 0.5) return 18;
  return 12;
}

/**
 * The EN 689 outcome for a group: the preliminary test for 3–5 results, the statistical test from
 * 6 (on `summary`, which for censored data is the censored-data fit), with the reassessment
 * interval when compliant. `utFor` supplies UT(n) (default en689Ut; a batch may memoize it).
 */
export function en689Assessment(values: readonly ShiftValue[], summary: LogScaleSummary, oelv: number, utFor: (n: number) => number = en689Ut): En689Outcome {
  const n = values.length;
  const gm = Math.exp(summary.mean);
  if (n < 3) throw new RangeError(`en689Assessment: at least 3 results are needed, got ${n}`);
  if (n <= 5) {
    const result = en689PreliminaryTest(values, oelv);
    const share = EN689_PRELIMINARY_THRESHOLDS[n as 3 | 4 | 5] * 100;
    const explanation =
      result === 'compliant'
        ? `All ${n} results are below ${share} % of the OELV (preliminary test).`
        : result === 'non-compliant'
          ? 'At least one result is above the OELV (preliminary test).'
          : `Not every result is below ${share} % of the OELV and none is above it: at least 6 results are needed for the statistical test.`;
    return {
      test: 'preliminary',
      ur: null,
      ut: null,
      result,
      reassessmentMonths: result === 'compliant' ? en689ReassessmentMonths(gm, oelv) : null,
      explanation,
    };
  }
  const { ur, ut, result } = en689StatisticalTest(summary, oelv, utFor(summary.n));
  return {
    test: 'statistical',
    ur,
    ut,
    result,
    reassessmentMonths: result === 'compliant' ? en689ReassessmentMonths(gm, oelv) : null,
    explanation:
      result === 'compliant'
        ? `UR ${ur.toFixed(3)} ≥ UT ${ut.toFixed(3)}: 70 % confident that fewer than 5 % of exposures exceed the OELV.`
        : `UR ${ur.toFixed(3)} < UT ${ut.toFixed(3)}: compliance with the OELV is not shown at 70 % confidence.`,
  };
}
