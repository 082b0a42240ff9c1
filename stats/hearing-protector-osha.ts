import { checkLevelDb, checkNrr, dbText, type LevelAtEar, type NoiseAtWorkplace } from './hearing-protector-types';

/*
 * OSHA's estimate of the A-weighted level under a hearing protector from its NRR.
 *
 * Source: OSHA 29 CFR 1910.95 Appendix B, "Methods for estimating the adequacy of hearing protector
 * attenuation": with C-weighted data, estimated A-weighted TWA under the protector = TWA(C) − NRR;
 * with A-weighted data, subtract 7 dB from the NRR (the spectral correction) and subtract the
 * remainder from the A-weighted TWA.
 *
 * The 50 % derating: OSHA Technical Manual, Section III Chapter 5 ("Noise"), applies a 50 % safety
 * factor to the (NRR − 7) figure when judging whether protectors are enough, instead of engineering
 * controls: TWA − (NRR − 7)/2 (written from memory of the manual; the same halving is the usual
 * field practice for fitted protectors). Dual protection (plug + muff): add 5 dB to the higher NRR
 * (OSHA Technical Manual, same chapter; from memory).
 */

/** Method key and source of the un-derated Appendix B estimate. */
export const OSHA_APPENDIX_B_SOURCE = 'OSHA 29 CFR 1910.95 Appendix B: TWA(A) − (NRR − 7), or TWA(C) − NRR';
/** Method key and source of the derated estimate. */
export const OSHA_DERATED_SOURCE =
  'OSHA 29 CFR 1910.95 Appendix B with the 50 % safety factor of the OSHA Technical Manual, Section III Chapter 5 (from memory): TWA(A) − (NRR − 7)/2, or TWA(C) − NRR/2';

/**
 * Level at the ear by OSHA 1910.95 Appendix B: LA − (NRR − 7), or LC − NRR when the C-weighted level
 * is known. oshaAppendixBLevelAtEar({ laDb: 100, lcDb: null }, 29).levelAtEarDb → 78.
 */
export function oshaAppendixBLevelAtEar(noise: NoiseAtWorkplace, nrr: number): LevelAtEar {
  return oshaEstimate('oshaAppendixBLevelAtEar', noise, nrr, 1);
}

/**
 * Level at the ear by OSHA Appendix B with the 50 % derating of the OSHA Technical Manual:
 * LA − (NRR − 7)/2, or LC − NRR/2. oshaDeratedLevelAtEar({ laDb: 100, lcDb: null }, 29).levelAtEarDb → 89.
 */
export function oshaDeratedLevelAtEar(noise: NoiseAtWorkplace, nrr: number): LevelAtEar {
  return oshaEstimate('oshaDeratedLevelAtEar', noise, nrr, 0.5);
}

function oshaEstimate(functionName: string, noise: NoiseAtWorkplace, nrr: number, share: number): LevelAtEar {
  checkLevelDb(functionName, 'the A-weighted level', noise.laDb);
  if (noise.lcDb !== null) checkLevelDb(functionName, 'the C-weighted level', noise.lcDb);
  checkNrr(functionName, nrr);
  const derated = share === 1 ? '' : ' × 50 %';
  if (noise.lcDb !== null) {
    const level = noise.lcDb - nrr * share;
    return {
      method: share === 1 ? 'osha-appendix-b' : 'osha-derated',
      source: share === 1 ? OSHA_APPENDIX_B_SOURCE : OSHA_DERATED_SOURCE,
      levelAtEarDb: level,
      attenuationDb: noise.laDb - level,
      working: `${dbText(noise.lcDb)} dB(C) − ${nrr}${derated} = ${dbText(level)} dB(A)`,
      assumptions: [],
    };
  }
  // NRR below 7 dB gives a negative credit: the formula is applied as printed (the level goes up),
  // which makes such a protector "not enough" rather than silently treated as zero.
  const credit = (nrr - 7) * share;
  const level = noise.laDb - credit;
  return {
    method: share === 1 ? 'osha-appendix-b' : 'osha-derated',
    source: share === 1 ? OSHA_APPENDIX_B_SOURCE : OSHA_DERATED_SOURCE,
    levelAtEarDb: level,
    attenuationDb: credit,
    working: `${dbText(noise.laDb)} dB(A) − (${nrr} − 7)${derated} = ${dbText(level)} dB(A)`,
    assumptions: ['Only the A-weighted level is known: 7 dB is taken off the NRR (OSHA Appendix B spectral correction).'],
  };
}

/**
 * The NRR credited to plug + muff worn together: the higher NRR + 5 dB (OSHA Technical Manual,
 * Section III Chapter 5; from memory). oshaDualProtectionNrr(29, 25) → 34.
 */
export function oshaDualProtectionNrr(nrrA: number, nrrB: number): number {
  checkNrr('oshaDualProtectionNrr', nrrA);
  checkNrr('oshaDualProtectionNrr', nrrB);
  return Math.max(nrrA, nrrB) + 5;
}
