import { checkLevelDb, checkOctaveRating, dbText, type LevelAtEar, type NoiseAtWorkplace } from './hearing-protector-types';

/*
 * EN 458:2016 "Hearing protectors — Recommendations for selection, use, care and maintenance", with
 * the SNR and HML methods of EN ISO 4869-2:2018 ("Estimation of effective A-weighted sound pressure
 * levels when hearing protectors are worn"):
 * - SNR method: L'A = LC − SNR.
 * - HML method: PNR (predicted noise level reduction) from the H, M and L values and LC − LA:
 *   LC − LA ≤ 2 dB: PNR = M − ((H − M)/4)·(LC − LA − 2);
 *   LC − LA > 2 dB: PNR = M − ((M − L)/8)·(LC − LA − 2);
 *   L'A = LA − PNR.
 * - Assessment bands relative to the action level Lact (EN 458, table of the protection assessment;
 *   written from memory): L'A > Lact insufficient; Lact − 5 < L'A ≤ Lact acceptable;
 *   Lact − 10 < L'A ≤ Lact − 5 good; Lact − 15 ≤ L'A ≤ Lact − 10 acceptable; L'A < Lact − 15 too much
 *   protection (over-protection: warning signals and speech may go unheard, and people take
 *   protectors off).
 */

export const EN458_SNR_SOURCE = "EN 458:2016 with EN ISO 4869-2 SNR method: L'A = LC − SNR";
export const EN458_HML_SOURCE =
  "EN 458:2016 with EN ISO 4869-2 HML method: PNR = M − (H − M)/4·(LC − LA − 2) for LC − LA ≤ 2 dB, else M − (M − L)/8·(LC − LA − 2); L'A = LA − PNR";

/** Options when only LA is known: the LC − LA difference to assume (dB), stated in the result. */
export interface CWeightingAssumption {
  assumedCMinusADb?: number | null;
}

function cWeightedLevel(functionName: string, noise: NoiseAtWorkplace, options: CWeightingAssumption): { lcDb: number; assumptions: string[] } {
  checkLevelDb(functionName, 'the A-weighted level', noise.laDb);
  if (noise.lcDb !== null) {
    checkLevelDb(functionName, 'the C-weighted level', noise.lcDb);
    return { lcDb: noise.lcDb, assumptions: [] };
  }
  const difference = options.assumedCMinusADb;
  if (difference === undefined || difference === null) {
    throw new RangeError(`${functionName}: the C-weighted level is needed (or an assumed LC − LA difference)`);
  }
  if (!Number.isFinite(difference) || difference < -5 || difference > 20) {
    throw new RangeError(`${functionName}: the assumed LC − LA must be between −5 and 20 dB, got ${difference}`);
  }
  return {
    lcDb: noise.laDb + difference,
    assumptions: [`LC was not measured: LC = LA + ${difference} dB was assumed (an assumption to check; measure LC where you can).`],
  };
}

/**
 * Level at the ear by the SNR method (EN ISO 4869-2, used by EN 458:2016): L'A = LC − SNR.
 * en458SnrLevelAtEar({ laDb: 95, lcDb: 98 }, 30).levelAtEarDb → 68
 */
export function en458SnrLevelAtEar(noise: NoiseAtWorkplace, snr: number, options: CWeightingAssumption = {}): LevelAtEar {
  checkOctaveRating('en458SnrLevelAtEar', 'the SNR', snr);
  const { lcDb, assumptions } = cWeightedLevel('en458SnrLevelAtEar', noise, options);
  const level = lcDb - snr;
  return {
    method: 'en458-snr',
    source: EN458_SNR_SOURCE,
    levelAtEarDb: level,
    attenuationDb: noise.laDb - level,
    working: `${dbText(lcDb)} dB(C) − ${snr} = ${dbText(level)} dB(A)`,
    assumptions,
  };
}

/**
 * Predicted noise level reduction by the HML method (EN ISO 4869-2).
 * hmlPredictedReduction(32, 24, 16, 4) → 22 (LC − LA > 2: 24 − (24 − 16)/8 × 2).
 */
