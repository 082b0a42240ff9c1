import { describe, expect, it } from 'vitest';
import {
  EN458_DEFAULT_BANDS,
  en458HmlLevelAtEar,
  en458SnrLevelAtEar,
  hmlPredictedReduction,
  nioshDeratedNrr,
  nioshLevelAtEar,
  oshaAppendixBLevelAtEar,
  oshaDeratedLevelAtEar,
  oshaDualLevelAtEar,
  protectionVerdict,
  ratingWarnings,
} from '@stats/index';

// Every expected value below is worked by hand from the published formula (the sources print the
// formulas; the numbers here are our own arithmetic, written out in each comment). The formulas are
// sums of a few terms, so the only error is floating-point rounding: 1e-9 dB.
const tolerance = 1e-9;
const close = (actual: number, expected: number) => expect(Math.abs(actual - expected)).toBeLessThan(tolerance);

describe('OSHA 29 CFR 1910.95 Appendix B (NRR − 7) and the 50 % derating', () => {
  it('TWA 100 dB(A) with NRR 29 gives 78 dB(A) at the ear (100 − (29 − 7); hand-worked from Appendix B)', () => {
    close(oshaAppendixBLevelAtEar({ laDb: 100, lcDb: null }, 29).levelAtEarDb, 78);
  });

  it('with the 50 % safety factor the same case gives 89 dB(A) (100 − (29 − 7)/2; OSHA Technical Manual III:5, from memory)', () => {
    const result = oshaDeratedLevelAtEar({ laDb: 100, lcDb: null }, 29);
    close(result.levelAtEarDb, 89);
    close(result.attenuationDb, 11);
    expect(result.working).toBe('100.0 dB(A) − (29 − 7) × 50 % = 89.0 dB(A)');
  });

  it('with a C-weighted TWA the NRR is subtracted without the 7 dB correction (104 dB(C) − 29 = 75; Appendix B)', () => {
    close(oshaAppendixBLevelAtEar({ laDb: 100, lcDb: 104 }, 29).levelAtEarDb, 75);
    close(oshaDeratedLevelAtEar({ laDb: 100, lcDb: 104 }, 29).levelAtEarDb, 104 - 14.5);
  });

  it('plug + muff: the higher-rated protector’s estimate less 5 dB, the 5 dB added after derating (OSHA Technical Manual, from memory; hand-worked)', () => {
    const noise = { laDb: 100, lcDb: null };
    // Derated: 100 − (29 − 7) × 50 % − 5 = 84; without derating: 100 − (29 − 7) − 5 = 73. The order of plug and muff does not matter.
    expect(oshaDualLevelAtEar(noise, 29, 25, { derated: true }).levelAtEarDb).toBeCloseTo(84, 12);
    expect(oshaDualLevelAtEar(noise, 25, 29, { derated: true }).levelAtEarDb).toBeCloseTo(84, 12);
    const full = oshaDualLevelAtEar(noise, 29, 25, { derated: false });
    expect(full).toMatchObject({ method: 'osha-dual-appendix-b', attenuationDb: 27 });
    expect(full.levelAtEarDb).toBeCloseTo(73, 12);
    expect(full.working).toBe('higher NRR 29 (of 29 and 25): 100.0 dB(A) − (29 − 7) − 5 = 73.0 dB(A)');
    // With the C-weighted level: LC − NRR/2 − 5 = 102 − 14.5 − 5 = 82.5.
    expect(oshaDualLevelAtEar({ laDb: 100, lcDb: 102 }, 29, 25, { derated: true }).levelAtEarDb).toBeCloseTo(82.5, 12);
    expect(() => oshaDualLevelAtEar(noise, 29, 60, { derated: true })).toThrow(/oshaDualLevelAtEar/);
  });

  it('refuses an NRR outside 0–45 dB and a level that is not a number, naming the function', () => {
    expect(() => oshaAppendixBLevelAtEar({ laDb: 95, lcDb: null }, 46)).toThrow(
      new RangeError('oshaAppendixBLevelAtEar: the NRR must be a number from 0 to 45 dB, got 46'),
    );
    expect(() => oshaDeratedLevelAtEar({ laDb: 95, lcDb: null }, -1)).toThrow(/the NRR must be a number from 0 to 45 dB/);
    expect(() => oshaAppendixBLevelAtEar({ laDb: Number.NaN, lcDb: null }, 20)).toThrow(/the A-weighted level must be a finite level/);
  });
});

