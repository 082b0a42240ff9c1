/**
 * The in-memory noise log: metadata plus one compact typed array per channel, as read from our
 * format version 1 (PRODUCT.md, "Noise log format, version 1"). The server stores each channel
 * as one binary blob and rebuilds the log with {@link noiseLogFromChannels}.
 */

/** Metadata from the leading `# key: value` lines. Absent optional keys are null. */
export interface NoiseLogMetadata {
  /** Format version (`noise-log: 1`). */
  readonly version: 1;
  /** `interval_s`: length of every interval, seconds (0.125–60). */
  readonly intervalSeconds: number;
  readonly instrument: string | null;
  /** Worker code, e.g. "RT-014". */
  readonly worker: string | null;
  /** ISO 8601 date-time with offset of t_s = 0. */
  readonly start: string | null;
  readonly shiftHours: number | null;
  readonly calibrationReferenceDb: number | null;
  readonly calibrationBeforeDb: number | null;
  readonly calibrationAfterDb: number | null;
  /** Other `# key: value` lines, kept as text (keys lower-cased). */
  readonly other: Readonly<Record<string, string>>;
}

/** Per-axis mean acceleration channels (all three or none). */
export interface NoiseLogAcceleration {
  readonly xMg: Float64Array;
  readonly yMg: Float64Array;
  readonly zMg: Float64Array;
}

/**
 * A parsed noise log. Interval i covers [tS[i], tS[i] + intervalSeconds); a jump in tS is a pause.
 * Levels and accelerations are Float64Array so that figures recomputed from the stored blobs equal
 * those computed from the file digit for digit (a 1 s, 12 h log is 43,200 × 8 bytes ≈ 0.35 MB per
 * channel).
 */
export interface NoiseLog {
  readonly metadata: NoiseLogMetadata;
  /** Same as metadata.intervalSeconds. */
  readonly intervalSeconds: number;
  /** Number of intervals. */
  readonly length: number;
  /** `t_s`: start of each interval, seconds from the log start; strictly increasing. */
  readonly tS: Float64Array;
  /** `laeq_db`: A-weighted equivalent level of each interval, dB. */
  readonly laeqDb: Float64Array;
  /** `lcpeak_db`: C-weighted peak level, dB; null when the column is absent. */
  readonly lcPeakDb: Float64Array | null;
  /** `ax_mg`, `ay_mg`, `az_mg`; null when the columns are absent. */
  readonly acceleration: NoiseLogAcceleration | null;
  /** `apeak_mg`: largest acceleration magnitude in the interval, mg; null when absent. */
  readonly apeakMg: Float64Array | null;
  /** `moving`: 1 when the instrument detected motion; null when absent. */
  readonly moving: Uint8Array | null;
}

/** Accepted ranges. A value outside them almost always means wrong units or a corrupt file. */
export const noiseLogLimits = Object.freeze({
  /** PRODUCT.md: interval_s 0.125–60. */
  intervalSeconds: { min: 0.125, max: 60 },
  /** Seconds from the start; one week covers any shift or multi-shift log. */
  tS: { min: 0, max: 7 * 86_400 },
  /** A-weighted interval level, dB. Dosimeters read roughly 40–140 dB; 170 leaves room. */
  laeqDb: { min: 0, max: 170 },
  /** C-weighted peak, dB. Undistorted sound in air tops out near 194 dB. */
  lcPeakDb: { min: 0, max: 200 },
  /** Mean acceleration per axis, mg (±200 g). */
  accelerationMg: { min: -200_000, max: 200_000 },
  /** Peak acceleration magnitude, mg. */
  apeakMg: { min: 0, max: 200_000 },
  /** Shift hours (metadata and --shift-hours). */
  shiftHours: { min: 0, max: 24 },
  /** Calibrator and check readings, dB (acoustic calibrators are 94 or 114 dB). */
  calibrationDb: { min: 40, max: 160 },
});

/**
 * Tolerance for comparing interval times, seconds. t_s written with few decimals (0.125 s written
 * as 0.13) must not read as overlap or pause; 10 ms is below any real pause and 8 % of the
 * shortest interval (common practice for rounding slack, chosen here).
 */
