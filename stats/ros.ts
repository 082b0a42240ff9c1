/**
 * Robust regression on order statistics (robust ROS) for left-censored lognormal data with one or
 * several detection limits.
 *
 * Method: Helsel, D. R. & Cohn, T. A. (1988), "Estimation of descriptive statistics for multiply
 * censored water quality data", Water Resources Research 24(12):1997–2004; Helsel, D. R. (2012),
 * "Statistics for Censored Environmental Data Using Minitab and R", 2nd ed., ch. 6 (robust ROS).
 * Plotting positions for several detection limits: Hirsch, R. M. & Stedinger, J. R. (1987),
 * "Plotting positions for historical floods and their precision", Water Resources Research
 * 23(4):715–727, in the form given by Helsel & Cohn (1988):
 *
 *   detection limits DL_1 < … < DL_m (plus DL_0 = 0 when a detected value lies below DL_1),
 *   A_j = detected values in [DL_j, DL_j+1),  B_j = results below DL_j (detected values < DL_j
 *   and non-detects with limit ≤ DL_j),  C_j = non-detects at DL_j,
 *   pe_m+1 = 0,  pe_j = pe_j+1 + A_j/(A_j + B_j)·(1 − pe_j+1),  pe_0 = 1;
 *   r-th smallest detected value of interval j:  p = (1 − pe_j) + (pe_j − pe_j+1)·r/(A_j + 1);
 *   r-th non-detect at DL_j:                      p = (1 − pe_j)·r/(C_j + 1).
 *
 * Then log(detected value) is regressed on the normal score Φ⁻¹(p) by least squares, each
 * non-detect is imputed from the fitted line at its own plotting position, and the detected
 * values are kept as measured ("robust": the model fills in only the censored part). The
 * imputed values are not clipped at their detection limits, as in the published method.
 */
import type { ShiftValue } from './types';
import { normalQuantile } from './normal-distribution';
import { censoredLogs, renamingRangeErrors } from './censored-sample';

/** Plotting positions in the order of the inputs. */
export interface HirschStedingerPositions {
  /** Plotting position of each detected value, in input order. */
  detected: number[];
  /** Plotting position of each non-detect, in input order. */
  nonDetect: number[];
}

/** Numbers readable by index: plain arrays and typed arrays. */
type Numbers = { readonly length: number; readonly [index: number]: number };

/**
 * The Hirsch–Stedinger formulas (file comment) on sorted inputs: `detected` (k values) and `limits`
 * (c limits, repeats allowed) both ascending. Writes the position of the r-th smallest detected
 * value to detectedOut[r] and, for non-detects taken in limit order, the r-th at each limit
 * getting (1 − pe_j)·r/(C_j + 1), to nonDetectOut. Allocates nothing, for the bootstrap.
 */
function hirschStedingerSorted(
  detected: Numbers,
  k: number,
  limits: Numbers,
  c: number,
  detectedOut: Float64Array | number[],
  nonDetectOut: Float64Array | number[],
): void {
  if (c === 0) {
    // No censoring: the formula reduces to the Weibull positions r/(n + 1).
    for (let r = 0; r < k; r++) detectedOut[r] = (r + 1) / (k + 1);
    return;
  }
  // Walk the distinct limits from the highest down: pe_j = pe_j+1 + A_j/(A_j + B_j)·(1 − pe_j+1),
  // A_j = detected in [DL_j, DL_j+1), B_j = detected < DL_j plus non-detects ≤ DL_j.
  // Positions of interval j need pe_j and pe_j+1, so they are written on the way down.
  let exceedanceAbove = 0; // pe_j+1
  let detectedAbove = k; // detected values below DL_j+1 (all of them above the top limit)
  let groupEnd = c; // non-detects with limit ≤ DL_j are limits[0 … groupEnd − 1]
  let cursor = k; // scan of detected values from the top
  while (groupEnd > 0) {
    const limit = limits[groupEnd - 1];
    let groupStart = groupEnd - 1;
    while (groupStart > 0 && limits[groupStart - 1] === limit) groupStart -= 1;
    while (cursor > 0 && detected[cursor - 1] >= limit) cursor -= 1;
    const a = detectedAbove - cursor;
    const b = cursor + groupEnd;
    const exceedance = exceedanceAbove + (a / (a + b)) * (1 - exceedanceAbove);
    for (let r = 1; r <= a; r++) {
      detectedOut[cursor + r - 1] = 1 - exceedance + (exceedance - exceedanceAbove) * (r / (a + 1));
    }
    const atLimit = groupEnd - groupStart;
    for (let r = 1; r <= atLimit; r++) nonDetectOut[groupStart + r - 1] = (1 - exceedance) * (r / (atLimit + 1));
    exceedanceAbove = exceedance;
    detectedAbove = cursor;
    groupEnd = groupStart;
  }
  // Detected values below the lowest limit: interval 0 with pe_0 = 1.
  for (let r = 1; r <= cursor; r++) detectedOut[r - 1] = (r / (cursor + 1)) * (1 - exceedanceAbove);
}

