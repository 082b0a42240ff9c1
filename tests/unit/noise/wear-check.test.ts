/**
 * Wear check edge cases (PRODUCT.md, "Noise log format, version 1", wear check paragraph): still
 * stretches, motion from acceleration, pauses, interval lengths, knocks and their proposed masks.
 */
import { describe, expect, test } from 'vitest';
import { detectMotion, findKnocks, findStillStretches, runWearCheck } from '@stats/noise-wear-check';
import { defaultNoiseSettings, resolveNoiseSettings } from '@stats/noise-settings';
import { analyzeNoiseLog } from '@stats/noise-analyze';
import { buildLog } from './build-log';

/** A log with a moving column: `moving[i]` per interval at `interval` seconds, times from `times` or i·interval. */
function movingLog(moving: number[], interval = 1, times?: number[]) {
  const rows = moving.map((flag, i) => [times ? times[i] : i * interval, 85, flag]);
  return buildLog({ metadata: { interval_s: interval }, columns: ['t_s', 'laeq_db', 'moving'], rows });
}

const still = (count: number) => new Array<number>(count).fill(0);

describe('still stretches', () => {
  test('a run of non-moving intervals exactly 15 min long is a still stretch; one interval shorter is not', () => {
    // 900 intervals of 1 s span 0 … 900 s = 15 min exactly.
    const exact = runWearCheck(movingLog([1, ...still(900), 1]), defaultNoiseSettings);
    expect(exact.stillStretches).toEqual([{ startS: 1, endS: 901, firstIndex: 1, endIndex: 901 }]);
    const short = runWearCheck(movingLog([1, ...still(899), 1]), defaultNoiseSettings);
    expect(short.stillStretches).toEqual([]);
  });

  test('a single moving interval splits a run, and each part is judged on its own length', () => {
    // 0–899 still (900 s, a stretch), 900 moving, 901–1799 still (899 s, not a stretch).
    const flags = still(1800);
    flags[900] = 1;
    const stretches = runWearCheck(movingLog(flags), defaultNoiseSettings).stillStretches!;
    expect(stretches.map(({ startS, endS }) => ({ startS, endS }))).toEqual([{ startS: 0, endS: 900 }]);
  });

  test('a pause ends a run: 10 min still, a pause, 10 min still is no still stretch', () => {
    const times = [...Array.from({ length: 600 }, (_, i) => i), ...Array.from({ length: 600 }, (_, i) => 2000 + i)];
    const wear = runWearCheck(movingLog(still(1200), 1, times), defaultNoiseSettings);
    expect(wear.stillStretches).toEqual([]);
    // The same 20 min without the pause is one stretch.
    expect(runWearCheck(movingLog(still(1200)), defaultNoiseSettings).stillStretches).toHaveLength(1);
  });

  test('with 0.125 s intervals, 7,200 still intervals make exactly 15 min', () => {
    const stretches = runWearCheck(movingLog([1, ...still(7200), 1], 0.125), defaultNoiseSettings).stillStretches!;
    expect(stretches.map(({ startS, endS }) => ({ startS, endS }))).toEqual([{ startS: 0.125, endS: 900.125 }]);
    expect(runWearCheck(movingLog([1, ...still(7199), 1], 0.125), defaultNoiseSettings).stillStretches).toEqual([]);
  });

  test('with 60 s intervals, 15 still intervals make a stretch and 14 do not', () => {
    const stretches = runWearCheck(movingLog([...still(15), 1], 60), defaultNoiseSettings).stillStretches!;
    expect(stretches.map(({ startS, endS }) => ({ startS, endS }))).toEqual([{ startS: 0, endS: 900 }]);
    expect(runWearCheck(movingLog([...still(14), 1], 60), defaultNoiseSettings).stillStretches).toEqual([]);
  });

  test('the still-minutes setting changes the limit', () => {
    const log = movingLog([...still(300), 1]);
    expect(runWearCheck(log, defaultNoiseSettings).stillStretches).toEqual([]);
    expect(runWearCheck(log, resolveNoiseSettings({ stillMinutes: 5 })).stillStretches).toHaveLength(1);
  });

  test('a whole log without motion is one stretch from its first start to its last end', () => {
    const stretches = findStillStretches(movingLog(still(1000)), new Uint8Array(1000), 15);
    expect(stretches.map(({ startS, endS }) => [startS, endS])).toEqual([[0, 1000]]);
  });
});

