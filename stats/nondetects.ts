/**
 * Non-detects: choosing how to fit a lognormal distribution to shift results that include
 * "< detection limit" results, and the confidence limits for such censored data. This is the
 * interface the classical engine calls; the methods themselves live in ros.ts and censored-mle.ts.
 *
 * Rules for the choice (see docs/decisions/002-non-detect-methods.md):
 * - no non-detects: the mean and SD of the logs ("complete");
 * - fewer than 50 results: robust regression on order statistics, ROS (Helsel 2012, "Statistics
 *   for Censored Environmental Data Using Minitab and R", 2nd ed., ch. 6, which advises ROS for
 *   small data sets, where maximum likelihood is biased and leans fully on the lognormal model,
 *   and maximum likelihood from about 50 results on — the threshold of 50 is from memory);
 * - 50 results or more: censored maximum likelihood (Cohen 1959, 1991; Helsel 2012, ch. 6), with
 *   ROS as the fallback should the maximization fail.
 * Comparisons in occupational data support both methods at moderate censoring: Hewett & Ganser
 * (2007), Ann. Occup. Hyg. 51(7):611–632, and Huynh et al. (2016), Ann. Occup. Hyg. 60(1):56–73,
 * found no method best everywhere, with maximum likelihood and robust ROS among the methods that
 * performed acceptably (summary from memory; the papers were not at hand when this was written).
 *
 * Refusals (issue 3, "Inputs and refusals"): fewer than 3 results, a value or detection limit that
 * is not a number > 0, more than 80 % non-detects, fewer than 3 detected values, or all detected
 * values equal. Helsel (2012) likewise treats data with more than about 80 % non-detects as too
 * thin for estimating a distribution (from memory).
 */
import type { ShiftValue } from './types';
import { censoredNormalMle, censoredNormalMleEstimate } from './censored-mle';
import { createRosScratch, hirschStedingerPositions, robustRosLogs, rosSortedLogs } from './ros';
import { normalCdf, normalQuantile, Z_95 } from './normal-distribution';
import { createRandom } from './random';

/** A lognormal distribution fitted to shift results, with or without non-detects. */
export interface LognormalFit {
  /** Mean of the natural logs: log of the geometric mean. */
  mu: number;
  /** Standard deviation of the natural logs: log of the geometric standard deviation. */
  sigma: number;
  method: 'complete' | 'censored-mle' | 'ros';
  /** Which method was used and why, in plain words. */
  methodNote: string;
  /**
   * Points of the log-probability plot for censored data, in input order: Hirsch–Stedinger
   * plotting positions; a detected result at its value, a non-detect at the value its fitted line
   * gives at its plotting position (ROS: the imputed value). Absent for complete data, where the
   * classical engine's own plotting positions apply.
   */
  plottingPositions?: { value: number; p: number; nonDetect: boolean }[];
}

/** One-sided 95 % confidence limits for censored data. */
export interface CensoredLimits {
  /** Upper 95 % confidence limit of the 95th percentile (UTL95%,95%). */
  utl95_95: number;
  /** Lower one-sided 95 % confidence limit of the exceedance fraction (0 … 1). */
  exceedanceFractionLower: number;
  /** Upper one-sided 95 % confidence limit of the exceedance fraction (0 … 1). */
  exceedanceFractionUpper: number;
  /** Upper one-sided 95 % confidence limit of the arithmetic mean. */
  amUcl95: number;
  /** Lower one-sided 95 % confidence limit of the arithmetic mean. */
  amLcl95: number;
  /** How the limits were computed, with the replicate count and the seed. */
  method: string;
}

/** Thresholds of the rules above, exported so that messages and screens quote the same numbers. */
export const NONDETECT_RULES = Object.freeze({
  minResults: 3,
  minDetected: 3,
  maxNonDetectShare: 0.8,
  maximumLikelihoodFromResults: 50,
  defaultReplicates: 2000,
});

/** Shift results split into detected values and the detection limits of the non-detects. */
export interface NondetectSample {
  detected: number[];
  detectionLimits: number[];
}

/**
 * Checks shift results against the rules above and splits them. Throws a RangeError that names
 * `functionName`, the rule and the result number (1-based) where one is at fault.
 */
