/**
 * Shared input types of the statistics engine. A shift result is a full-shift TWA (or a dose %)
 * for one worker on one day; a non-detect carries its detection limit as `value`.
 */
export interface ShiftValue {
  /** The measured value, or the detection limit when `nonDetect` is true. Must be > 0. */
  value: number;
  /** True when the lab reported "< LOD": the true value lies between 0 and `value`. */
  nonDetect: boolean;
  /** For an interval-censored result (Bayesian view only): the true value lies in [lower, value]. */
  lower?: number;
  /** Optional worker code, used by the between-worker analysis. */
  worker?: string;
  /** Optional ISO date, used for charts over time. */
  date?: string;
}

/** Exposure categories 0–4 on the 95th percentile as a share of the OEL: ≤1 %, ≤10 %, ≤50 %, ≤100 %, >100 %. */
export type ExposureCategory = 0 | 1 | 2 | 3 | 4;

export type Judgement = 'acceptable' | 'uncertain' | 'unacceptable';
