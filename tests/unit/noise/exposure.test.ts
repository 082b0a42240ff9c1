/**
 * As-logged and reviewed figures with masks (PRODUCT.md, "Dose per criteria set" and "Masks"),
 * checked against figures worked by hand from OSHA 29 CFR 1910.95 App. A and ISO 9612:2009.
 */
import { describe, expect, test } from 'vitest';
import { computeNoiseFigures, markMaskedIntervals, noiseMaskEffect, prepareNoiseExposure } from '@stats/noise-exposure';
import { buildLog, repeat } from './build-log';

/** 10 one-minute intervals: 8 at 90 dBA and 2 at 110 dBA (intervals 4 and 5, 240–360 s). */
function knockShift() {
  const levels = [90, 90, 90, 90, 110, 110, 90, 90, 90, 90];
  return buildLog({ metadata: { interval_s: 60 }, columns: ['t_s', 'laeq_db'], rows: levels.map((l, i) => [i * 60, l]) });
}

describe('which intervals a mask covers', () => {
  const log = knockShift();
  const masked = (startS: number, endS: number) => [...markMaskedIntervals(log, [{ startS, endS }])].flatMap((flag, i) => (flag ? [i] : []));

  test('an interval is masked when the span overlaps it by any positive amount', () => {
    expect(masked(239.999, 240.001)).toEqual([3, 4]);
    expect(masked(300, 300.001)).toEqual([5]);
  });

  test('a span that only touches an interval boundary does not mask the neighbour', () => {
    expect(masked(240, 360)).toEqual([4, 5]);
  });

  test('overlapping masks count each masked interval once', () => {
    const model = prepareNoiseExposure(log);
    const result = computeNoiseFigures(
      model,
      [
        { startS: 230, endS: 300 },
        { startS: 250, endS: 350 },
        { startS: 240, endS: 241 },
      ],
      10 / 60,
    );
    expect(result.maskedIntervals).toBe(3); // intervals 3, 4, 5
    expect(result.maskedSeconds).toBe(180);
  });

  test('a span outside the log masks nothing', () => {
    expect(masked(-100, -1)).toEqual([]);
    expect(masked(600, 700)).toEqual([]);
  });

  test.each([
    [{ startS: 10, endS: 10 }, /mask 1 endS \(10\) must be greater than startS \(10\)/],
    [{ startS: Number.NaN, endS: 10 }, /mask 1 needs finite numbers/],
  ])('a bad mask %o is refused', (mask, message) => {
    expect(() => markMaskedIntervals(log, [mask])).toThrow(message);
  });
});

