/**
 * The whole analysis on generated and hand-made logs: the command-line document shape, masks
 * replacing the proposed ones, calibration drift, peak, and the demo generator's ground truth.
 */
import { describe, expect, test } from 'vitest';
import { analyzeNoiseLog, analyzePreparedNoiseLog, noiseCliReport, prepareNoiseAnalysis } from '@stats/noise-analyze';
import { generateNoiseDemoLog } from '@stats/noise-demo';
import { parseNoiseLog } from '@stats/noise-log-parse';
import { formatNoiseLog } from '@stats/noise-log-write';
import { buildLog } from './build-log';

describe('the command-line document', () => {
  test('has exactly the PRODUCT.md keys in order, without the interface details', () => {
    const { log } = generateNoiseDemoLog({ seed: 3, hours: 1, knockCount: 1 });
    const report = noiseCliReport(analyzeNoiseLog(log));
    expect(Object.keys(report)).toEqual([
      'runSeconds',
      'intervalSeconds',
      'maskedSeconds',
      'asLogged',
      'reviewed',
      'stillStretches',
      'knocks',
      'proposedMasks',
      'maxLcPeakDb',
      'calibrationDriftDb',
    ]);
    for (const block of [report.asLogged, report.reviewed]) {
      expect(Object.keys(block)).toEqual(['oshaPel', 'oshaHc', 'nioshRel', 'iso']);
      expect(Object.keys(block.oshaPel)).toEqual(['dose', 'twa']);
      expect(Object.keys(block.iso)).toEqual(['laeq', 'lex8h']);
    }
    expect(Object.keys(report.knocks![0])).toEqual(['tS', 'peakMg']);
    expect(Object.keys(report.proposedMasks[0])).toEqual(['startS', 'endS', 'reason']);
    expect(JSON.stringify(report)).not.toContain('details');
  });
});

describe('masks for the reviewed figures', () => {
  const { log } = generateNoiseDemoLog({ seed: 5, hours: 2, knockCount: 2 });

  test('by default the reviewed figures leave out the proposed knock masks', () => {
    const result = analyzeNoiseLog(log);
    expect(result.proposedMasks).toHaveLength(2);
    expect(result.details.masksSource).toBe('proposed');
    expect(result.maskedSeconds).toBeGreaterThan(0);
    // Knock intervals are loud, so leaving them out lowers every dose.
    expect(result.reviewed.oshaHc.dose!).toBeLessThan(result.asLogged.oshaHc.dose!);
    expect(result.reviewed.nioshRel.dose!).toBeLessThan(result.asLogged.nioshRel.dose!);
  });

  test('given masks replace the proposed ones; an empty list means no masks', () => {
    const none = analyzeNoiseLog(log, { masks: [] });
    expect(none.maskedSeconds).toBe(0);
    expect(none.reviewed).toEqual(none.asLogged);
    expect(none.proposedMasks).toHaveLength(2); // still proposed, just not applied
    const own = analyzeNoiseLog(log, { masks: [{ startS: 0, endS: 600 }] });
    expect(own.maskedSeconds).toBe(600);
    expect(own.details.masksSource).toBe('given');
  });

  test('each proposed mask reports the dose change it alone causes', () => {
    const result = analyzeNoiseLog(log);
    const [first] = result.details.proposedMaskEffects;
    const alone = analyzeNoiseLog(log, { masks: [result.proposedMasks[0]] });
    expect(first.doseChange.oshaPel!).toBeCloseTo(alone.reviewed.oshaPel.dose! - alone.asLogged.oshaPel.dose!, 9);
    expect(first.reason).toBe(result.proposedMasks[0].reason);
  });

  test('a recompute on the prepared log gives the same figures as a full analysis', () => {
    const prepared = prepareNoiseAnalysis(log);
    const masks = [
      { startS: 100, endS: 200 },
      { startS: 150, endS: 400 },
    ];
    expect(analyzePreparedNoiseLog(prepared, masks)).toEqual(analyzeNoiseLog(log, { masks }));
  });
});

