import { describe, expect, it } from 'vitest';
import { hirschStedingerPositions, robustRos, robustRosLogs } from '../../../stats/ros';
import { normalQuantile } from '../../../stats/normal-distribution';
import type { ShiftValue } from '../../../stats/types';

const sample: ShiftValue[] = [
  { value: 0.05, nonDetect: true },
  { value: 0.31, nonDetect: false },
  { value: 0.12, nonDetect: false },
  { value: 0.05, nonDetect: true },
  { value: 0.2, nonDetect: true },
  { value: 0.07, nonDetect: false },
  { value: 0.55, nonDetect: false },
  { value: 0.18, nonDetect: false },
  { value: 0.05, nonDetect: true },
  { value: 1.3, nonDetect: false },
];

describe('hirschStedingerPositions', () => {
  it('without non-detects reduces to the Weibull positions r/(n + 1)', () => {
    const positions = hirschStedingerPositions([5, 1, 3, 2], []);
    expect(positions.detected).toEqual([4 / 5, 1 / 5, 3 / 5, 2 / 5]);
    expect(positions.nonDetect).toEqual([]);
  });

  it('gives non-detects sharing a limit the positions (1 − pe)·r/(C + 1), r = 1 … C', () => {
    // One limit 1 with 2 non-detects and 3 detected values above it: pe = 3/(3 + 2) = 0.6.
    const positions = hirschStedingerPositions([2, 3, 4], [1, 1]);
    expect(positions.nonDetect[0]).toBeCloseTo(0.4 * (1 / 3), 15);
    expect(positions.nonDetect[1]).toBeCloseTo(0.4 * (2 / 3), 15);
    // Detected values: 0.4 + 0.6·r/4.
    expect(positions.detected).toEqual([0.4 + 0.6 * 0.25, 0.4 + 0.6 * 0.5, 0.4 + 0.6 * 0.75].map((p) => expect.closeTo(p, 15)));
  });

  it('keeps every position strictly between 0 and 1 and increasing with the detected value', () => {
    const positions = hirschStedingerPositions([0.01, 9, 0.4, 2.5, 0.4, 30], [0.5, 3, 0.5, 50]);
    for (const p of [...positions.detected, ...positions.nonDetect]) {
      expect(p).toBeGreaterThan(0);
      expect(p).toBeLessThan(1);
    }
    const byValue = [0, 2, 4, 3, 1, 5].map((i) => positions.detected[i]);
    for (let i = 1; i < byValue.length; i++) expect(byValue[i]).toBeGreaterThan(byValue[i - 1]);
  });

  it('refuses NaN', () => {
    expect(() => hirschStedingerPositions([1, Number.NaN], [])).toThrow(/hirschStedingerPositions: detected values must be numbers/);
  });
});

describe('robustRos', () => {
  it('puts each imputed non-detect on the line fitted to the detected values', () => {
    const fit = robustRos(sample);
    for (const point of fit.points.filter((p) => p.nonDetect)) {
      expect(Math.log(point.estimate)).toBeCloseTo(fit.line.intercept + fit.line.slope * normalQuantile(point.p), 12);
      expect(point.normalScore).toBeCloseTo(normalQuantile(point.p), 14);
    }
  });

  it('keeps detected values as measured and returns the mean and SD of the combined logs', () => {
    const fit = robustRos(sample);
    fit.points.filter((p) => !p.nonDetect).forEach((p) => expect(p.estimate).toBe(p.value));
    const logs = fit.points.map((p) => Math.log(p.estimate));
    const mean = logs.reduce((a, b) => a + b, 0) / logs.length;
    const sd = Math.sqrt(logs.reduce((a, y) => a + (y - mean) ** 2, 0) / (logs.length - 1));
    expect(fit.mu).toBeCloseTo(mean, 12);
    expect(fit.sigma).toBeCloseTo(sd, 12);
  });

  it('without non-detects gives the mean and SD (n − 1) of the logs', () => {
    const values = [0.2, 0.5, 0.9, 0.31].map((value) => ({ value, nonDetect: false }));
    const logs = values.map((v) => Math.log(v.value));
    const mean = logs.reduce((a, b) => a + b, 0) / 4;
    const sd = Math.sqrt(logs.reduce((a, y) => a + (y - mean) ** 2, 0) / 3);
    const fit = robustRos(values);
    expect(fit.mu).toBeCloseTo(mean, 14);
    expect(fit.sigma).toBeCloseTo(sd, 14);
  });

  it('shifts the line and mu by log(c) and keeps slope and sigma when results and limits are multiplied by c', () => {
    const base = robustRos(sample);
    const scaled = robustRos(sample.map((v) => ({ ...v, value: v.value * 250 })));
    expect(scaled.line.intercept - base.line.intercept).toBeCloseTo(Math.log(250), 12);
    expect(scaled.line.slope).toBeCloseTo(base.line.slope, 12);
    expect(scaled.mu - base.mu).toBeCloseTo(Math.log(250), 12);
    expect(scaled.sigma).toBeCloseTo(base.sigma, 12);
  });

  it('refuses values that are not > 0, fewer than 2 detected values and equal detected values', () => {
    expect(() => robustRos([...sample.slice(0, 3), { value: 0, nonDetect: true }])).toThrow(
      /robustRos: result 4 has detection limit 0; it must be a finite number > 0/,
    );
    expect(() =>
      robustRos([
        { value: 1, nonDetect: false },
        { value: 0.5, nonDetect: true },
      ]),
    ).toThrow(/robustRos: needs at least 2 detected values to fit the line, got 1/);
    expect(() => robustRosLogs([0.3, 0.3, 0.3], [0])).toThrow(/robustRosLogs: the detected values are all equal/);
  });
});
