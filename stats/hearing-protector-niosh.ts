import { checkLevelDb, checkNrr, dbText, type HearingProtectorType, type LevelAtEar, type NoiseAtWorkplace } from './hearing-protector-types';

/*
 * NIOSH's type-based derating of the labelled NRR.
 *
 * Source: NIOSH (1998) Criteria for a Recommended Standard: Occupational Noise Exposure, Revised
 * Criteria 1998, DHHS (NIOSH) Publication 98-126, chapter 6 (hearing protectors; section number
 * from memory): derate the NRR by 25 % for earmuffs, 50 % for formable earplugs and 70 % for all
 * other earplugs; with A-weighted levels subtract the 7 dB spectral correction as well
 * (the percentages are as this file's author remembers them — from memory; they are widely quoted).
 */

/** The share of the labelled NRR NIOSH keeps, by type (from memory, see above). */
export const NIOSH_NRR_SHARE: Readonly<Record<HearingProtectorType, number>> = Object.freeze({
  earmuff: 0.75,
  'formable-earplug': 0.5,
  'premolded-earplug': 0.3,
  'custom-earplug': 0.3,
  'canal-cap': 0.3,
});

export const NIOSH_SOURCE =
  'NIOSH (1998) Criteria for a Recommended Standard: Occupational Noise Exposure, Publ. 98-126, ch. 6 (from memory): NRR derated by type — earmuffs × 0.75, formable earplugs × 0.5, other earplugs × 0.3; then TWA(A) − (derated NRR − 7) or TWA(C) − derated NRR';

/** The derated NRR by NIOSH type. nioshDeratedNrr(29, 'formable-earplug') → 14.5 */
export function nioshDeratedNrr(nrr: number, type: HearingProtectorType): number {
  checkNrr('nioshDeratedNrr', nrr);
  const share = NIOSH_NRR_SHARE[type];
  if (share === undefined) throw new RangeError(`nioshDeratedNrr: unknown protector type "${String(type)}"`);
  return nrr * share;
}

/**
 * Level at the ear by NIOSH's type-based derating. With the C-weighted level: LC − derated NRR; with
 * only the A-weighted level: LA − (derated NRR − 7).
 * nioshLevelAtEar({ laDb: 100, lcDb: null }, 33, 'formable-earplug').levelAtEarDb → 90.5
 */
export function nioshLevelAtEar(noise: NoiseAtWorkplace, nrr: number, type: HearingProtectorType): LevelAtEar {
  checkLevelDb('nioshLevelAtEar', 'the A-weighted level', noise.laDb);
  if (noise.lcDb !== null) checkLevelDb('nioshLevelAtEar', 'the C-weighted level', noise.lcDb);
  const derated = nioshDeratedNrr(nrr, type);
  const share = NIOSH_NRR_SHARE[type];
  if (noise.lcDb !== null) {
    const level = noise.lcDb - derated;
    return {
      method: 'niosh-derated',
      source: NIOSH_SOURCE,
      levelAtEarDb: level,
      attenuationDb: noise.laDb - level,
      working: `${dbText(noise.lcDb)} dB(C) − ${nrr} × ${share} = ${dbText(level)} dB(A)`,
      assumptions: [],
    };
  }
  const credit = derated - 7;
  const level = noise.laDb - credit;
  return {
    method: 'niosh-derated',
    source: NIOSH_SOURCE,
    levelAtEarDb: level,
    attenuationDb: credit,
    working: `${dbText(noise.laDb)} dB(A) − (${nrr} × ${share} − 7) = ${dbText(level)} dB(A)`,
    assumptions: ['Only the A-weighted level is known: 7 dB is taken off the derated NRR (NIOSH spectral correction).'],
  };
}
