import { normalQuantile } from './normal-distribution';

/**
 * Log-probability plot: each result's natural log against the normal score of its plotting
 * position, with the line of the fitted lognormal, ln x = μ + σ·z. Points on a straight line
 * mean the lognormal model fits.
 *
 * Plotting positions for complete data: Blom (1958), "Statistical Estimates and Transformed
 * Beta-Variables", p_i = (i − 3/8)/(n + 1/4), the positions whose normal scores approximate the
 * expected normal order statistics (the same scores as the Shapiro–Wilk coefficients). For
 * censored data the non-detect module supplies Hirsch–Stedinger positions (Helsel 2012) and
 * imputed values, which are plotted as given.
 */

export interface ProbabilityPlotPoint {
  /** The value plotted (for a non-detect, the value the censored-data method gives it). */
  value: number;
  /** Its plotting position, a probability in (0, 1). */
  p: number;
  /** Normal score Φ⁻¹(p): the x axis. */
  z: number;
  nonDetect: boolean;
}

export interface ProbabilityPlot {
  points: ProbabilityPlotPoint[];
  /** The fitted line ln x = intercept + slope·z (intercept = ln GM, slope = ln GSD), drawn between the end points. */
  line: { intercept: number; slope: number; from: { z: number; value: number }; to: { z: number; value: number } };
  plottingPositions: 'blom' | 'supplied';
}

/** Blom plotting positions (i − 3/8)/(n + 1/4), i = 1…n. blomPositions(3) → [0.1923…, 0.5, 0.8076…] */
export function blomPositions(n: number): number[] {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`blomPositions: n must be a positive integer, got ${n}`);
  return Array.from({ length: n }, (_, i) => (i + 1 - 0.375) / (n + 0.25));
}

function fittedLine(points: readonly ProbabilityPlotPoint[], fit: { mu: number; sigma: number }): ProbabilityPlot['line'] {
  const zs = points.map((p) => p.z);
  const low = Math.min(...zs);
  const high = Math.max(...zs);
  return {
    intercept: fit.mu,
    slope: fit.sigma,
    from: { z: low, value: Math.exp(fit.mu + fit.sigma * low) },
    to: { z: high, value: Math.exp(fit.mu + fit.sigma * high) },
  };
}

function checkFit(functionName: string, fit: { mu: number; sigma: number }): void {
  if (!Number.isFinite(fit.mu) || !(fit.sigma > 0) || !Number.isFinite(fit.sigma)) {
    throw new RangeError(`${functionName}: the fit needs a finite mu and a finite sigma > 0, got mu ${fit.mu}, sigma ${fit.sigma}`);
  }
}

/** The plot for complete data (every value detected) with Blom plotting positions. */
export function logProbabilityPlot(values: readonly number[], fit: { mu: number; sigma: number }): ProbabilityPlot {
  checkFit('logProbabilityPlot', fit);
  if (values.length < 1) throw new RangeError('logProbabilityPlot: needs at least one value');
  values.forEach((x, i) => {
    if (!(x > 0) || !Number.isFinite(x)) throw new RangeError(`logProbabilityPlot: value ${i + 1} must be a finite number > 0, got ${x}`);
  });
  const sorted = [...values].sort((a, b) => a - b);
  const positions = blomPositions(sorted.length);
  const points = sorted.map((value, i) => ({ value, p: positions[i], z: normalQuantile(positions[i]), nonDetect: false }));
  return { points, line: fittedLine(points, fit), plottingPositions: 'blom' };
}

/** The plot from plotting positions supplied by a censored-data method (e.g. ROS), sorted by position. */
export function logProbabilityPlotFromPositions(
  supplied: readonly { value: number; p: number; nonDetect: boolean }[],
  fit: { mu: number; sigma: number },
): ProbabilityPlot {
  checkFit('logProbabilityPlotFromPositions', fit);
  if (supplied.length < 1) throw new RangeError('logProbabilityPlotFromPositions: needs at least one point');
  supplied.forEach((point, i) => {
    if (!(point.value > 0) || !Number.isFinite(point.value) || !(point.p > 0 && point.p < 1)) {
      throw new RangeError(
        `logProbabilityPlotFromPositions: point ${i + 1} needs a value > 0 and a position strictly between 0 and 1, got ${point.value} at ${point.p}`,
      );
    }
  });
  const points = [...supplied]
    .sort((a, b) => a.p - b.p)
    .map((point) => ({ value: point.value, p: point.p, z: normalQuantile(point.p), nonDetect: point.nonDetect }));
  return { points, line: fittedLine(points, fit), plottingPositions: 'supplied' };
}
