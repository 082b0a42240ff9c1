/**
 * Adjusting an 8-hour TWA limit for a longer work shift.
 *
 * Method: Brief & Scala (1975), "Occupational exposure limits for novel work schedules",
 * American Industrial Hygiene Association Journal 36:467–469 (journal and pages from memory).
 * The reduction factor for a daily shift of h hours is
 *     RF = (8 / h) × (24 − h) / 16,
 * the first factor for the longer exposure, the second for the shorter recovery before the next
 * shift. Checks (REFERENCES.md): 10 h → 0.7, 12 h → 0.5; a 100 ppm limit over 12 h becomes 50 ppm.
 *
 * The model is for substances with cumulative or systemic effects judged against an 8-hour TWA;
 * it is not meant for irritants judged on peaks, for short-term or ceiling limits, nor for noise
 * (whose exchange rate already prices the duration). The limit is never raised for a shift of
 * 8 h or less (common practice: RF is capped at 1).
 */

/**
 * Brief & Scala daily reduction factor, capped at 1.
 * `briefScalaReductionFactor(10)` → 0.7; `briefScalaReductionFactor(12)` → 0.5.
 */
export function briefScalaReductionFactor(shiftHours: number): number {
  if (!Number.isFinite(shiftHours) || shiftHours <= 0 || shiftHours > 24) {
    throw new RangeError(`briefScalaReductionFactor: shiftHours must be a number above 0 and at most 24, got ${shiftHours}`);
  }
  if (shiftHours <= 8) return 1;
  return (8 / shiftHours) * ((24 - shiftHours) / 16);
}

/** An 8-hour limit adjusted for the shift: `oel × briefScalaReductionFactor(hours)`. */
export function briefScalaAdjustedLimit(oel: number, shiftHours: number): number {
  if (!Number.isFinite(oel) || oel <= 0) throw new RangeError(`briefScalaAdjustedLimit: the OEL must be a number above 0, got ${oel}`);
  return oel * briefScalaReductionFactor(shiftHours);
}