/**
 * Hirsch–Stedinger plotting positions for data with several detection limits (Hirsch & Stedinger
 * 1987, in Helsel & Cohn's 1988 form; see the file comment). Works on any increasing scale (raw
 * values or their logs give the same positions). Tied detected values, and non-detects sharing a
 * limit, are ranked in input order. Every position lies strictly between 0 and 1.
 */
export function hirschStedingerPositions(detected: readonly number[], detectionLimits: readonly number[]): HirschStedingerPositions {
  for (const x of detected) if (Number.isNaN(x)) throw new RangeError('hirschStedingerPositions: detected values must be numbers, got NaN');
  for (const x of detectionLimits) if (Number.isNaN(x)) throw new RangeError('hirschStedingerPositions: detection limits must be numbers, got NaN');
  const detectedOrder = sortedIndexes(detected);
  const limitOrder = sortedIndexes(detectionLimits);
  const sortedDetected = new Float64Array(detectedOrder.map((i) => detected[i]));
  const sortedLimits = new Float64Array(limitOrder.map((i) => detectionLimits[i]));
  const detectedSorted = new Float64Array(detected.length);
  const nonDetectSorted = new Float64Array(detectionLimits.length);
  hirschStedingerSorted(sortedDetected, detected.length, sortedLimits, detectionLimits.length, detectedSorted, nonDetectSorted);
  const detectedPositions = new Array<number>(detected.length);
  detectedOrder.forEach((index, r) => (detectedPositions[index] = detectedSorted[r]));
  const nonDetectPositions = new Array<number>(detectionLimits.length);
  limitOrder.forEach((index, r) => (nonDetectPositions[index] = nonDetectSorted[r]));
  return { detected: detectedPositions, nonDetect: nonDetectPositions };
}

/** Indexes sorting `values` ascending; equal values keep input order (Array.prototype.sort is stable). */
function sortedIndexes(values: readonly number[]): number[] {
  return values.map((_, i) => i).sort((a, b) => values[a] - values[b]);
}

/** Working arrays for rosSortedLogs, reused across calls; each needs room for every result. */
export interface RosScratch {
  detectedPositions: Float64Array;
  detectedScores: Float64Array;
  nonDetectPositions: Float64Array;
  /** Imputed logs of the non-detects (limit order), the fitted line at their normal scores. */
  nonDetectScores: Float64Array;
}

/** Working arrays for `size` results. */
export function createRosScratch(size: number): RosScratch {
  return {
    detectedPositions: new Float64Array(size),
    detectedScores: new Float64Array(size),
    nonDetectPositions: new Float64Array(size),
    nonDetectScores: new Float64Array(size),
  };
}

/**
 * Robust ROS on sorted log data (detectedLogs[0 … k − 1] and limitLogs[0 … c − 1] ascending),
 * returning the fitted line and the mean and SD (n − 1) of the combined logs. The plotting
 * positions, normal scores and imputed logs are left in `scratch` (non-detects in limit order). Checks
 * nothing: callers validate. Null when the line has no positive slope (all detected equal).
 */
export function rosSortedLogs(
  detectedLogs: Numbers,
  k: number,
  limitLogs: Numbers,
  c: number,
  quantile: (p: number) => number,
  scratch: RosScratch,
): { mu: number; sigma: number; intercept: number; slope: number } | null {
  const { detectedPositions, detectedScores, nonDetectPositions } = scratch;
  hirschStedingerSorted(detectedLogs, k, limitLogs, c, detectedPositions, nonDetectPositions);
  // Least squares of log value on the normal score Φ⁻¹(p).
  let meanScore = 0;
  let meanLog = 0;
  for (let i = 0; i < k; i++) {
    detectedScores[i] = quantile(detectedPositions[i]);
    meanScore += detectedScores[i];
    meanLog += detectedLogs[i];
  }
  meanScore /= k;
  meanLog /= k;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < k; i++) {
    const dx = detectedScores[i] - meanScore;
    sxx += dx * dx;
    sxy += dx * (detectedLogs[i] - meanLog);
  }
  const slope = sxy / sxx;
  if (!(slope > 0)) return null;
  const intercept = meanLog - slope * meanScore;
  // The imputed logs are kept in nonDetectScores so Φ⁻¹ is evaluated once per non-detect.
  const imputed = scratch.nonDetectScores;
  let sum = meanLog * k;
  for (let j = 0; j < c; j++) {
    imputed[j] = intercept + slope * quantile(nonDetectPositions[j]);
    sum += imputed[j];
  }
  const n = k + c;
  const mu = sum / n;
  let squares = 0;
  for (let i = 0; i < k; i++) squares += (detectedLogs[i] - mu) ** 2;
  for (let j = 0; j < c; j++) squares += (imputed[j] - mu) ** 2;
  return { mu, sigma: Math.sqrt(squares / (n - 1)), intercept, slope };
}