describe('as-logged and reviewed figures', () => {
  test('masking the two 110 dBA minutes gives the dose of 90 dBA over the whole run', () => {
    // As logged (PEL set): D = 100·(8·1/480 + 2·1/30) min/min: T(90) = 480 min, T(110) = 480/16 = 30 min
    //   = 100·(0.016667 + 0.066667) = 8.3333 %.
    // Reviewed: unmasked dose 100·8/480 = 1.6667 %, × run 600 s / unmasked 480 s = 2.0833 % (= 100·10/480).
    const model = prepareNoiseExposure(knockShift());
    const result = computeNoiseFigures(model, [{ startS: 240, endS: 360 }], 8);
    expect(result.asLogged.oshaPel.dose! / (100 * (8 / 480 + 2 / 30))).toBeCloseTo(1, 12);
    expect(result.reviewed.oshaPel.dose! / (100 * (10 / 480))).toBeCloseTo(1, 12);
    expect(result.reviewed.iso.laeq).toBeCloseTo(90, 12); // energy mean of eight 90 dB intervals
    // As-logged LAeq by hand: 10·lg((8·10^9 + 2·10^11)/10) = 10·lg(2.08·10^10) = 103.18 dB.
    expect(Math.abs(result.asLogged.iso.laeq! - 103.18)).toBeLessThan(0.005);
    expect(result.maskedSeconds).toBe(120);
  });

  test('without masks the reviewed figures equal the as-logged figures exactly', () => {
    const result = computeNoiseFigures(prepareNoiseExposure(knockShift()), [], 8);
    expect(result.reviewed).toEqual(result.asLogged);
    expect(result.maskedSeconds).toBe(0);
  });

  test('when every interval is masked the reviewed figures are null, not NaN', () => {
    const result = computeNoiseFigures(prepareNoiseExposure(knockShift()), [{ startS: 0, endS: 600 }], 8);
    expect(result.reviewed).toEqual({
      oshaPel: { dose: null, twa: null },
      oshaHc: { dose: null, twa: null },
      nioshRel: { dose: null, twa: null },
      iso: { laeq: null, lex8h: null },
    });
  });

  test('a level exactly at a threshold counts and just below it adds nothing', () => {
    // 60 s at 80.0 dBA adds 60 s / T(80) = 60 / (8·3600·4) to the HC dose (T(80) = 32 h); 79.9 adds nothing.
    const log = buildLog({
      metadata: { interval_s: 60 },
      columns: ['t_s', 'laeq_db'],
      rows: [
        [0, 80],
        [60, 79.9],
      ],
    });
    const figures = computeNoiseFigures(prepareNoiseExposure(log), [], 1).asLogged;
    expect(figures.oshaHc.dose! / ((100 * 60) / (32 * 3600))).toBeCloseTo(1, 12);
    expect(figures.oshaPel.dose).toBe(0);
    expect(figures.oshaPel.twa).toBeNull(); // no TWA for a zero dose
  });

  test('the run time counts the intervals present, not the pauses', () => {
    // Two 60 s intervals 1 h apart: run time 120 s, LEX with Te = run time.
    const log = buildLog({
      metadata: { interval_s: 60 },
      columns: ['t_s', 'laeq_db'],
      rows: [
        [0, 95],
        [3600, 95],
      ],
    });
    const model = prepareNoiseExposure(log);
    expect(model.runSeconds).toBe(120);
    const figures = computeNoiseFigures(model, [], 120 / 3600).asLogged;
    // ISO 9612: LEX = 95 + 10·lg((120/3600)/8) = 95 − 23.80 = 71.20 dB.
    expect(Math.abs(figures.iso.lex8h! - 71.2)).toBeLessThan(0.005);
    // OSHA: 2 min at 95 dBA = 2/240 of T(95) = 4 h → 0.8333 %.
    expect(figures.oshaPel.dose! / (100 * (2 / 240))).toBeCloseTo(1, 12);
  });

  test('the effect of one mask equals the change it makes to the reviewed figures', () => {
    const model = prepareNoiseExposure(knockShift());
    const mask = { startS: 250, endS: 260 }; // masks interval 4 only
    const effect = noiseMaskEffect(model, mask, 8);
    const result = computeNoiseFigures(model, [mask], 8);
    expect(effect.maskedSeconds).toBe(60);
    expect(effect.doseChange.oshaHc!).toBeCloseTo(result.reviewed.oshaHc.dose! - result.asLogged.oshaHc.dose!, 10);
    expect(effect.doseChange.nioshRel!).toBeLessThan(0);
    expect(effect.laeqChangeDb!).toBeCloseTo(result.reviewed.iso.laeq! - result.asLogged.iso.laeq!, 10);
  });

  test('shift hours change LEX,8h only, never the dose', () => {
    const model = prepareNoiseExposure(
      buildLog({ metadata: { interval_s: 60 }, columns: ['t_s', 'laeq_db'], rows: repeat(0, 60).map((_, i) => [i * 60, 92]) }),
    );
    const eight = computeNoiseFigures(model, [], 8).asLogged;
    const twelve = computeNoiseFigures(model, [], 12).asLogged;
    expect(twelve.oshaPel).toEqual(eight.oshaPel);
    expect(twelve.iso.laeq).toBe(eight.iso.laeq);
    // ISO 9612: 10·lg(12/8) = 1.761 dB higher.
    expect(twelve.iso.lex8h! - eight.iso.lex8h!).toBeCloseTo(10 * Math.log10(1.5), 12);
  });
});
