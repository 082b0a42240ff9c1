/**
 * Noise criteria sets and the conversions between sound level, permitted duration, dose, TWA
 * and LEX,8h.
 *
 * Sources:
 * - OSHA 29 CFR 1910.95, Appendix A (T = 8 / 2^((L − 90)/5) h; D = 100·ΣC/T;
 *   TWA = 16.61·log10(D/100) + 90) and Table G-16a; the hearing-conservation set integrates
 *   from 80 dBA (1910.95(d)(2)(i) and Appendix I).
 * - NIOSH (1998) Criteria for a Recommended Standard: Occupational Noise Exposure, Publ. 98-126,
 *   chapter 1: REL 85 dBA, 3 dB exchange rate, T = 480 / 2^((L − 85)/3) min,
 *   TWA = 10·log10(D/100) + 85.
 * - ISO 9612:2009, equation for LEX,8h = LAeq,Te + 10·lg(Te / T0), T0 = 8 h, and the task-based
 *   energy sum of (Tm / T0)·10^(0.1·L).
 */

/** Names of the criteria sets the product computes, in the order they are shown. */
export type NoiseCriteriaSetName = 'oshaPel' | 'oshaHc' | 'nioshRel';

/** A dosimeter criteria set (ANSI S1.25 vocabulary: criterion level, exchange rate, threshold). */
export interface NoiseCriteriaSet {
  readonly name: NoiseCriteriaSetName;
  /** Level that gives 100 % dose over 8 h, dBA. */
  readonly criterionLevelDb: number;
  /** Level change that halves or doubles the permitted time, dB. */
  readonly exchangeRateDb: number;
  /** Intervals below this level add nothing to the dose, dBA. */
  readonly thresholdDb: number;
  /** Slope of the dose → TWA formula printed by the source (16.61 for OSHA, 10 for NIOSH). */
  readonly twaSlopeDb: number;
  /** Short label for tables. */
  readonly label: string;
  /** Where the numbers come from. */
  readonly source: string;
}

/** OSHA permissible exposure limit: 90 dBA criterion, 5 dB exchange rate, 90 dBA threshold. */
export const oshaPel: NoiseCriteriaSet = Object.freeze({
  name: 'oshaPel',
  criterionLevelDb: 90,
  exchangeRateDb: 5,
  thresholdDb: 90,
  twaSlopeDb: 16.61,
  label: 'OSHA PEL (90 dBA, 5 dB, threshold 90)',
  source: 'OSHA 29 CFR 1910.95(b) and Appendix A',
});

/** OSHA hearing conservation: 90 dBA criterion, 5 dB exchange rate, 80 dBA threshold. */
export const oshaHc: NoiseCriteriaSet = Object.freeze({
  name: 'oshaHc',
  criterionLevelDb: 90,
  exchangeRateDb: 5,
  thresholdDb: 80,
  twaSlopeDb: 16.61,
  label: 'OSHA hearing conservation (90 dBA, 5 dB, threshold 80)',
  source: 'OSHA 29 CFR 1910.95(c)–(d) and Appendix A',
});

/** NIOSH recommended exposure limit: 85 dBA criterion, 3 dB exchange rate, 80 dBA threshold. */
export const nioshRel: NoiseCriteriaSet = Object.freeze({
  name: 'nioshRel',
  criterionLevelDb: 85,
  exchangeRateDb: 3,
  thresholdDb: 80,
  twaSlopeDb: 10,
  label: 'NIOSH REL (85 dBA, 3 dB, threshold 80)',
  source: 'NIOSH Publ. 98-126 (1998), chapter 1',
});

/** The three sets, in display order. */
export const noiseCriteriaSets: readonly NoiseCriteriaSet[] = Object.freeze([oshaPel, oshaHc, nioshRel]);

/** Reference duration for dose and LEX,8h: 8 h in seconds. */
export const eightHoursSeconds = 8 * 3600;

function requireFinite(functionName: string, what: string, value: number): void {
  if (!Number.isFinite(value)) {
    throw new RangeError(`${functionName}: ${what} must be a finite number, got ${value}`);
  }
}

/**
 * Permitted (reference) duration at a level, in hours: T(L) = 8 / 2^((L − Lc)/q).
 * Method: OSHA 29 CFR 1910.95 Appendix A, equation for T; NIOSH 98-126 chapter 1 (480 min form).
 * Computed from the formula; the printed Table G-16a is rounded. The threshold is not applied here
 * (below it the interval simply adds nothing to the dose).
 * allowedHours(95, oshaPel) → 4
 */
export function allowedHours(levelDb: number, criteria: NoiseCriteriaSet): number {
  requireFinite('allowedHours', 'levelDb', levelDb);
  return 8 / Math.pow(2, (levelDb - criteria.criterionLevelDb) / criteria.exchangeRateDb);
}

/**
 * Dose fraction (not %) added by `seconds` at `levelDb`: Δt / T(L) when L ≥ threshold, else 0.
 * Method: OSHA 29 CFR 1910.95 Appendix A, D = 100·Σ C_n/T_n.
 */