describe('calibration drift, peak and shift hours', () => {
  const withCalibration = (before: number | null, after: number | null) =>
    buildLog({
      metadata: {
        ...(before === null ? {} : { calibration_before_db: before }),
        ...(after === null ? {} : { calibration_after_db: after }),
      },
      columns: ['t_s', 'laeq_db', 'lcpeak_db'],
      rows: [
        [0, 85, 120.5],
        [1, 86, 131.2],
        [2, 84, 99],
      ],
    });

  test('drift is after − before and null unless both are given', () => {
    expect(analyzeNoiseLog(withCalibration(114, 114.3)).calibrationDriftDb).toBeCloseTo(0.3, 12);
    expect(analyzeNoiseLog(withCalibration(114, 113.4)).calibrationDriftDb).toBeCloseTo(-0.6, 12);
    expect(analyzeNoiseLog(withCalibration(114, null)).calibrationDriftDb).toBeNull();
    expect(analyzeNoiseLog(withCalibration(null, 114)).calibrationDriftDb).toBeNull();
  });

  test('a drift of exactly the 0.5 dB limit is not flagged; 0.6 dB either way is', () => {
    expect(analyzeNoiseLog(withCalibration(94, 94.5)).details.calibration.exceedsLimit).toBe(false);
    expect(analyzeNoiseLog(withCalibration(93.9, 93.4)).details.calibration.exceedsLimit).toBe(false);
    expect(analyzeNoiseLog(withCalibration(94, 94.6)).details.calibration.exceedsLimit).toBe(true);
    expect(analyzeNoiseLog(withCalibration(94, 93.4)).details.calibration.exceedsLimit).toBe(true);
    expect(analyzeNoiseLog(withCalibration(94, 94.6), { settings: { driftLimitDb: 1 } }).details.calibration.exceedsLimit).toBe(false);
  });

  test('the highest C-weighted peak is over all intervals as logged, masked ones included', () => {
    const result = analyzeNoiseLog(withCalibration(null, null), { masks: [{ startS: 1, endS: 2 }] });
    expect(result.maxLcPeakDb).toBe(131.2);
    expect(analyzeNoiseLog(buildLog({ columns: ['t_s', 'laeq_db'], rows: [[0, 80]] })).maxLcPeakDb).toBeNull();
  });

  test('the hearing-conservation action level (50 % oshaHc dose) and the 140 dB peak are flagged', () => {
    // OSHA 29 CFR 1910.95(c): action level 85 dBA TWA = 50 % dose. 4 h at 85 dBA is 4/16 = 25 %,
    // 8 h at 85 dBA is 50 % exactly (T(85) = 16 h).
    const at85 = (hours: number, peak: number) =>
      buildLog({
        metadata: { interval_s: 60 },
        columns: ['t_s', 'laeq_db', 'lcpeak_db'],
        rows: Array.from({ length: hours * 60 }, (_, i) => [i * 60, 85, peak]),
      });
    const half = analyzeNoiseLog(at85(4, 140));
    expect(half.details.actionLevel).toMatchObject({ asLoggedReached: false, reviewedReached: false });
    expect(half.details.peakOver140Db).toBe(false); // 140 itself does not exceed 140
    const full = analyzeNoiseLog(at85(8, 140.1));
    expect(full.details.actionLevel).toMatchObject({ asLoggedReached: true, reviewedReached: true });
    expect(full.details.peakOver140Db).toBe(true);
    const allMasked = analyzeNoiseLog(at85(8, 100), { masks: [{ startS: 0, endS: 8 * 3600 }] });
    expect(allMasked.details.actionLevel.reviewedReached).toBeNull();
  });

  test('shift hours from the options override the file and only change LEX,8h', () => {
    const log = buildLog({
      metadata: { shift_hours: 8 },
      columns: ['t_s', 'laeq_db'],
      rows: [
        [0, 90],
        [1, 92],
      ],
    });
    const file = analyzeNoiseLog(log);
    const option = analyzeNoiseLog(log, { shiftHours: 10 });
    expect(file.details.exposureHoursSource).toBe('file');
    expect(option.details.exposureHoursSource).toBe('option');
    expect(option.asLogged.oshaHc).toEqual(file.asLogged.oshaHc);
    expect(option.asLogged.iso.lex8h! - file.asLogged.iso.lex8h!).toBeCloseTo(10 * Math.log10(10 / 8), 12);
    expect(() => analyzeNoiseLog(log, { shiftHours: 30 })).toThrow(/shiftHours must be > 0 and ≤ 24/);
  });
});