export function hmlPredictedReduction(h: number, m: number, l: number, cMinusADb: number): number {
  checkOctaveRating('hmlPredictedReduction', 'H', h);
  checkOctaveRating('hmlPredictedReduction', 'M', m);
  checkOctaveRating('hmlPredictedReduction', 'L', l);
  if (!Number.isFinite(cMinusADb)) throw new RangeError(`hmlPredictedReduction: LC − LA must be a finite number, got ${cMinusADb}`);
  return cMinusADb <= 2 ? m - ((h - m) / 4) * (cMinusADb - 2) : m - ((m - l) / 8) * (cMinusADb - 2);
}

/**
 * Level at the ear by the HML method: L'A = LA − PNR.
 * en458HmlLevelAtEar({ laDb: 95, lcDb: 99 }, { h: 32, m: 24, l: 16 }).levelAtEarDb → 73
 */
export function en458HmlLevelAtEar(noise: NoiseAtWorkplace, ratings: { h: number; m: number; l: number }, options: CWeightingAssumption = {}): LevelAtEar {
  const { lcDb, assumptions } = cWeightedLevel('en458HmlLevelAtEar', noise, options);
  const difference = lcDb - noise.laDb;
  const reduction = hmlPredictedReduction(ratings.h, ratings.m, ratings.l, difference);
  const level = noise.laDb - reduction;
  const formula =
    difference <= 2
      ? `PNR = ${ratings.m} − (${ratings.h} − ${ratings.m})/4 × (${dbText(difference)} − 2) = ${dbText(reduction)}`
      : `PNR = ${ratings.m} − (${ratings.m} − ${ratings.l})/8 × (${dbText(difference)} − 2) = ${dbText(reduction)}`;
  return {
    method: 'en458-hml',
    source: EN458_HML_SOURCE,
    levelAtEarDb: level,
    attenuationDb: reduction,
    working: `${formula}; ${dbText(noise.laDb)} dB(A) − ${dbText(reduction)} = ${dbText(level)} dB(A)`,
    assumptions,
  };
}

/** Verdicts of the protection assessment (our words for the EN 458 bands). */
export const protectionVerdicts = ['not-enough', 'acceptable', 'good', 'over-protection'] as const;
export type ProtectionVerdict = (typeof protectionVerdicts)[number];

/** Band edges relative to the action level, dB (EN 458 defaults: 5, 10, 15; from memory). */
export interface ProtectionBands {
  actionLevelDb: number;
  acceptableMarginDb: number;
  goodMarginDb: number;
  overProtectionMarginDb: number;
}

export const EN458_DEFAULT_BANDS: Readonly<Omit<ProtectionBands, 'actionLevelDb'>> = Object.freeze({
  acceptableMarginDb: 5,
  goodMarginDb: 10,
  overProtectionMarginDb: 15,
});

/**
 * The EN 458 assessment of a level at the ear against the action level Lact:
 * > Lact not enough; (Lact − 5, Lact] acceptable; (Lact − 10, Lact − 5] good;
 * [Lact − 15, Lact − 10] acceptable; < Lact − 15 over-protection.
 * protectionVerdict(78, { actionLevelDb: 85, ...EN458_DEFAULT_BANDS }) → 'good'
 */
export function protectionVerdict(levelAtEarDb: number, bands: ProtectionBands): ProtectionVerdict {
  if (!Number.isFinite(levelAtEarDb)) throw new RangeError(`protectionVerdict: the level at the ear must be a finite number, got ${levelAtEarDb}`);
  const { actionLevelDb, acceptableMarginDb, goodMarginDb, overProtectionMarginDb } = bands;
  if (!(acceptableMarginDb > 0 && goodMarginDb > acceptableMarginDb && overProtectionMarginDb > goodMarginDb)) {
    throw new RangeError('protectionVerdict: the margins must grow: 0 < acceptable < good < over-protection');
  }
  checkLevelDb('protectionVerdict', 'the action level', actionLevelDb);
  if (levelAtEarDb > actionLevelDb) return 'not-enough';
  if (levelAtEarDb > actionLevelDb - acceptableMarginDb) return 'acceptable';
  if (levelAtEarDb > actionLevelDb - goodMarginDb) return 'good';
  if (levelAtEarDb >= actionLevelDb - overProtectionMarginDb) return 'acceptable';
  return 'over-protection';
}
