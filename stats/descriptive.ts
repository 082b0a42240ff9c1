import type { ShiftValue } from './types';

/**
 * Descriptive statistics of an exposure group's shift results. Sample statistics (arithmetic mean
 * and SD with divisor n − 1, median, geometric mean and GSD) follow their textbook definitions
 * (e.g. NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.1–1.3.5.6; GM and GSD as in
 * Leidel, Busch & Lynch 1977, NIOSH OESSM, Technical Appendix). With non-detects they are not
 * defined (a "< LOD" is not a number), so they are null here and the censored-data fit supplies
 * the model-based figures (see assess-group.ts).
 */

export interface DescriptiveStatistics {
  /** Number of results. */
  n: number;
  /** Number of non-detects ("< LOD"). */
  nonDetects: number;
  /** Smallest and largest detected value. */
  minimum: number;
  maximum: number;
  /** Lowest and highest detection limit of the non-detects, or null without non-detects. */
  detectionLimits: { lowest: number; highest: number } | null;
  /** Sample statistics; null when there are non-detects. */
  arithmeticMean: number | null;
  standardDeviation: number | null;
  median: number | null;
  geometricMean: number | null;
  geometricStandardDeviation: number | null;
  /** Detected results above the OEL, and their share of all results. */
  countAboveOel: number;
  shareAboveOel: number;
  /** Non-detects whose detection limit is above the OEL: they cannot be placed either side of it. */
  nonDetectsAboveOel: number;
  /** Detected results above the action level and their share; null when no action level is given. */
  countAboveActionLevel: number | null;
  shareAboveActionLevel: number | null;
}

/** Median of sorted numbers: the middle one, or the mean of the middle two (NIST/SEMATECH §1.3.5.1). */
export function medianOfSorted(sorted: readonly number[]): number {
  const n = sorted.length;
  if (n === 0) throw new RangeError('medianOfSorted: needs at least one value');
  const middle = Math.floor(n / 2);
  return n % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

/**
 * Descriptive statistics of shift results against the OEL (and action level, when given).
 * Requires at least one detected value, every value a finite number > 0, and a finite OEL > 0.
 */
export function describeShiftValues(values: readonly ShiftValue[], limits: { oel: number; actionLevel?: number }): DescriptiveStatistics {
  const { oel, actionLevel } = limits;
  if (!(oel > 0) || !Number.isFinite(oel)) throw new RangeError(`describeShiftValues: the OEL must be a finite number > 0, got ${oel}`);
  if (actionLevel !== undefined && (!(actionLevel > 0) || !Number.isFinite(actionLevel))) {
    throw new RangeError(`describeShiftValues: the action level must be a finite number > 0, got ${actionLevel}`);
  }
  const detected: number[] = [];
  const detectionLimits: number[] = [];
  values.forEach((v, i) => {
    if (!(v.value > 0) || !Number.isFinite(v.value)) {
      throw new RangeError(`describeShiftValues: result ${i + 1} must be a finite number > 0, got ${v.value}`);
    }
    (v.nonDetect ? detectionLimits : detected).push(v.value);
  });
  if (detected.length === 0) throw new RangeError('describeShiftValues: needs at least one detected value');
  const n = values.length;
  const sorted = [...detected].sort((a, b) => a - b);
  const complete = detectionLimits.length === 0;

  let mean: number | null = null;
  let sd: number | null = null;
  let gm: number | null = null;
  let gsd: number | null = null;
  if (complete) {
    let sum = 0;
    let logSum = 0;
    for (const x of detected) {
      sum += x;
      logSum += Math.log(x);
    }
    mean = sum / n;
    const logMean = logSum / n;
    let squares = 0;
    let logSquares = 0;
    for (const x of detected) {
      squares += (x - mean) ** 2;
      logSquares += (Math.log(x) - logMean) ** 2;
    }
    sd = n > 1 ? Math.sqrt(squares / (n - 1)) : null;
    gm = Math.exp(logMean);
    gsd = n > 1 ? Math.exp(Math.sqrt(logSquares / (n - 1))) : null;
  }
  const countAboveOel = detected.filter((x) => x > oel).length;
  const countAboveActionLevel = actionLevel === undefined ? null : detected.filter((x) => x > actionLevel).length;
  return {
    n,
    nonDetects: detectionLimits.length,
    minimum: sorted[0],
    maximum: sorted[sorted.length - 1],
    detectionLimits: complete ? null : { lowest: Math.min(...detectionLimits), highest: Math.max(...detectionLimits) },
    arithmeticMean: mean,
    standardDeviation: sd,
    median: complete ? medianOfSorted(sorted) : null,
    geometricMean: gm,
    geometricStandardDeviation: gsd,
    countAboveOel,
    shareAboveOel: countAboveOel / n,
    nonDetectsAboveOel: detectionLimits.filter((x) => x > oel).length,
    countAboveActionLevel,
    shareAboveActionLevel: countAboveActionLevel === null ? null : countAboveActionLevel / n,
  };
}