describe('demo generator', () => {
  test('the same seed gives the same file byte for byte, and another seed a different one', () => {
    const a = generateNoiseDemoLog({ seed: 42, hours: 1 });
    expect(generateNoiseDemoLog({ seed: 42, hours: 1 }).text).toBe(a.text);
    expect(generateNoiseDemoLog({ seed: 43, hours: 1 }).text).not.toBe(a.text);
  });

  test('a 10 h sawmill shift with a bench, knocks and a pause is found by the wear check', () => {
    const demo = generateNoiseDemoLog({ seed: 2024, hours: 10, benchMinutes: 40, knockCount: 4, pauseMinutes: 10 });
    const log = parseNoiseLog(demo.text);
    expect(formatNoiseLog(log)).toBe(demo.text); // the text is a faithful format-v1 file
    expect(log.metadata.worker).toBe('RT-014');
    const result = analyzeNoiseLog(log);
    // One still stretch: the bench. Putting the meter down is itself a movement, so the stretch
    // may start one interval after the bench period does.
    expect(result.stillStretches).toHaveLength(1);
    const [stretch] = result.stillStretches!;
    expect(stretch.startS - demo.truth.bench!.startS).toBeGreaterThanOrEqual(0);
    expect(stretch.startS - demo.truth.bench!.startS).toBeLessThanOrEqual(1);
    expect(stretch.endS).toBe(demo.truth.bench!.endS);
    expect(result.knocks!.map((k) => k.tS)).toEqual(demo.truth.knockTimesS);
    expect(result.knocks!.every((k) => k.peakMg >= 3000)).toBe(true);
    // 10 h minus the 10 min pause.
    expect(result.runSeconds).toBe(10 * 3600 - 600);
    expect(result.details.pauseCount).toBe(1);
    expect(result.calibrationDriftDb!).toBeGreaterThan(0);
    expect(result.calibrationDriftDb!).toBeLessThan(0.5); // a slightly drifting calibrator
  }, 60_000); // a 10 h log; generous for a shared 2-core machine (no timing is asserted)

  test('without a bench no still stretch appears while the meter is worn', () => {
    for (const seed of [1, 2, 3]) {
      const result = analyzeNoiseLog(generateNoiseDemoLog({ seed, hours: 12, scenario: 'stoneworks' }).log);
      expect(result.stillStretches).toEqual([]);
    }
  }, 60_000);

  test('a moving column can be written, and the levels can be shifted for another worker', () => {
    const quiet = generateNoiseDemoLog({ seed: 9, hours: 1, movingColumn: true, levelOffsetDb: -10 });
    const loud = generateNoiseDemoLog({ seed: 9, hours: 1, movingColumn: true });
    expect(quiet.log.moving).not.toBeNull();
    const quietLaeq = analyzeNoiseLog(quiet.log).asLogged.iso.laeq!;
    const loudLaeq = analyzeNoiseLog(loud.log).asLogged.iso.laeq!;
    expect(loudLaeq - quietLaeq).toBeGreaterThan(5);
  });

  test.each([
    [{ seed: 1, hours: 100 }, /hours must be 0.5–48/],
    [{ seed: 1, intervalSeconds: 0.1 }, /intervalSeconds must be 0.125–60/],
    [{ seed: 0 }, /seed must be an integer/],
  ])('bad options %o are refused', (options, message) => {
    expect(() => generateNoiseDemoLog(options)).toThrow(message);
  });
});