export function doseFractionAt(levelDb: number, seconds: number, criteria: NoiseCriteriaSet): number {
  requireFinite('doseFractionAt', 'levelDb', levelDb);
  if (!(seconds >= 0) || !Number.isFinite(seconds)) {
    throw new RangeError(`doseFractionAt: seconds must be a finite number ≥ 0, got ${seconds}`);
  }
  if (levelDb < criteria.thresholdDb) return 0;
  return (seconds * Math.pow(2, (levelDb - criteria.criterionLevelDb) / criteria.exchangeRateDb)) / eightHoursSeconds;
}

/** One exposure segment: a level held for some hours. */
export interface NoiseSegment {
  readonly levelDb: number;
  readonly hours: number;
}

/**
 * Dose % of a list of segments: D = 100·Σ C_n/T_n over segments at or above the threshold.
 * Method: OSHA 29 CFR 1910.95 Appendix A. doseFromSegments([{ levelDb: 92, hours: 8 }], oshaPel) → 131.95…
 */
export function doseFromSegments(segments: readonly NoiseSegment[], criteria: NoiseCriteriaSet): number {
  let total = 0;
  segments.forEach((segment, index) => {
    if (!(segment.hours >= 0) || !Number.isFinite(segment.hours)) {
      throw new RangeError(`doseFromSegments: segment ${index + 1} hours must be a finite number ≥ 0, got ${segment.hours}`);
    }
    total += doseFractionAt(segment.levelDb, segment.hours * 3600, criteria);
  });
  return 100 * total;
}

/**
 * 8-hour TWA from a dose %: Lc + slope·log10(D/100), slope 16.61 for the OSHA sets and 10 for the
 * NIOSH set, exactly as the sources print them. Returns null when D = 0 (no TWA exists).
 * Method: OSHA 29 CFR 1910.95 Appendix A (TWA = 16.61·log10(D/100) + 90); NIOSH 98-126 chapter 1.
 * twaFromDose(200, oshaPel) → 95.00…
 */
export function twaFromDose(dosePercent: number, criteria: NoiseCriteriaSet): number | null {
  if (!(dosePercent >= 0) || !Number.isFinite(dosePercent)) {
    throw new RangeError(`twaFromDose: dose must be a finite percentage ≥ 0, got ${dosePercent}`);
  }
  if (dosePercent === 0) return null;
  return criteria.criterionLevelDb + criteria.twaSlopeDb * Math.log10(dosePercent / 100);
}

/**
 * Dose % from an 8-hour TWA, the inverse of {@link twaFromDose}: D = 100·10^((TWA − Lc)/slope).
 * Method: OSHA 29 CFR 1910.95 Appendix A (Table A-1 is this relation tabulated); NIOSH 98-126 chapter 1.
 * doseFromTwa(85, oshaHc) → 49.99…
 */
export function doseFromTwa(twaDb: number, criteria: NoiseCriteriaSet): number {
  requireFinite('doseFromTwa', 'twaDb', twaDb);
  return 100 * Math.pow(10, (twaDb - criteria.criterionLevelDb) / criteria.twaSlopeDb);
}

/**
 * Daily noise exposure level LEX,8h from the A-weighted equivalent level over the effective
 * working day Te: LEX,8h = LAeq,Te + 10·lg(Te / 8 h).
 * Method: ISO 9612:2009, definition of LEX,8h and its job-based/full-day formula (T0 = 8 h).
 * lex8hFromLaeq(88, 10) → 88.97
 */
export function lex8hFromLaeq(laeqDb: number, exposureHours: number): number {
  requireFinite('lex8hFromLaeq', 'laeqDb', laeqDb);
  if (!(exposureHours > 0) || !Number.isFinite(exposureHours)) {
    throw new RangeError(`lex8hFromLaeq: exposure hours must be a finite number > 0, got ${exposureHours}`);
  }
  return laeqDb + 10 * Math.log10(exposureHours / 8);
}

/**
 * LEX,8h from task levels: 10·lg(Σ (Tm / 8 h)·10^(0.1·LAeq,m)).
 * Method: ISO 9612:2009, task-based strategy (energy sum of the task contributions, T0 = 8 h).
 */
export function lex8hFromTasks(tasks: readonly NoiseSegment[]): number {
  if (tasks.length === 0) throw new RangeError('lex8hFromTasks: needs at least one task');
  let energy = 0;
  tasks.forEach((task, index) => {
    requireFinite('lex8hFromTasks', `task ${index + 1} level`, task.levelDb);
    if (!(task.hours > 0) || !Number.isFinite(task.hours)) {
      throw new RangeError(`lex8hFromTasks: task ${index + 1} hours must be a finite number > 0, got ${task.hours}`);
    }
    energy += (task.hours / 8) * Math.pow(10, task.levelDb / 10);
  });
  return 10 * Math.log10(energy);
}

/**
 * Energy mean of levels of equal duration: 10·lg(mean of 10^(0.1·L)).
 * Method: ISO 9612:2009, energy average of sample levels of equal duration.
 */
export function energyMeanLevel(levelsDb: readonly number[]): number {
  if (levelsDb.length === 0) throw new RangeError('energyMeanLevel: needs at least one level');
  let energy = 0;
  for (const level of levelsDb) {
    requireFinite('energyMeanLevel', 'every level', level);
    energy += Math.pow(10, level / 10);
  }
  return 10 * Math.log10(energy / levelsDb.length);
}