describe('motion from acceleration (no moving column)', () => {
  const accelerationLog = (vectors: [number, number, number][]) =>
    buildLog({ columns: ['t_s', 'laeq_db', 'ax_mg', 'ay_mg', 'az_mg'], rows: vectors.map((v, i) => [i, 85, ...v]) });

  test('a change of the mean vector of exactly 30 mg is motion; 29.9 mg is not; the first interval never is', () => {
    // (0,0,1000) → (18,24,1000): |Δ| = √(18² + 24²) = 30 mg exactly; then (18,24,1029.9): |Δ| = 29.9 mg.
    const motion = detectMotion(
      accelerationLog([
        [0, 0, 1000],
        [18, 24, 1000],
        [18, 24, 1029.9],
      ]),
      30,
    )!;
    expect(motion.source).toBe('acceleration');
    expect([...motion.moving]).toEqual([0, 1, 0]);
  });

  test('the change is measured from the previous interval, not from the first', () => {
    // Slow drift: 20 mg per interval never reaches 30 mg between neighbours.
    const motion = detectMotion(
      accelerationLog([
        [0, 0, 1000],
        [20, 0, 1000],
        [40, 0, 1000],
        [60, 0, 1000],
      ]),
      30,
    )!;
    expect([...motion.moving]).toEqual([0, 0, 0, 0]);
  });

  test('a moving column takes precedence over acceleration', () => {
    const log = buildLog({
      columns: ['t_s', 'laeq_db', 'ax_mg', 'ay_mg', 'az_mg', 'moving'],
      rows: [
        [0, 85, 0, 0, 1000, 1],
        [1, 85, 500, 0, 1000, 0],
      ],
    });
    const motion = detectMotion(log, 30)!;
    expect(motion.source).toBe('moving-column');
    expect([...motion.moving]).toEqual([1, 0]);
  });

  test('with neither a moving column nor acceleration the wear check is unavailable', () => {
    const log = buildLog({
      columns: ['t_s', 'laeq_db', 'apeak_mg'],
      rows: [
        [0, 85, 5000],
        [1, 85, 1000],
      ],
    });
    const wear = runWearCheck(log, defaultNoiseSettings);
    expect(wear).toMatchObject({ available: false, stillStretches: null, knocks: null, proposedMasks: [] });
    const result = analyzeNoiseLog(log);
    expect(result.stillStretches).toBeNull();
    expect(result.knocks).toBeNull();
    expect(result.details.wearCheckAvailable).toBe(false);
  });
});

describe('knocks and proposed masks', () => {
  const knockLog = (peaks: number[], interval = 1) =>
    buildLog({
      metadata: { interval_s: interval },
      columns: ['t_s', 'laeq_db', 'moving', 'apeak_mg'],
      rows: peaks.map((peak, i) => [i * interval, 85, 1, peak]),
    });

  test('apeak_mg at the 3000 mg threshold is a knock and just below it is not', () => {
    const knocks = findKnocks(knockLog([2999.9, 3000, 1000]), 3000)!;
    expect(knocks).toEqual([{ tS: 1, peakMg: 3000, index: 1 }]);
  });

  test('knocks in the first and last interval get masks clipped to the log', () => {
    const peaks = new Array<number>(20).fill(1000);
    peaks[0] = 4500;
    peaks[19] = 6000;
    const wear = runWearCheck(knockLog(peaks), defaultNoiseSettings);
    expect(wear.knocks!.map(({ tS, peakMg }) => ({ tS, peakMg }))).toEqual([
      { tS: 0, peakMg: 4500 },
      { tS: 19, peakMg: 6000 },
    ]);
    // 2 s before the start (clipped to 0) to 3 s after the end (0 + 1 + 3 = 4); 17 to 23 clipped to 20.
    expect(wear.proposedMasks.map(({ startS, endS }) => [startS, endS])).toEqual([
      [0, 4],
      [17, 20],
    ]);
    expect(wear.proposedMasks[0].reason).toMatch(/knock: 4500 mg/);
  });

  test('a knock mask spans 2 s before to 3 s after the interval for 0.125 s and 60 s intervals', () => {
    const short = new Array<number>(100).fill(1000);
    short[40] = 3500; // interval 5.0–5.125 s
    expect(runWearCheck(knockLog(short, 0.125), defaultNoiseSettings).proposedMasks.map((m) => [m.startS, m.endS])).toEqual([[3, 8.125]]);
    const long = [1000, 1000, 3500, 1000, 1000]; // interval 120–180 s
    expect(runWearCheck(knockLog(long, 60), defaultNoiseSettings).proposedMasks.map((m) => [m.startS, m.endS])).toEqual([[118, 183]]);
  });

  test('the knock threshold is a setting', () => {
    const log = knockLog([1000, 2500, 1000]);
    expect(runWearCheck(log, defaultNoiseSettings).knocks).toEqual([]);
    expect(runWearCheck(log, resolveNoiseSettings({ knockThresholdMg: 2000 })).knocks).toHaveLength(1);
  });

  test('without an apeak_mg column knocks are null (not looked for) while still stretches are checked', () => {
    const wear = runWearCheck(movingLog([0, 0, 1]), defaultNoiseSettings);
    expect(wear.available).toBe(true);
    expect(wear.knocks).toBeNull();
    expect(wear.stillStretches).toEqual([]);
  });
});

describe('settings', () => {
  test('missing settings take the PRODUCT.md defaults', () => {
    expect(resolveNoiseSettings()).toEqual({
      stillMinutes: 15,
      motionThresholdMg: 30,
      knockThresholdMg: 3000,
      maskBeforeS: 2,
      maskAfterS: 3,
      driftLimitDb: 0.5,
    });
  });

  test.each([
    [{ stillMinutes: 0 }, /stillMinutes must be a number > 0/],
    [{ motionThresholdMg: Number.NaN }, /motionThresholdMg/],
    [{ maskBeforeS: -1 }, /maskBeforeS must be a number ≥ 0/],
    [{ driftLimitDb: 50 }, /driftLimitDb must be a number > 0 and ≤ 20/],
  ])('an out-of-range setting %o is refused with its name', (partial, message) => {
    expect(() => resolveNoiseSettings(partial)).toThrow(message);
  });
});
