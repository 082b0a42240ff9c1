/**
 * Shared vocabulary of the hearing-protector estimates (stats/hearing-protector-osha.ts,
 * -niosh.ts, -en458.ts): protector types, ratings and the result every method returns.
 */

/**
 * Protector types. The list follows the groups NIOSH (1998) derates differently: earmuffs,
 * formable (foam) earplugs, and all other earplugs (premolded, custom-moulded, canal caps).
 */
export const hearingProtectorTypes = ['earmuff', 'formable-earplug', 'premolded-earplug', 'custom-earplug', 'canal-cap'] as const;
export type HearingProtectorType = (typeof hearingProtectorTypes)[number];

export const hearingProtectorTypeLabels: Record<HearingProtectorType, string> = {
  earmuff: 'Earmuff',
  'formable-earplug': 'Formable (foam) earplug',
  'premolded-earplug': 'Premolded earplug',
  'custom-earplug': 'Custom-moulded earplug',
  'canal-cap': 'Canal cap (semi-insert)',
};

/** The ratings a protector may carry (dB). NRR: US labelling (40 CFR 211); SNR and H, M, L: EN ISO 4869-2. */
export interface HearingProtectorRatings {
  type: HearingProtectorType;
  nrr: number | null;
  snr: number | null;
  h: number | null;
  m: number | null;
  l: number | null;
}

/**
 * Range rules for ratings (refusals): NRR 0–45 dB and SNR, H, M, L 0–50 dB. The ranges are wide
 * enough for every rating on the market and catch typing slips (e.g. 290 for 29.0) (common practice).
 */
export const RATING_LIMITS = Object.freeze({ nrrMaxDb: 45, octaveMaxDb: 50 });

/** The noise level the estimate starts from (dB). `lcDb` is the C-weighted level when measured. */
export interface NoiseAtWorkplace {
  laDb: number;
  lcDb: number | null;
}

/** One method's estimate of the A-weighted level under the protector. */
export interface LevelAtEar {
  /** Short key of the method, e.g. `osha-nrr-derated`. */
  method: string;
  /** The method in words with its source. */
  source: string;
  /** The estimated A-weighted level at the ear, dB(A), used for the verdict. */
  levelAtEarDb: number;
  /** The protection credited, dB (LA − level at the ear). */
  attenuationDb: number;
  /** The formula with the numbers put in, for the reader to check. */
  working: string;
  /** Assumptions the estimate rests on (e.g. an assumed LC − LA). */
  assumptions: string[];
}

/** Checks a level in dB is a finite number in a plausible range (0–200 dB), naming the function. */
export function checkLevelDb(functionName: string, name: string, value: number): void {
  if (!Number.isFinite(value) || value < 0 || value > 200) {
    throw new RangeError(`${functionName}: ${name} must be a finite level between 0 and 200 dB, got ${value}`);
  }
}

/** Checks an NRR (0–45 dB), naming the function. */
export function checkNrr(functionName: string, nrr: number): void {
  if (!Number.isFinite(nrr) || nrr < 0 || nrr > RATING_LIMITS.nrrMaxDb) {
    throw new RangeError(`${functionName}: the NRR must be a number from 0 to ${RATING_LIMITS.nrrMaxDb} dB, got ${nrr}`);
  }
}

/** Checks an SNR, H, M or L value (0–50 dB), naming the function and the rating. */
export function checkOctaveRating(functionName: string, name: string, value: number): void {
  if (!Number.isFinite(value) || value < 0 || value > RATING_LIMITS.octaveMaxDb) {
    throw new RangeError(`${functionName}: ${name} must be a number from 0 to ${RATING_LIMITS.octaveMaxDb} dB, got ${value}`);
  }
}

/**
 * Warnings (not refusals) about a protector's ratings: H ≥ M ≥ L is what the EN ISO 4869-2 ratings
 * normally show, since protectors attenuate high frequencies best (common practice); another order
 * is possible but worth a second look at the data sheet.
 */
export function ratingWarnings(ratings: Pick<HearingProtectorRatings, 'h' | 'm' | 'l'>): string[] {
  const { h, m, l } = ratings;
  const warnings: string[] = [];
  if (h !== null && m !== null && h < m) warnings.push(`H (${h} dB) is below M (${m} dB): usually H ≥ M ≥ L — check the data sheet`);
  if (m !== null && l !== null && m < l) warnings.push(`M (${m} dB) is below L (${l} dB): usually H ≥ M ≥ L — check the data sheet`);
  return warnings;
}

/** A figure rounded to 0.1 dB for the worked formula text (the result itself is not rounded). */
export function dbText(value: number): string {
  return (Math.round(value * 10) / 10).toFixed(1);
}