/** Robust ROS on the log scale: the fitted line, the imputed logs and the combined log statistics. */
export interface RosLogFit {
  /** Mean of the combined logs (detected logs and imputed logs): the log of the geometric mean. */
  mu: number;
  /** Standard deviation (divisor n − 1) of the combined logs: the log of the GSD. */
  sigma: number;
  /** Fitted line log(x) = intercept + slope·Φ⁻¹(p) through the detected values. */
  intercept: number;
  slope: number;
  /** Plotting positions, in input order. */
  positions: HirschStedingerPositions;
  /** Imputed log value of each non-detect, in input order. */
  imputedLogs: number[];
}

/**
 * Robust ROS (Helsel & Cohn 1988; Helsel 2012, ch. 6) on data already on the log scale:
 * `detectedLogs` the logs of the detected values, `limitLogs` the log detection limit of each
 * non-detect. Needs at least 2 different detected values to fit the line.
 */
export function robustRosLogs(detectedLogs: readonly number[], limitLogs: readonly number[]): RosLogFit {
  for (const x of detectedLogs) if (!Number.isFinite(x)) throw new RangeError(`robustRosLogs: logs must be finite numbers, got ${x}`);
  for (const x of limitLogs) if (!Number.isFinite(x)) throw new RangeError(`robustRosLogs: logs must be finite numbers, got ${x}`);
  if (detectedLogs.length < 2) {
    throw new RangeError(`robustRosLogs: needs at least 2 detected values to fit the line, got ${detectedLogs.length}`);
  }
  const k = detectedLogs.length;
  const c = limitLogs.length;
  const detectedOrder = sortedIndexes(detectedLogs);
  const limitOrder = sortedIndexes(limitLogs);
  const scratch = createRosScratch(Math.max(k, c));
  const fit = rosSortedLogs(
    detectedOrder.map((i) => detectedLogs[i]),
    k,
    limitOrder.map((i) => limitLogs[i]),
    c,
    normalQuantile,
    scratch,
  );
  if (fit === null) {
    throw new RangeError('robustRosLogs: the detected values are all equal; the line through them has no slope');
  }
  const positions: HirschStedingerPositions = { detected: new Array<number>(k), nonDetect: new Array<number>(c) };
  const imputedLogs = new Array<number>(c);
  detectedOrder.forEach((index, r) => (positions.detected[index] = scratch.detectedPositions[r]));
  limitOrder.forEach((index, r) => {
    const p = scratch.nonDetectPositions[r];
    positions.nonDetect[index] = p;
    imputedLogs[index] = fit.intercept + fit.slope * normalQuantile(p);
  });
  return { mu: fit.mu, sigma: fit.sigma, intercept: fit.intercept, slope: fit.slope, positions, imputedLogs };
}

/** One result on the log-probability plot. */
export interface RosPoint {
  /** The detected value, or for a non-detect its detection limit. */
  value: number;
  nonDetect: boolean;
  /** Hirsch–Stedinger plotting position. */
  p: number;
  /** Φ⁻¹(p), the plot's horizontal axis. */
  normalScore: number;
  /** The detected value, or for a non-detect the value imputed from the fitted line. */
  estimate: number;
}

/** Robust ROS on shift results, in original units. */
export interface RosFit {
  /** Mean of the logs of detected and imputed values (log of the geometric mean). */
  mu: number;
  /** SD (n − 1) of the same logs (log of the geometric standard deviation). */
  sigma: number;
  /** Fitted line: log(value) = intercept + slope·Φ⁻¹(p). */
  line: { intercept: number; slope: number };
  /** One point per input result, in input order. */
  points: RosPoint[];
}

/**
 * Robust regression on order statistics for lognormal shift results with non-detects (Helsel &
 * Cohn 1988; Helsel 2012, ch. 6; see the file comment). Each value must be a finite number > 0
 * (for a non-detect, its detection limit); needs at least 2 different detected values.
 */
export function robustRos(values: readonly ShiftValue[]): RosFit {
  const { detectedLogs, limitLogs } = censoredLogs(values, 'robustRos');
  const fit = renamingRangeErrors('robustRosLogs', 'robustRos', () => robustRosLogs(detectedLogs, limitLogs));
  let d = 0;
  let c = 0;
  const points = values.map((v): RosPoint => {
    if (v.nonDetect) {
      const p = fit.positions.nonDetect[c];
      const estimate = Math.exp(fit.imputedLogs[c]);
      c += 1;
      return { value: v.value, nonDetect: true, p, normalScore: normalQuantile(p), estimate };
    }
    const p = fit.positions.detected[d];
    d += 1;
    return { value: v.value, nonDetect: false, p, normalScore: normalQuantile(p), estimate: v.value };
  });
  return { mu: fit.mu, sigma: fit.sigma, line: { intercept: fit.intercept, slope: fit.slope }, points };
}
