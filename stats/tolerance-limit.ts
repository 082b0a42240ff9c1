import { checkLogScaleSummary, type LogScaleSummary } from './log-scale-summary';
import { normalQuantile, Z_95 } from './normal-distribution';
import { noncentralTQuantile } from './noncentral-t';

/**
 * The 95th percentile of a lognormal exposure distribution: its point estimate and the one-sided
 * upper tolerance limit UTL95%,95%, the upper 95% confidence limit of the 95th percentile.
 */

/**
 * The exact one-sided normal tolerance factor K(n, coverage, confidence) =
 * t′_confidence(n − 1, z_coverage·√n)/√n, the noncentral t quantile
 * (Owen 1968, Technometrics 10:445–478, §5; NIST/SEMATECH e-Handbook of Statistical Methods,
 * §7.2.6.3; Natrella 1963, NBS Handbook 91, Table A-7). z_coverage is the exact normal quantile
 * (1.6448536… for 95 %), which printed tables round to 1.645.
 * toleranceFactor(10) → 2.911 (NIST/SEMATECH e-Handbook 7.2.6.3)
 */
export function toleranceFactor(n: number, coverage = 0.95, confidence = 0.95): number {
  if (!Number.isInteger(n) || n < 2) throw new RangeError(`toleranceFactor: n must be an integer of at least 2, got ${n}`);
  if (!(coverage > 0 && coverage < 1)) throw new RangeError(`toleranceFactor: coverage must lie between 0 and 1, got ${coverage}`);
  if (!(confidence > 0 && confidence < 1)) {
    throw new RangeError(`toleranceFactor: confidence must lie between 0 and 1, got ${confidence}`);
  }
  const root = Math.sqrt(n);
  const z = coverage === 0.95 ? Z_95 : normalQuantile(coverage);
  return noncentralTQuantile(confidence, n - 1, z * root) / root;
}

/**
 * Point estimate of the 95th percentile, exp(ȳ + z0.95·s), z0.95 = 1.6448536… (the lognormal
 * quantile, Aitchison & Brown 1957, The Lognormal Distribution, §2.3, with ȳ and s for μ and σ;
 * the X0.95 that the exposure categories of Hewett et al. 2006 are defined on).
 */
export function percentile95(summary: LogScaleSummary): number {
  checkLogScaleSummary('percentile95', summary, 2);
  return Math.exp(summary.mean + Z_95 * summary.sd);
}

/**
 * Upper tolerance limit UTL(coverage, confidence) = exp(ȳ + K·s) with the exact K above; with the
 * defaults, UTL95%,95%: we are 95% confident that at least 95% of shifts lie below it.
 */
export function upperToleranceLimit(summary: LogScaleSummary, coverage = 0.95, confidence = 0.95): number {
  checkLogScaleSummary('upperToleranceLimit', summary, 3);
  return Math.exp(summary.mean + toleranceFactor(summary.n, coverage, confidence) * summary.sd);
}
