/**
 * Noise criteria against published tables and worked checks.
 *
 * Sources (REFERENCES.md, "Noise"):
 * - OSHA 29 CFR 1910.95 Table G-16a (permissible durations) and Appendix A Table A-1 (dose → TWA).
 *   The product computes from the formula; the printed tables are rounded, so each comparison
 *   allows half a unit of the last printed digit (the table's own rounding), plus 1e-9 for binary
 *   arithmetic.
 * - NIOSH Publ. 98-126 (1998), chapter 1: REL durations and 8 h at 88 dBA → 200 %.
 * - ISO 9612:2009: LEX,8h = LAeq,Te + 10·lg(Te / 8 h) and the task-based energy sum.
 */
import { describe, expect, test } from 'vitest';
import {
  allowedHours,
  doseFromSegments,
  doseFromTwa,
  energyMeanLevel,
  lex8hFromLaeq,
  lex8hFromTasks,
  nioshRel,
  oshaHc,
  oshaPel,
  twaFromDose,
} from '@stats/noise-criteria';
import { analyzeNoiseLog } from '@stats/noise-analyze';
import { buildLog, repeat } from '../unit/noise/build-log';

/** Half a unit of the last digit of a printed number, e.g. "6.1" → 0.05, "0.031" → 0.0005. */
function printedRounding(printed: string): number {
  const decimals = printed.includes('.') ? printed.split('.')[1].length : 0;
  return 0.5 * 10 ** -decimals + 1e-9;
}

describe('OSHA 29 CFR 1910.95 Table G-16a: permissible duration per day', () => {
  // [level dBA, printed hours]
  const table: [number, string][] = [
    [85, '16'],
    [90, '8'],
    [92, '6.1'],
    [95, '4'],
    [100, '2'],
    [115, '0.25'],
    [130, '0.031'],
  ];
  test.each(table)('at %d dBA the formula duration rounds to the printed %s h', (level, printed) => {
    const hours = allowedHours(level, oshaPel);
    expect(Math.abs(hours - Number(printed))).toBeLessThanOrEqual(printedRounding(printed));
  });

  test('at 83 dBA the formula gives 21.11 h, matching the printed 21.1 (one official web copy prints 21.2)', () => {
    // REFERENCES.md notes the quirk: Table G-16a 83 → 21.1 h; formula 8/2^(−7/5) = 21.112 h.
    const hours = allowedHours(83, oshaHc);
    expect(Math.abs(hours - 21.1)).toBeLessThanOrEqual(printedRounding('21.1'));
    expect(Math.abs(hours - 21.2)).toBeGreaterThan(printedRounding('21.2'));
  });
});

describe('OSHA 29 CFR 1910.95 Appendix A Table A-1: dose ↔ 8-hour TWA', () => {
  // [dose %, printed TWA dBA]
  const table: [number, string][] = [
    [50, '85.0'],
    [91, '89.3'],
    [200, '95.0'],
    [999, '106.6'],
  ];
  test.each(table)('a dose of %d %% gives the printed TWA %s dBA', (dose, printed) => {
    const twa = twaFromDose(dose, oshaPel)!;
    expect(Math.abs(twa - Number(printed))).toBeLessThanOrEqual(printedRounding(printed));
  });

  test.each(table)('the TWA printed for %d %% converts back to a dose bracket containing it', (dose, printed) => {
    // The printed TWA stands for every TWA within ±0.05 dB; the dose must fall in the matching bracket.
    const half = printedRounding(printed);
    expect(doseFromTwa(Number(printed) - half, oshaPel)).toBeLessThanOrEqual(dose);
    expect(doseFromTwa(Number(printed) + half, oshaPel)).toBeGreaterThanOrEqual(dose);
  });

  test('at 115 % the formula gives 91.0 dBA where Table A-1 prints 91.1 (a known misprint)', () => {
    // REFERENCES.md: "prints 91.1 at 115 % where the formula gives 91.0". 16.61·log10(1.15) + 90 = 91.008.
    const twa = twaFromDose(115, oshaPel)!;
    expect(Math.round(twa * 10) / 10).toBe(91.0);
    expect(Math.abs(twa - 91.1)).toBeLessThan(0.1); // within one printed unit of the misprint
  });

  test('a dose of 0 has no TWA', () => {
    expect(twaFromDose(0, oshaHc)).toBeNull();
  });
});

