/**
 * Shift results with non-detects, split for the censored-data methods: the natural logs of the
 * detected values and the natural logs of the non-detects' detection limits (the lognormal model
 * of Helsel 2012, "Statistics for Censored Environmental Data", 2nd ed., ch. 6, works on logs).
 */
import type { ShiftValue } from './types';

/** Logs of detected values and of detection limits, each in input order. */
export interface CensoredLogs {
  detectedLogs: number[];
  limitLogs: number[];
}

/**
 * Splits shift results into detected logs and detection-limit logs. Every value (for a non-detect,
 * its detection limit) must be a finite number > 0; otherwise a RangeError names `functionName`
 * and the result number (1-based).
 */
export function censoredLogs(values: readonly ShiftValue[], functionName: string): CensoredLogs {
  const detectedLogs: number[] = [];
  const limitLogs: number[] = [];
  values.forEach((v, i) => {
    if (!(v.value > 0) || !Number.isFinite(v.value)) {
      const what = v.nonDetect ? 'detection limit' : 'value';
      throw new RangeError(`${functionName}: result ${i + 1} has ${what} ${v.value}; it must be a finite number > 0`);
    }
    (v.nonDetect ? limitLogs : detectedLogs).push(Math.log(v.value));
  });
  return { detectedLogs, limitLogs };
}

/**
 * Runs `body`, re-labelling a RangeError from the inner function `inner` as coming from `outer`,
 * so that the message names the function the caller called.
 */
export function renamingRangeErrors<T>(inner: string, outer: string, body: () => T): T {
  try {
    return body();
  } catch (error) {
    if (error instanceof RangeError && error.message.startsWith(`${inner}:`)) {
      throw new RangeError(outer + error.message.slice(inner.length), { cause: error });
    }
    throw error;
  }
}
