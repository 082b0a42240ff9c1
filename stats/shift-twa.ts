/**
 * A shift time-weighted average from several consecutive or partial samples.
 *
 * Method: TWA = Σ(Cᵢ·tᵢ) / T, the cumulative exposure formula of OSHA 29 CFR 1910.1000(d)(1)(i)
 * ("E = (CaTa + CbTb + … + CnTn) ÷ 8") and of the OSHA Technical Manual, Section II, Chapter 1
 * (personal sampling for air contaminants), with Cᵢ the concentration of sample i and tᵢ its
 * duration; see also Leidel, Busch & Lynch (1977), NIOSH Occupational Exposure Sampling Strategy
 * Manual, Publ. 77-173, on full-period consecutive samples (section numbers from memory).
 * What T is depends on what one assumes for the part of the shift no sample covered:
 *   - `zero`: no exposure while unsampled, T = the shift length (the regulatory formula with the
 *     shift length in place of its 8 h; a full-shift TWA for the shift as worked);
 *   - `sampled-average`: the unsampled time is like the average of the sampled periods,
 *     T = Σtᵢ (the sampled time).
 * The caller chooses and states the assumption with the result.
 *
 * Non-detects (common practice; documented in docs/decisions/010-shift-results-and-lab-import.md):
 * a non-detect period is given at its detection limit. If every period is a non-detect, the shift
 * TWA is a non-detect whose limit is the TWA of the limits. If only some are, the shift TWA is a
 * detected value computed with those periods at their limits — an upper bound — and the lower
 * bound (those periods at 0) is returned beside it so the reviewer can see the spread.
 */

export type UnsampledTimeAssumption = 'zero' | 'sampled-average';

/** One sample period: its concentration (for a non-detect, the detection limit) and duration. */
export interface SamplePeriod {
  readonly concentration: number;
  readonly minutes: number;
  readonly nonDetect: boolean;
}

export interface ShiftTwaOptions {
  readonly assumption: UnsampledTimeAssumption;
  /** Length of the shift in minutes (needed for `zero`; reported for both). */
  readonly shiftMinutes: number;
}

export interface ShiftTwa {
  /** The shift TWA: for a non-detect its limit; with some non-detect periods, the upper bound. */
  readonly twa: number;
  /** True only when every period is a non-detect. */
  readonly nonDetect: boolean;
  /** Non-detect periods at 0. */
  readonly lowerBound: number;
  /** Non-detect periods at their detection limits. */
  readonly upperBound: number;
  readonly nonDetectPeriods: number;
  readonly sampledMinutes: number;
  /** T, the divisor. */
  readonly averagingMinutes: number;
  /** Shift time no sample covered (0 or more). */
  readonly unsampledMinutes: number;
}

/**
 * Σ(Cᵢ·tᵢ)/T over the periods, with T from the unsampled-time assumption.
 * Worked example: 2 h at 0.4 and 4 h at 0.1 mg/m³ in an 8-h shift → zero: (0.8 + 0.4)/8 = 0.15;
 * sampled-average: 1.2/6 = 0.2 mg/m³.
 */
export function shiftTwa(periods: readonly SamplePeriod[], options: ShiftTwaOptions): ShiftTwa {
  if (periods.length === 0) throw new RangeError('shiftTwa: needs at least one sample period');
  const { assumption, shiftMinutes } = options;
  if (!Number.isFinite(shiftMinutes) || shiftMinutes <= 0 || shiftMinutes > 1440) {
    throw new RangeError(`shiftTwa: shiftMinutes must be a number above 0 and at most 1440, got ${shiftMinutes}`);
  }
  let sampledMinutes = 0;
  let detectedExposure = 0;
  let nonDetectExposure = 0;
  let nonDetectPeriods = 0;
  periods.forEach((period, index) => {
    if (!Number.isFinite(period.minutes) || period.minutes <= 0) {
      throw new RangeError(`shiftTwa: period ${index + 1} must last more than 0 minutes, got ${period.minutes}`);
    }
    if (!Number.isFinite(period.concentration) || period.concentration < 0 || (period.nonDetect && period.concentration === 0)) {
      throw new RangeError(`shiftTwa: period ${index + 1} needs a concentration ≥ 0 (a detection limit > 0 for a non-detect), got ${period.concentration}`);
    }
    sampledMinutes += period.minutes;
    if (period.nonDetect) {
      nonDetectPeriods += 1;
      nonDetectExposure += period.concentration * period.minutes;
    } else {
      detectedExposure += period.concentration * period.minutes;
    }
  });
  // A rounding allowance of a thousandth of a minute: durations come from clock times and sums.
  if (assumption === 'zero' && sampledMinutes > shiftMinutes + 1e-3) {
    throw new RangeError(`shiftTwa: the samples cover ${sampledMinutes} min, more than the shift of ${shiftMinutes} min`);
  }
  const averagingMinutes = assumption === 'zero' ? shiftMinutes : sampledMinutes;
  const lowerBound = detectedExposure / averagingMinutes;
  const upperBound = (detectedExposure + nonDetectExposure) / averagingMinutes;
  return {
    twa: upperBound,
    nonDetect: nonDetectPeriods === periods.length,
    lowerBound,
    upperBound,
    nonDetectPeriods,
    sampledMinutes,
    averagingMinutes,
    unsampledMinutes: Math.max(0, shiftMinutes - sampledMinutes),
  };
}
