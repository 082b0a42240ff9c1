/**
 * The log-scale summary every classical lognormal method starts from: n, the mean ȳ and the
 * standard deviation s (divisor n − 1) of the natural logs of the results, so that the geometric
 * mean is exp(ȳ) and the geometric standard deviation exp(s) (Aitchison & Brown 1957, The
 * Lognormal Distribution, §5.1; Leidel, Busch & Lynch 1977, NIOSH OESSM, Technical Appendix).
 */

export interface LogScaleSummary {
  /** Number of results. */
  n: number;
  /** Mean of the natural logs, ȳ. */
  mean: number;
  /** Standard deviation of the natural logs with divisor n − 1, s. */
  sd: number;
}

/**
 * ȳ and s of the natural logs of positive values (two-pass, so no cancellation).
 * logScaleSummary([1, 10, 100]) → { n: 3, mean: ln 10, sd: ln 10 }
 */
export function logScaleSummary(values: readonly number[]): LogScaleSummary {
  const n = values.length;
  if (n < 2) throw new RangeError(`logScaleSummary: needs at least 2 values, got ${n}`);
  const logs = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    const value = values[i];
    if (!(value > 0) || !Number.isFinite(value)) {
      throw new RangeError(`logScaleSummary: value ${i + 1} must be a finite number > 0, got ${value}`);
    }
    logs[i] = Math.log(value);
  }
  let mean = 0;
  for (const y of logs) mean += y;
  mean /= n;
  let squares = 0;
  for (const y of logs) squares += (y - mean) * (y - mean);
  return { n, mean, sd: Math.sqrt(squares / (n - 1)) };
}

/**
 * Checks a summary handed to a method that needs n ≥ minimumN and s > 0; throws a RangeError
 * naming the calling function and the rule.
 */
export function checkLogScaleSummary(functionName: string, summary: LogScaleSummary, minimumN = 3): void {
  const { n, mean, sd } = summary;
  if (!Number.isInteger(n) || n < minimumN) {
    throw new RangeError(`${functionName}: n must be an integer of at least ${minimumN}, got ${n}`);
  }
  if (!Number.isFinite(mean)) throw new RangeError(`${functionName}: the log-scale mean must be a finite number, got ${mean}`);
  if (!(sd > 0) || !Number.isFinite(sd)) {
    throw new RangeError(`${functionName}: the log-scale standard deviation must be a positive finite number, got ${sd}`);
  }
}