describe('NIOSH 1998 (Publ. 98-126) type-based derating', () => {
  // Percentages as remembered from the criteria document (from memory): earmuffs −25 %, formable
  // earplugs −50 %, all other earplugs −70 %.
  it('derates an NRR of 30 to 22.5 (earmuff), 15 (formable plug) and 9 (premolded plug)', () => {
    close(nioshDeratedNrr(30, 'earmuff'), 22.5);
    close(nioshDeratedNrr(30, 'formable-earplug'), 15);
    close(nioshDeratedNrr(30, 'premolded-earplug'), 9);
    close(nioshDeratedNrr(30, 'canal-cap'), 9);
  });

  it('with A-weighted data also takes off 7 dB: 100 dB(A), foam plug NRR 33 → 100 − (16.5 − 7) = 90.5 dB(A) (hand-worked)', () => {
    close(nioshLevelAtEar({ laDb: 100, lcDb: null }, 33, 'formable-earplug').levelAtEarDb, 90.5);
  });

  it('with C-weighted data: 98 dB(C), earmuff NRR 24 → 98 − 18 = 80 dB(A) (hand-worked)', () => {
    close(nioshLevelAtEar({ laDb: 95, lcDb: 98 }, 24, 'earmuff').levelAtEarDb, 80);
  });
});

describe('EN 458:2016 with the EN ISO 4869-2 SNR and HML methods', () => {
  it("SNR method: LC 98 dB, SNR 30 → L'A = 68 dB(A) (hand-worked from L'A = LC − SNR)", () => {
    close(en458SnrLevelAtEar({ laDb: 95, lcDb: 98 }, 30).levelAtEarDb, 68);
  });

  it('HML with LC − LA = 4 dB (> 2): PNR = 24 − (24 − 16)/8 × 2 = 22, LA 95 → 73 dB(A) (hand-worked)', () => {
    close(hmlPredictedReduction(32, 24, 16, 4), 22);
    close(en458HmlLevelAtEar({ laDb: 95, lcDb: 99 }, { h: 32, m: 24, l: 16 }).levelAtEarDb, 73);
  });

  it('HML with LC − LA = 1 dB (≤ 2): PNR = 24 − (32 − 24)/4 × (−1) = 26, LA 95 → 69 dB(A) (hand-worked)', () => {
    close(hmlPredictedReduction(32, 24, 16, 1), 26);
    close(en458HmlLevelAtEar({ laDb: 95, lcDb: 96 }, { h: 32, m: 24, l: 16 }).levelAtEarDb, 69);
  });

  it('HML at LC − LA = 2 dB is M by both branches (the formulas meet there)', () => {
    close(hmlPredictedReduction(32, 24, 16, 2), 24);
    close(hmlPredictedReduction(32, 24, 16, 2 + 1e-12), 24);
  });

  it('without LC the estimate needs an assumed LC − LA and says so in its assumptions', () => {
    expect(() => en458SnrLevelAtEar({ laDb: 95, lcDb: null }, 30)).toThrow(/the C-weighted level is needed/);
    const assumed = en458SnrLevelAtEar({ laDb: 95, lcDb: null }, 30, { assumedCMinusADb: 2 });
    close(assumed.levelAtEarDb, 67);
    expect(assumed.assumptions[0]).toMatch(/LC = LA \+ 2 dB was assumed/);
  });

  it('refuses an SNR or H/M/L outside 0–50 dB', () => {
    expect(() => en458SnrLevelAtEar({ laDb: 95, lcDb: 98 }, 51)).toThrow(/the SNR must be a number from 0 to 50 dB, got 51/);
    expect(() => hmlPredictedReduction(60, 24, 16, 2)).toThrow(/hmlPredictedReduction: H must be a number from 0 to 50 dB/);
  });

  it('warns (does not refuse) when H ≥ M ≥ L does not hold', () => {
    expect(ratingWarnings({ h: 20, m: 24, l: 16 })).toEqual(['H (20 dB) is below M (24 dB): usually H ≥ M ≥ L — check the data sheet']);
    expect(ratingWarnings({ h: 32, m: 24, l: 16 })).toEqual([]);
  });
});

describe('EN 458 assessment bands around the action level (from memory; Lact = 85 dB(A) here)', () => {
  const bands = { actionLevelDb: 85, ...EN458_DEFAULT_BANDS };
  it.each([
    [86, 'not-enough'],
    [85, 'acceptable'],
    [80.1, 'acceptable'],
    [80, 'good'],
    [75.1, 'good'],
    [75, 'acceptable'],
    [70, 'acceptable'],
    [69.9, 'over-protection'],
  ] as const)('a level of %s dB(A) at the ear is %s', (level, verdict) => {
    expect(protectionVerdict(level, bands)).toBe(verdict);
  });

  it('refuses margins that do not grow', () => {
    expect(() => protectionVerdict(80, { actionLevelDb: 85, acceptableMarginDb: 10, goodMarginDb: 5, overProtectionMarginDb: 15 })).toThrow(
      /the margins must grow/,
    );
  });
});