export const noiseLogTimeToleranceSeconds = 0.01;

/** Default size limit for a noise log file: 50 MB (50 × 1024 × 1024 bytes). */
export const defaultNoiseLogMaxBytes = 50 * 1024 * 1024;

/** Total measured time: number of intervals × interval length (pauses are not counted). */
export function noiseLogRunSeconds(log: NoiseLog): number {
  return log.length * log.intervalSeconds;
}

/** End of the last interval, seconds from the log start. */
export function noiseLogEndSeconds(log: NoiseLog): number {
  return log.tS[log.length - 1] + log.intervalSeconds;
}

/** Channels to rebuild a log from stored blobs (or from a generator). */
export interface NoiseLogChannels {
  readonly metadata: NoiseLogMetadata;
  readonly tS: Float64Array;
  readonly laeqDb: Float64Array;
  readonly lcPeakDb?: Float64Array | null;
  readonly acceleration?: NoiseLogAcceleration | null;
  readonly apeakMg?: Float64Array | null;
  readonly moving?: Uint8Array | null;
}

function checkChannel(name: string, values: ArrayLike<number>, length: number, range: { min: number; max: number }): void {
  if (values.length !== length) {
    throw new RangeError(`noiseLogFromChannels: channel ${name} has ${values.length} values, t_s has ${length}`);
  }
  for (let i = 0; i < length; i++) {
    const value = values[i];
    if (!(value >= range.min && value <= range.max)) {
      throw new RangeError(`noiseLogFromChannels: ${name}[${i}] = ${value} is outside ${range.min}–${range.max}`);
    }
  }
}

/**
 * Build a noise log from channel arrays, applying the same rules as the file reader (ranges,
 * strictly increasing t_s with no overlap, moving 0/1). Throws a RangeError naming the channel and
 * index. Used to rebuild a stored log and by the demo generator.
 */
export function noiseLogFromChannels(channels: NoiseLogChannels): NoiseLog {
  const { metadata, tS, laeqDb } = channels;
  const interval = metadata.intervalSeconds;
  if (!(interval >= noiseLogLimits.intervalSeconds.min && interval <= noiseLogLimits.intervalSeconds.max)) {
    throw new RangeError(`noiseLogFromChannels: intervalSeconds must be 0.125–60, got ${interval}`);
  }
  const length = tS.length;
  if (length === 0) throw new RangeError('noiseLogFromChannels: a log needs at least one interval');
  checkChannel('tS', tS, length, noiseLogLimits.tS);
  for (let i = 1; i < length; i++) {
    if (tS[i] - tS[i - 1] < interval - noiseLogTimeToleranceSeconds) {
      throw new RangeError(`noiseLogFromChannels: tS[${i}] = ${tS[i]} is less than one interval after tS[${i - 1}] = ${tS[i - 1]}`);
    }
  }
  checkChannel('laeqDb', laeqDb, length, noiseLogLimits.laeqDb);
  const lcPeakDb = channels.lcPeakDb ?? null;
  if (lcPeakDb) checkChannel('lcPeakDb', lcPeakDb, length, noiseLogLimits.lcPeakDb);
  const acceleration = channels.acceleration ?? null;
  if (acceleration) {
    checkChannel('acceleration.xMg', acceleration.xMg, length, noiseLogLimits.accelerationMg);
    checkChannel('acceleration.yMg', acceleration.yMg, length, noiseLogLimits.accelerationMg);
    checkChannel('acceleration.zMg', acceleration.zMg, length, noiseLogLimits.accelerationMg);
  }
  const apeakMg = channels.apeakMg ?? null;
  if (apeakMg) checkChannel('apeakMg', apeakMg, length, noiseLogLimits.apeakMg);
  const moving = channels.moving ?? null;
  if (moving) checkChannel('moving', moving, length, { min: 0, max: 1 });
  return { metadata, intervalSeconds: interval, length, tS, laeqDb, lcPeakDb, acceleration, apeakMg, moving };
}
