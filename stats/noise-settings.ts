/**
 * Organization settings for the noise-log wear check, masking and calibration check, with the
 * defaults of the product brief (PRODUCT.md, "Noise log format, version 1").
 */
export interface NoiseSettings {
  /** A still stretch is a run of non-moving intervals at least this long, minutes. Default 15. */
  readonly stillMinutes: number;
  /** Change of the mean acceleration vector between intervals that counts as motion, mg. Default 30. */
  readonly motionThresholdMg: number;
  /** An interval whose apeak_mg reaches this is a knock, mg. Default 3000. */
  readonly knockThresholdMg: number;
  /** A knock's proposed mask starts this long before the knock interval, s. Default 2. */
  readonly maskBeforeS: number;
  /** A knock's proposed mask ends this long after the knock interval, s. Default 3. */
  readonly maskAfterS: number;
  /**
   * Calibration drift (after − before) beyond which the log is flagged, dB. Default 0.5:
   * ISO 9612:2009 asks to discard a series whose field-calibration check drifts by more than
   * 0.5 dB (from memory, to be verified against the text); flagging 0.5–1 dB is common practice.
   */
  readonly driftLimitDb: number;
}

/** PRODUCT.md defaults. */
export const defaultNoiseSettings: NoiseSettings = Object.freeze({
  stillMinutes: 15,
  motionThresholdMg: 30,
  knockThresholdMg: 3000,
  maskBeforeS: 2,
  maskAfterS: 3,
  driftLimitDb: 0.5,
});

const rules: Record<keyof NoiseSettings, { min: number; max: number; minExclusive: boolean }> = {
  stillMinutes: { min: 0, max: 24 * 60, minExclusive: true },
  motionThresholdMg: { min: 0, max: 100_000, minExclusive: true },
  knockThresholdMg: { min: 0, max: 1_000_000, minExclusive: true },
  maskBeforeS: { min: 0, max: 3600, minExclusive: false },
  maskAfterS: { min: 0, max: 3600, minExclusive: false },
  driftLimitDb: { min: 0, max: 20, minExclusive: true },
};

/**
 * Fill missing settings with the defaults and check each one. Throws a RangeError naming the
 * setting when a value is not a finite number in its range (e.g. stillMinutes must be > 0).
 */
export function resolveNoiseSettings(partial: Partial<NoiseSettings> = {}): NoiseSettings {
  const settings = { ...defaultNoiseSettings };
  for (const key of Object.keys(rules) as (keyof NoiseSettings)[]) {
    const value = partial[key];
    if (value === undefined) continue;
    const rule = rules[key];
    const aboveMin = rule.minExclusive ? value > rule.min : value >= rule.min;
    if (typeof value !== 'number' || !Number.isFinite(value) || !aboveMin || value > rule.max) {
      throw new RangeError(
        `resolveNoiseSettings: ${key} must be a number ${rule.minExclusive ? '>' : '≥'} ${rule.min} and ≤ ${rule.max}, got ${String(value)}`,
      );
    }
    settings[key] = value;
  }
  return Object.freeze(settings);
}
