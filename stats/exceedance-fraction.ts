import { checkLogScaleSummary, type LogScaleSummary } from './log-scale-summary';
import { normalCdf } from './normal-distribution';
import { noncentralityForProbability } from './noncentral-t';

/**
 * The exceedance fraction: the share of shifts whose exposure exceeds the OEL, F = P(X > OEL).
 *
 * Point estimate F̂ = 1 − Φ((ln OEL − ȳ)/s) (Leidel, Busch & Lynch 1977, NIOSH OESSM, Technical
 * Appendix; Hewett & Ganser 1997, "Simple procedures for calculating confidence intervals
 * around the sample mean and exceedance fraction derived from lognormally distributed data",
 * Appl. Occup. Environ. Hyg. 12:132–142).
 *
 * Exact confidence limits by inverting the noncentral t (Owen 1968, Technometrics 10:445–478, §4;
 * Odeh & Owen 1980, Tables for Normal Tolerance Limits, Sampling Plans and Screening; Hewett &
 * Ganser 1997): t = √n·(ln OEL − ȳ)/s is noncentral t with n − 1 degrees of freedom and
 * noncentrality δ = √n·Φ⁻¹(1 − F). The one-sided 100c% upper limit is F_U = Φ(−δ_L/√n) where
 * P(T ≤ t | δ_L) = c; the lower limit F_L = Φ(−δ_U/√n) where P(T ≤ t | δ_U) = 1 − c.
 */

function checkOel(functionName: string, oel: number): void {
  if (!(oel > 0) || !Number.isFinite(oel)) throw new RangeError(`${functionName}: the OEL must be a finite number > 0, got ${oel}`);
}

/**
 * F̂ = 1 − Φ((ln OEL − ȳ)/s), as a fraction from 0 to 1.
 * exceedanceFraction({ n: 10, mean: 0, sd: 1 }, Math.exp(1.6448536269514722)) → 0.05
 */
export function exceedanceFraction(summary: LogScaleSummary, oel: number): number {
  checkLogScaleSummary('exceedanceFraction', summary, 2);
  checkOel('exceedanceFraction', oel);
  return normalCdf((summary.mean - Math.log(oel)) / summary.sd);
}

/*
 * A limit F = Φ(−δ/√n) is 0 in double precision once δ/√n > 38.5 and 1 once δ/√n < −8.5, so the
 * noncentrality search stops there instead of summing ever longer Poisson series.
 */
const HIGHEST_SCORE = 38.5;
const LOWEST_SCORE = -8.5;

/**
 * One exact one-sided confidence limit of the exceedance fraction at confidence c: the upper limit
 * when `side` is 'upper', the lower when 'lower' (method in the file comment).
 */
export function exceedanceFractionLimit(summary: LogScaleSummary, oel: number, confidence: number, side: 'upper' | 'lower'): number {
  checkLogScaleSummary('exceedanceFractionLimit', summary, 3);
  checkOel('exceedanceFractionLimit', oel);
  if (!(confidence > 0.5 && confidence < 1)) {
    throw new RangeError(`exceedanceFractionLimit: confidence must lie between 0.5 and 1, got ${confidence}`);
  }
  const root = Math.sqrt(summary.n);
  const t = (root * (Math.log(oel) - summary.mean)) / summary.sd;
  const p = side === 'upper' ? confidence : 1 - confidence;
  const delta = noncentralityForProbability(t, summary.n - 1, p, {
    lowest: LOWEST_SCORE * root,
    highest: HIGHEST_SCORE * root,
  });
  if (delta === Infinity) return 0;
  if (delta === -Infinity) return 1;
  return normalCdf(-delta / root);
}

export interface ExceedanceFractionEstimate {
  /** Point estimate F̂ (0 … 1). */
  estimate: number;
  /** Exact one-sided 95% lower confidence limit. */
  lcl95: number;
  /** Exact one-sided 95% upper confidence limit (the AIHA "95% UCL" of the exceedance fraction). */
  ucl95: number;
  /** Exact two-sided 95% confidence interval (2.5% and 97.5% limits). */
  interval95: { lower: number; upper: number };
}

/** F̂ with its exact one-sided 95% limits and its exact two-sided 95% interval. */
export function exceedanceFractionWithLimits(summary: LogScaleSummary, oel: number): ExceedanceFractionEstimate {
  return {
    estimate: exceedanceFraction(summary, oel),
    lcl95: exceedanceFractionLimit(summary, oel, 0.95, 'lower'),
    ucl95: exceedanceFractionLimit(summary, oel, 0.95, 'upper'),
    interval95: {
      lower: exceedanceFractionLimit(summary, oel, 0.975, 'lower'),
      upper: exceedanceFractionLimit(summary, oel, 0.975, 'upper'),
    },
  };
}