export function checkNondetectSample(values: readonly ShiftValue[], functionName: string): NondetectSample {
  if (!Array.isArray(values)) throw new RangeError(`${functionName}: values must be a list of shift results`);
  if (values.length < NONDETECT_RULES.minResults) {
    throw new RangeError(`${functionName}: at least ${NONDETECT_RULES.minResults} results are needed, got ${values.length}`);
  }
  const detected: number[] = [];
  const detectionLimits: number[] = [];
  values.forEach((v, i) => {
    if (v === null || typeof v !== 'object' || typeof v.nonDetect !== 'boolean') {
      throw new RangeError(`${functionName}: result ${i + 1} must have a boolean nonDetect flag`);
    }
    if (typeof v.value !== 'number' || !Number.isFinite(v.value) || v.value <= 0) {
      throw new RangeError(
        v.nonDetect
          ? `${functionName}: result ${i + 1} is a non-detect with detection limit ${v.value}; a detection limit must be a number > 0`
          : `${functionName}: result ${i + 1} has value ${v.value}; a value must be a number > 0`,
      );
    }
    (v.nonDetect ? detectionLimits : detected).push(v.value);
  });
  const share = detectionLimits.length / values.length;
  if (share > NONDETECT_RULES.maxNonDetectShare) {
    throw new RangeError(
      `${functionName}: more than ${NONDETECT_RULES.maxNonDetectShare * 100} % of results are non-detects ` +
        `(${detectionLimits.length} of ${values.length}); too little is measured above the detection limits to fit a distribution`,
    );
  }
  if (detected.length < NONDETECT_RULES.minDetected) {
    throw new RangeError(`${functionName}: at least ${NONDETECT_RULES.minDetected} detected values are needed, got ${detected.length}`);
  }
  if (detected.every((x) => x === detected[0])) {
    throw new RangeError(`${functionName}: all detected values are equal (${detected[0]}); their spread cannot be estimated`);
  }
  return { detected, detectionLimits };
}

function meanAndSd(logs: readonly number[] | Float64Array): { mu: number; sigma: number } {
  let sum = 0;
  for (const y of logs) sum += y;
  const mu = sum / logs.length;
  let squares = 0;
  for (const y of logs) squares += (y - mu) ** 2;
  return { mu, sigma: Math.sqrt(squares / (logs.length - 1)) };
}

