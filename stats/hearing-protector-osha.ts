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

/** Extra protection credited when an earplug and an earmuff are worn together (dB). */
export const DUAL_PROTECTION_EXTRA_DB = 5;

/**
 * Level at the ear with an earplug and an earmuff worn together, by the OSHA Technical Manual's rule
 * (Section III Chapter 5; from memory): work out the estimate for the protector with the higher NRR
 * (Appendix B, with or without the 50 % derating), then credit 5 dB more — the 5 dB is added after
 * the derating, not to the NRR before it. With 100 dB(A), plug NRR 29 and muff NRR 25:
 * derated 100 − (29 − 7)/2 − 5 = 84 dB(A); Appendix B 100 − (29 − 7) − 5 = 73 dB(A).
 */
export function oshaDualLevelAtEar(noise: NoiseAtWorkplace, plugNrr: number, muffNrr: number, options: { derated: boolean }): LevelAtEar {
  const functionName = 'oshaDualLevelAtEar';
  checkNrr(functionName, plugNrr);
  checkNrr(functionName, muffNrr);
  const higher = Math.max(plugNrr, muffNrr);
  const single = oshaEstimate(functionName, noise, higher, options.derated ? 0.5 : 1);
  const level = single.levelAtEarDb - DUAL_PROTECTION_EXTRA_DB;
  return {
    method: options.derated ? 'osha-dual-derated' : 'osha-dual-appendix-b',
    source: `${options.derated ? OSHA_DERATED_SOURCE : OSHA_APPENDIX_B_SOURCE}; earplug and earmuff together: the higher-rated protector's estimate less ${DUAL_PROTECTION_EXTRA_DB} dB (OSHA Technical Manual, Section III Chapter 5; from memory)`,
    levelAtEarDb: level,
    attenuationDb: noise.laDb - level,
    working: `higher NRR ${higher} (of ${plugNrr} and ${muffNrr}): ${single.working.replace(/ = [^=]*$/, '')} − ${DUAL_PROTECTION_EXTRA_DB} = ${dbText(level)} dB(A)`,
    assumptions: single.assumptions,
  };
}
