/**
 * Wear check of a noise log: which intervals show motion, still stretches (the meter probably not
 * worn), knocks (mechanical shocks on the instrument) and the masked spans proposed for knocks.
 * Definitions: PRODUCT.md, "Noise log format, version 1", wear check paragraph. The thresholds are
 * organization settings (common practice; no standard fixes them).
 */
import { noiseLogEndSeconds, noiseLogTimeToleranceSeconds, type NoiseLog } from './noise-log';
import type { NoiseMaskSpan } from './noise-exposure';
import type { NoiseSettings } from './noise-settings';

/** Where the motion flags came from. */
export type NoiseMotionSource = 'moving-column' | 'acceleration';

/** A maximal run of contiguous non-moving intervals at least the still-time setting long. */
export interface NoiseStillStretch {
  /** Start of the first interval, s. */
  readonly startS: number;
  /** End of the last interval, s. */
  readonly endS: number;
  /** Index of the first and one past the last interval. */
  readonly firstIndex: number;
  readonly endIndex: number;
}

/** An interval whose peak acceleration reached the knock threshold. */
export interface NoiseKnock {
  /** Start of the knock interval, s. */
  readonly tS: number;
  /** apeak_mg of the interval. */
  readonly peakMg: number;
  readonly index: number;
}

/** A masked span proposed by the wear check, with the knock it comes from. */
export interface NoiseProposedMask extends NoiseMaskSpan {
  readonly reason: string;
  readonly knock: NoiseKnock;
}

/** Result of the wear check. */
export interface NoiseWearCheck {
  /** False when the log has neither a moving column nor acceleration: no still stretches or knocks. */
  readonly available: boolean;
  readonly motionSource: NoiseMotionSource | null;
  /** Motion flag per interval (1 = moving); null when unavailable. */
  readonly moving: Uint8Array | null;
  /** null when the wear check is unavailable. */
  readonly stillStretches: NoiseStillStretch[] | null;
  /** null when the wear check is unavailable or the log has no apeak_mg column. */
  readonly knocks: NoiseKnock[] | null;
  readonly proposedMasks: NoiseProposedMask[];
}

/**
 * Motion flag per interval. With a `moving` column it is used as is; otherwise an interval is
 * moving when the Euclidean change of its mean acceleration vector from the previous interval in
 * the log is ≥ `motionThresholdMg` (the first interval is not moving). null with neither column.
 * Method: PRODUCT.md wear check (common practice).
 */
export function detectMotion(log: NoiseLog, motionThresholdMg: number): { moving: Uint8Array; source: NoiseMotionSource } | null {
  if (log.moving) return { moving: log.moving, source: 'moving-column' };
  if (!log.acceleration) return null;
  if (!(motionThresholdMg > 0)) throw new RangeError(`detectMotion: motionThresholdMg must be > 0, got ${motionThresholdMg}`);
  const { xMg, yMg, zMg } = log.acceleration;
  const moving = new Uint8Array(log.length);
  const thresholdSquared = motionThresholdMg * motionThresholdMg;
  for (let i = 1; i < log.length; i++) {
    const dx = xMg[i] - xMg[i - 1];
    const dy = yMg[i] - yMg[i - 1];
    const dz = zMg[i] - zMg[i - 1];
    // Compare squares: avoids a square root per interval and is exact at the threshold for integers.
    if (dx * dx + dy * dy + dz * dz >= thresholdSquared) moving[i] = 1;
  }
  return { moving, source: 'acceleration' };
}

/** True when interval i starts where interval i − 1 ends (no pause between them). */
function followsWithoutPause(log: NoiseLog, i: number): boolean {
  return log.tS[i] - log.tS[i - 1] <= log.intervalSeconds + noiseLogTimeToleranceSeconds;
}

/**
 * Maximal runs of contiguous non-moving intervals whose span (first start to last end) is at least
 * `stillMinutes`; a pause ends a run. Method: PRODUCT.md wear check.
 */
export function findStillStretches(log: NoiseLog, moving: Uint8Array, stillMinutes: number): NoiseStillStretch[] {
  if (!(stillMinutes > 0)) throw new RangeError(`findStillStretches: stillMinutes must be > 0, got ${stillMinutes}`);
  if (moving.length !== log.length) throw new RangeError('findStillStretches: one motion flag per interval is required');
  const limitSeconds = stillMinutes * 60;
  const stretches: NoiseStillStretch[] = [];
  let runStart = -1;
  const close = (endIndex: number) => {
    if (runStart < 0) return;
    const startS = log.tS[runStart];
    const endS = log.tS[endIndex - 1] + log.intervalSeconds;
    // A microsecond of slack so a run of exactly the limit is not lost to binary rounding of t_s.
    if (endS - startS >= limitSeconds - 1e-6) stretches.push({ startS, endS, firstIndex: runStart, endIndex });
    runStart = -1;
  };
  for (let i = 0; i < log.length; i++) {
    if (i > 0 && !followsWithoutPause(log, i)) close(i);
    if (moving[i] === 1) close(i);
    else if (runStart < 0) runStart = i;
  }
  close(log.length);
  return stretches;
}

/** Intervals with apeak_mg ≥ the knock threshold; null when the log has no apeak_mg column. */
export function findKnocks(log: NoiseLog, knockThresholdMg: number): NoiseKnock[] | null {
  if (!(knockThresholdMg > 0)) throw new RangeError(`findKnocks: knockThresholdMg must be > 0, got ${knockThresholdMg}`);
  const peaks = log.apeakMg;
  if (!peaks) return null;
  const knocks: NoiseKnock[] = [];
  for (let i = 0; i < log.length; i++) {
    if (peaks[i] >= knockThresholdMg) knocks.push({ tS: log.tS[i], peakMg: peaks[i], index: i });
  }
  return knocks;
}

/**
 * One proposed masked span per knock: from `maskBeforeS` before the knock interval's start to
 * `maskAfterS` after its end, clipped to the log. Method: PRODUCT.md wear check.
 */
export function proposeKnockMasks(
  log: NoiseLog,
  knocks: readonly NoiseKnock[],
  settings: Pick<NoiseSettings, 'maskBeforeS' | 'maskAfterS'>,
): NoiseProposedMask[] {
  const logStart = log.tS[0];
  const logEnd = noiseLogEndSeconds(log);
  return knocks.map((knock) => ({
    startS: Math.max(logStart, knock.tS - settings.maskBeforeS),
    endS: Math.min(logEnd, knock.tS + log.intervalSeconds + settings.maskAfterS),
    reason: `knock: ${knock.peakMg} mg peak acceleration at ${knock.tS} s`,
    knock,
  }));
}

/** Run the whole wear check with the given settings. */
export function runWearCheck(log: NoiseLog, settings: NoiseSettings): NoiseWearCheck {
  const motion = detectMotion(log, settings.motionThresholdMg);
  if (!motion) {
    return { available: false, motionSource: null, moving: null, stillStretches: null, knocks: null, proposedMasks: [] };
  }
  const knocks = findKnocks(log, settings.knockThresholdMg);
  return {
    available: true,
    motionSource: motion.source,
    moving: motion.moving,
    stillStretches: findStillStretches(log, motion.moving, settings.stillMinutes),
    knocks,
    proposedMasks: knocks ? proposeKnockMasks(log, knocks, settings) : [],
  };
}