describe('NIOSH 98-126 recommended exposure limit (85 dBA, 3 dB exchange rate)', () => {
  // Chapter 1: 85 dBA 8 h, 88 4 h, 91 2 h, 94 1 h, 97 30 min, 100 15 min. The formula is exact at
  // these points, so the tolerance is binary rounding only (1e-12 relative).
  const durations: [number, number][] = [
    [85, 8],
    [88, 4],
    [91, 2],
    [94, 1],
    [97, 0.5],
    [100, 0.25],
  ];
  test.each(durations)('at %d dBA the permitted duration is %d h', (level, hours) => {
    expect(allowedHours(level, nioshRel)).toBeCloseTo(hours, 12);
  });

  test('8 h at 88 dBA is a 200 % dose and a TWA of 88.0 dBA', () => {
    const dose = doseFromSegments([{ levelDb: 88, hours: 8 }], nioshRel);
    expect(dose).toBeCloseTo(200, 9);
    expect(Math.abs(twaFromDose(dose, nioshRel)! - 88.0)).toBeLessThanOrEqual(printedRounding('88.0'));
  });
});

describe('REFERENCES.md worked checks (OSHA 29 CFR 1910.95 Appendix A formulas)', () => {
  const mixedShift = [
    { levelDb: 90, hours: 4 },
    { levelDb: 95, hours: 2 },
    { levelDb: 85, hours: 2 },
  ];

  test('4 h at 90 + 2 h at 95 + 2 h at 85 dBA: 112.5 % and TWA 90.85 with the 80 dB threshold', () => {
    const dose = doseFromSegments(mixedShift, oshaHc);
    expect(dose).toBeCloseTo(112.5, 9); // 4/8 + 2/4 + 2/16 = 1.125 exactly
    expect(Math.abs(twaFromDose(dose, oshaHc)! - 90.85)).toBeLessThanOrEqual(printedRounding('90.85'));
  });

  test('the same shift is 100 % and TWA 90.0 with the 90 dB threshold (85 dBA adds nothing)', () => {
    const dose = doseFromSegments(mixedShift, oshaPel);
    expect(dose).toBeCloseTo(100, 9);
    expect(Math.abs(twaFromDose(dose, oshaPel)! - 90.0)).toBeLessThanOrEqual(printedRounding('90.0'));
  });

  test('8 h at 92 dBA is 131.95 % by the formula, not the 131.1 % the rounded table duration gives', () => {
    const dose = doseFromSegments([{ levelDb: 92, hours: 8 }], oshaPel);
    expect(Math.abs(dose - 131.95)).toBeLessThanOrEqual(printedRounding('131.95'));
    expect(Math.abs(dose - 131.1)).toBeGreaterThan(0.5); // 100 × 8 / 6.1 h (Table G-16a) = 131.1
  });

  test.each([
    [60, 'one-minute intervals'],
    [1, 'one-second intervals'],
  ])('an 8 h log of the mixed shift at %d s intervals gives the same figures through analyzeNoiseLog (%s)', (interval) => {
    // Interval levels are constant within each segment here, so the interval-level dose equals the
    // segment formula; the tolerance (1e-9 relative) covers summing up to 28,800 terms.
    const perHour = 3600 / interval;
    const levels = [...repeat(90, 4 * perHour), ...repeat(95, 2 * perHour), ...repeat(85, 2 * perHour)];
    const log = buildLog({ metadata: { interval_s: interval }, columns: ['t_s', 'laeq_db'], rows: levels.map((level, i) => [i * interval, level]) });
    const result = analyzeNoiseLog(log);
    expect(result.runSeconds).toBe(8 * 3600);
    expect(result.asLogged.oshaHc.dose! / 112.5).toBeCloseTo(1, 9);
    expect(result.asLogged.oshaPel.dose! / 100).toBeCloseTo(1, 9);
    expect(Math.abs(result.asLogged.oshaHc.twa! - 90.85)).toBeLessThanOrEqual(printedRounding('90.85'));
    // NIOSH 98-126 formula by hand: T(90) = 8/2^(5/3) h, T(95) = 8/2^(10/3) h, T(85) = 8 h, so
    // D = 100·(4·2^(5/3)/8 + 2·2^(10/3)/8 + 2/8) = 100·(1.5874 + 2.5198 + 0.25) = 435.7 %.
    const niosh = 100 * ((4 * 2 ** (5 / 3)) / 8 + (2 * 2 ** (10 / 3)) / 8 + 2 / 8);
    expect(result.asLogged.nioshRel.dose! / niosh).toBeCloseTo(1, 9);
  });
});