function formatNumber(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

function describeCensoring(n: number, limits: readonly number[]): string {
  const distinct = [...new Set(limits)].sort((a, b) => a - b);
  const percent = Math.round((100 * limits.length) / n);
  const where =
    distinct.length === 1
      ? `one detection limit (${formatNumber(distinct[0])})`
      : `${distinct.length} detection limits (${formatNumber(distinct[0])} to ${formatNumber(distinct[distinct.length - 1])})`;
  return `${limits.length} of ${n} results (${percent} %) were below ${where}.`;
}

const ROS_NOTE =
  'Robust regression on order statistics (ROS; Helsel & Cohn 1988, Helsel 2012) was used: the detected values are kept as measured, ' +
  'and each non-detect is filled in from a straight line fitted to the detected values on a log-probability plot.';

/**
 * Fits a lognormal distribution to shift results with or without non-detects, choosing the method
 * by the rules in the file comment, and says in `methodNote` which method was used and why.
 * Without non-detects: method 'complete', mu and sigma the mean and SD (n − 1) of the logs.
 * A non-detect is left-censored at its `value`; its optional `lower` (interval censoring, used by
 * the Bayesian view) is not used here. Throws a RangeError naming the rule for refused data.
 */
export function fitWithNondetects(values: readonly ShiftValue[]): LognormalFit {
  const { detected, detectionLimits } = checkNondetectSample(values, 'fitWithNondetects');
  const n = values.length;
  if (detectionLimits.length === 0) {
    const { mu, sigma } = meanAndSd(detected.map(Math.log));
    return {
      mu,
      sigma,
      method: 'complete',
      methodNote: 'Every result was detected, so the geometric mean and standard deviation come straight from the logs of the results.',
    };
  }
  const detectedLogs = detected.map(Math.log);
  const limitLogs = detectionLimits.map(Math.log);
  const censoring = describeCensoring(n, detectionLimits);

  if (n >= NONDETECT_RULES.maximumLikelihoodFromResults) {
    try {
      const fit = censoredNormalMle(detectedLogs, limitLogs);
      const positions = hirschStedingerPositions(detectedLogs, limitLogs);
      return {
        mu: fit.mu,
        sigma: fit.sigma,
        method: 'censored-mle',
        methodNote:
          `${censoring} Maximum likelihood for censored data (Cohen 1991, Helsel 2012) was used because there are ` +
          `${NONDETECT_RULES.maximumLikelihoodFromResults} or more results, enough for it to be the most precise method: it finds the ` +
          'lognormal distribution that best explains both the detected values and how many results fell below each detection limit.',
        plottingPositions: plotPoints(
          values,
          positions,
          positions.nonDetect.map((p) => Math.exp(fit.mu + fit.sigma * normalQuantile(p))),
        ),
      };
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
      return rosFit(
        values,
        detectedLogs,
        limitLogs,
        `${censoring} Maximum likelihood, the usual method for ${NONDETECT_RULES.maximumLikelihoodFromResults} or more results, failed on these data (${error.message}). ${ROS_NOTE}`,
      );
    }
  }
  return rosFit(
    values,
    detectedLogs,
    limitLogs,
    `${censoring} ${ROS_NOTE} It was chosen because there are fewer than ${NONDETECT_RULES.maximumLikelihoodFromResults} results; ` +
      'with small samples it is less biased than maximum likelihood and leans less on the lognormal model.',
  );
}

function rosFit(values: readonly ShiftValue[], detectedLogs: number[], limitLogs: number[], methodNote: string): LognormalFit {
  const ros = robustRosLogs(detectedLogs, limitLogs);
  return {
    mu: ros.mu,
    sigma: ros.sigma,
    method: 'ros',
    methodNote,
    plottingPositions: plotPoints(values, ros.positions, ros.imputedLogs.map(Math.exp)),
  };
}

function plotPoints(
  values: readonly ShiftValue[],
  positions: { detected: readonly number[]; nonDetect: readonly number[] },
  nonDetectValues: readonly number[],
): { value: number; p: number; nonDetect: boolean }[] {
  let d = 0;
  let c = 0;
  return values.map((v) => {
    if (v.nonDetect) {
      const k = c++;
      return { value: nonDetectValues[k], p: positions.nonDetect[k], nonDetect: true };
    }
    return { value: v.value, p: positions.detected[d++], nonDetect: false };
  });
}

/**
 * The detection limit each result would have had in a repeat of the survey, on the log scale: a
 * non-detect keeps its own limit; a detected result gets the highest reported limit not above its
 * value (its laboratory limit was below the result; taking the highest one consistent with it
 * errs toward more censoring, so toward wider limits); a detected result below every reported
 * limit gets none (−Infinity: never censored). With one detection limit this is ordinary fixed
 * (type I) censoring at that limit, the model that ROS and maximum likelihood assume.
 */
export function simulationLogLimits(values: readonly ShiftValue[]): number[] {
  const reported = [...new Set(values.filter((v) => v.nonDetect).map((v) => v.value))].sort((a, b) => a - b);
  return values.map((v) => {
    if (v.nonDetect) return Math.log(v.value);
    let best = -Infinity;
    for (const limit of reported) if (limit <= v.value) best = Math.log(limit);
    return best;
  });
}

/** Refits a data set's logs (may reorder the arrays it is given); null when the method cannot fit them. */
type Refit = (detectedLogs: Float64Array, limitLogs: Float64Array) => { mu: number; sigma: number } | null;

/** Refits simulated data sets by the same method as the data, for `size` results at most. */
function refitter(method: LognormalFit['method'], start: { mu: number; sigma: number }, size: number): Refit {
  switch (method) {
    case 'complete':
      return (detectedLogs) => (detectedLogs.length < 2 ? null : meanAndSd(detectedLogs));
    case 'ros': {
      // Φ⁻¹ directly: a memo keyed by plotting position (a Map of doubles) measured slower than erfcinv.
      const scratch = createRosScratch(size);
      return (detectedLogs, limitLogs) => {
        if (detectedLogs.length < 2) return null;
        detectedLogs.sort(); // typed arrays sort numerically
        limitLogs.sort();
        return rosSortedLogs(detectedLogs, detectedLogs.length, limitLogs, limitLogs.length, normalQuantile, scratch);
      };
    }
    case 'censored-mle':
      return (detectedLogs, limitLogs) => {
        if (detectedLogs.length < 2) return null;
        try {
          return censoredNormalMleEstimate(detectedLogs, limitLogs, { start });
        } catch (error) {
          if (error instanceof RangeError) return null;
          throw error;
        }
      };
  }
}

const METHOD_NAMES: Record<LognormalFit['method'], string> = {
  complete: 'the mean and SD of the logs',
  ros: 'robust ROS',
  'censored-mle': 'censored maximum likelihood',
};

/**
 * One-sided 95 % confidence limits for censored lognormal data — UTL95%,95% of the 95th
 * percentile, lower and upper limits of the exceedance fraction of `oel`, lower and upper limits
 * of the arithmetic mean — by a seeded parametric bootstrap of generalized pivotal quantities.
 *
 * Method: `replicates` data sets (default 2,000) are simulated from the fitted lognormal with the
 * same number of results and the same detection limits (see simulationLogLimits), and each is
 * refitted by the same method as the data (`fit.method`), giving (μ*, σ*). With the data's fit
 * (μ̂, σ̂), each replicate yields pivotal draws
 *   M = μ̂ − (μ* − μ̂)·σ̂/σ*,   S = σ̂²/σ*,
 * the bootstrap counterparts of the generalized pivotal quantities of a normal mean and SD
 * (Weerahandi 1993, "Generalized confidence intervals", JASA 88:899–905; Krishnamoorthy & Mathew
 * 2003, "Inferences on the means of lognormal distributions using generalized p-values and
 * generalized confidence intervals", J. Stat. Plan. Inference 115:103–121), with the bootstrap
 * supplying their distribution under censoring as in Krishnamoorthy, Mallick & Mathew (2011),
 * Technometrics 53:72–83 (citation from memory). Limits are percentiles of
 *   exp(M + 1.645·S) (95th percentile),  1 − Φ((ln OEL − M)/S) (exceedance fraction),
 *   exp(M + S²/2) (arithmetic mean),
 * taking the ⌈0.95·B⌉-th and ⌈0.05·B⌉-th ordered draws. This is the studentized ("bootstrap-t")
 * form of Efron & Tibshirani (1993), "An Introduction to the Bootstrap", ch. 12: for complete data
 * the draws have exactly the normal-theory pivot distributions, so the UTL and exceedance-fraction
 * limits reproduce the exact noncentral-t limits up to Monte-Carlo error, and the mean's limits
 * are Krishnamoorthy & Mathew's generalized limits. With censoring the pivots are approximate;
 * coverage was checked by simulation (tests/unit/stats/nondetects-coverage.test.ts). Hewett &
 * Ganser (2007) likewise used bootstrap limits for censored exposure data (from memory).
 *
 * A simulated data set that the rules for non-detects would refuse (fewer than 3 detected values
 * or more than 80 % non-detects) is redrawn: the limits describe repeat surveys that could have
 * been assessed, as the real one was. If more than half of the draws are refused, the censoring is
 * too heavy for limits and a RangeError says so. Same seed, same limits.
 */
export function censoredLimits(values: readonly ShiftValue[], fit: LognormalFit, oel: number, options: { seed: number; replicates?: number }): CensoredLimits {
  const functionName = 'censoredLimits';
  const { detected, detectionLimits } = checkNondetectSample(values, functionName);
  if (fit === null || typeof fit !== 'object' || !(fit.method in METHOD_NAMES)) {
    throw new RangeError(`${functionName}: fit.method must be 'complete', 'censored-mle' or 'ros'`);
  }
  if (!Number.isFinite(fit.mu) || !Number.isFinite(fit.sigma) || !(fit.sigma > 0)) {
    throw new RangeError(`${functionName}: the fit needs a finite mu and a sigma > 0, got mu ${fit.mu}, sigma ${fit.sigma}`);
  }
  if (fit.method === 'complete' && detectionLimits.length > 0) {
    throw new RangeError(`${functionName}: a 'complete' fit cannot describe results that include non-detects`);
  }
  if (typeof oel !== 'number' || !Number.isFinite(oel) || oel <= 0) {
    throw new RangeError(`${functionName}: the OEL must be a number > 0, got ${oel}`);
  }
  const { seed } = options;
  if (!Number.isInteger(seed) || seed < 1 || seed > 4294967295) {
    throw new RangeError(`${functionName}: seed must be an integer from 1 to 4294967295, got ${seed}`);
  }
  const replicates = options.replicates ?? NONDETECT_RULES.defaultReplicates;
  if (!Number.isInteger(replicates) || replicates < 200 || replicates > 1_000_000) {
    throw new RangeError(`${functionName}: replicates must be an integer from 200 to 1000000, got ${replicates}`);
  }

  const { mu, sigma } = fit;
  const refit = refitter(fit.method, { mu, sigma }, values.length);
  // The pivots are only valid if fit is this method's estimate from these very values.
  const again = refit(Float64Array.from(detected, Math.log), Float64Array.from(detectionLimits, Math.log));
  if (again === null || Math.abs(again.mu - mu) > 1e-6 * sigma || Math.abs(again.sigma - sigma) > 1e-6 * sigma) {
    throw new RangeError(
      `${functionName}: the fit (mu ${mu}, sigma ${sigma}) is not the ${METHOD_NAMES[fit.method]} estimate for these values; pass the fit made from the same values`,
    );
  }

  const logLimits = simulationLogLimits(values);
  const n = values.length;
  const random = createRandom(seed);
  const logOel = Math.log(oel);
  const logPercentile = new Float64Array(replicates);
  const exceedance = new Float64Array(replicates);
  const logMean = new Float64Array(replicates);
  const detectedBuffer = new Float64Array(n);
  const limitBuffer = new Float64Array(n);
  const maxAttempts = 2 * replicates;
  let attempts = 0;
  let redrawn = 0;
  for (let r = 0; r < replicates;) {
    if (attempts >= maxAttempts) {
      throw new RangeError(
        `${functionName}: more than half of ${attempts} simulated data sets broke the rules for non-detects ` +
          `(at least ${NONDETECT_RULES.minDetected} detected values, at most ${NONDETECT_RULES.maxNonDetectShare * 100} % non-detects); ` +
          'with this much censoring the limits cannot be computed — more results are needed',
      );
    }
    attempts += 1;
    let detectedCount = 0;
    let limitCount = 0;
    for (let i = 0; i < n; i++) {
      const y = mu + sigma * random.normal();
      if (y < logLimits[i]) limitBuffer[limitCount++] = logLimits[i];
      else detectedBuffer[detectedCount++] = y;
    }
    const estimate =
      detectedCount < NONDETECT_RULES.minDetected || limitCount / n > NONDETECT_RULES.maxNonDetectShare
        ? null
        : refit(detectedBuffer.subarray(0, detectedCount), limitBuffer.subarray(0, limitCount));
    if (estimate === null || !(estimate.sigma > 0)) {
      redrawn += 1;
      continue;
    }
    const m = mu - ((estimate.mu - mu) * sigma) / estimate.sigma;
    const s = (sigma * sigma) / estimate.sigma;
    logPercentile[r] = m + Z_95 * s;
    exceedance[r] = normalCdf((m - logOel) / s);
    logMean[r] = m + 0.5 * s * s;
    r += 1;
  }
  logPercentile.sort();
  exceedance.sort();
  logMean.sort();
  const upper = Math.ceil(0.95 * replicates) - 1;
  const lower = Math.ceil(0.05 * replicates) - 1;
  const limits = {
    utl95_95: Math.exp(logPercentile[upper]),
    exceedanceFractionLower: exceedance[lower],
    exceedanceFractionUpper: exceedance[upper],
    amUcl95: Math.exp(logMean[upper]),
    amLcl95: Math.exp(logMean[lower]),
  };
  for (const [name, value] of Object.entries(limits)) {
    if (!Number.isFinite(value)) {
      throw new RangeError(`${functionName}: ${name} is not a finite number (${value}); the data are too spread out for these limits`);
    }
  }
  return {
    ...limits,
    method:
      `Parametric bootstrap with generalized pivotal quantities (Efron & Tibshirani 1993; Krishnamoorthy & Mathew 2003): ` +
      `${replicates} simulated data sets of ${n} results with the same detection limits, each refitted by ${METHOD_NAMES[fit.method]}; ` +
      `one-sided 95 % limits; seed ${seed}; ${redrawn} simulated data set${redrawn === 1 ? '' : 's'} that broke the non-detect rules redrawn.`,
  };
}