describe('ISO 9612:2009 daily noise exposure level LEX,8h', () => {
  test('task-based: 2 h at 95, 4 h at 85 and 2 h at 70 dB give 89.78 dB', () => {
    // LEX,8h = 10·lg(Σ (Tm / 8 h)·10^(0.1·Lm)), worked by hand:
    // 0.25·10^9.5 = 790,569,415.0; 0.5·10^8.5 = 158,113,883.0; 0.25·10^7 = 2,500,000
    // sum = 951,183,298.1; 10·lg(sum) = 89.78 dB (hand result to 0.01 dB).
    expect(
      Math.abs(
        lex8hFromTasks([
          { levelDb: 95, hours: 2 },
          { levelDb: 85, hours: 4 },
          { levelDb: 70, hours: 2 },
        ]) - 89.78,
      ),
    ).toBeLessThanOrEqual(0.005);
  });

  test('from LAeq over Te: 88 dB over a 10 h day gives 88.97 dB and 8 h leaves it unchanged', () => {
    // LEX,8h = LAeq,Te + 10·lg(Te / 8 h) = 88 + 10·lg(1.25) = 88 + 0.969 = 88.97 dB.
    expect(Math.abs(lex8hFromLaeq(88, 10) - 88.97)).toBeLessThanOrEqual(0.005);
    expect(lex8hFromLaeq(88, 8)).toBe(88);
  });

  test('Annex F (job-based, as transcribed): six samples and Te 9.25 h give the printed 90.1 dB', () => {
    // REFERENCES.md: Annex F samples 88.0, 91.9, 87.6, 90.4, 89.0, 88.4 dB, Te 9.25 h → 90.1 dB.
    const laeq = energyMeanLevel([88.0, 91.9, 87.6, 90.4, 89.0, 88.4]);
    expect(Math.abs(lex8hFromLaeq(laeq, 9.25) - 90.1)).toBeLessThanOrEqual(printedRounding('90.1'));
  });

  test('the log pipeline uses the shift hours for Te when given and the run time otherwise', () => {
    // 2 h at 95 dB logged; Te = run time (2 h): LEX = 95 + 10·lg(2/8) = 88.98 dB; Te = 8 h: 95 dB.
    const rows = Array.from({ length: 120 }, (_, i) => [i * 60, 95]);
    const runTime = analyzeNoiseLog(buildLog({ metadata: { interval_s: 60 }, columns: ['t_s', 'laeq_db'], rows }));
    expect(Math.abs(runTime.asLogged.iso.lex8h! - 88.98)).toBeLessThanOrEqual(0.005);
    const shift = analyzeNoiseLog(buildLog({ metadata: { interval_s: 60, shift_hours: 8 }, columns: ['t_s', 'laeq_db'], rows }));
    expect(shift.asLogged.iso.lex8h).toBeCloseTo(95, 12);
    expect(shift.asLogged.oshaPel.dose).toBe(runTime.asLogged.oshaPel.dose); // shift hours never change the dose
  });
});
