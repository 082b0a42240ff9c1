import { describe, expect, it } from 'vitest';
import { shiftTwa } from '@stats/shift-twa';

/*
 * Shift TWA = Σ(Cᵢ·tᵢ)/T (OSHA 29 CFR 1910.1000(d)(1)(i)). Every expected value here is worked by
 * hand from that formula, written out beside it. 1e-12 relative allows only floating-point rounding.
 */
const close = (actual: number, expected: number) => expect(Math.abs(actual / expected - 1)).toBeLessThan(1e-12);

describe('shift TWA from sample periods', () => {
  const periods = [
    { concentration: 0.4, minutes: 120, nonDetect: false },
    { concentration: 0.1, minutes: 240, nonDetect: false },
  ];

  it('unsampled time at zero: divide by the shift length — (0.4·120 + 0.1·240)/480 = 72/480 = 0.15', () => {
    const result = shiftTwa(periods, { assumption: 'zero', shiftMinutes: 480 });
    close(result.twa, 0.15);
    expect(result).toMatchObject({ nonDetect: false, sampledMinutes: 360, averagingMinutes: 480, unsampledMinutes: 120, nonDetectPeriods: 0 });
    expect(result.lowerBound).toBe(result.upperBound);
  });

  it('unsampled time at the sampled average: divide by the sampled time — 72/360 = 0.2', () => {
    const result = shiftTwa(periods, { assumption: 'sampled-average', shiftMinutes: 480 });
    close(result.twa, 0.2);
    expect(result.averagingMinutes).toBe(360);
  });

  it('a 10-hour shift covered by three samples: (2.0·200 + 1.0·250 + 0.5·150)/600 = 725/600 = 1.208333…', () => {
    const result = shiftTwa(
      [
        { concentration: 2, minutes: 200, nonDetect: false },
        { concentration: 1, minutes: 250, nonDetect: false },
        { concentration: 0.5, minutes: 150, nonDetect: false },
      ],
      { assumption: 'zero', shiftMinutes: 600 },
    );
    close(result.twa, 725 / 600);
    expect(result.unsampledMinutes).toBe(0);
  });

  it('a non-detect part counts at its limit for the value (upper bound) and at zero for the lower bound: (0.05·240 + 0.3·240)/480 = 0.175, 72/480 = 0.15', () => {
    const result = shiftTwa(
      [
        { concentration: 0.05, minutes: 240, nonDetect: true },
        { concentration: 0.3, minutes: 240, nonDetect: false },
      ],
      { assumption: 'zero', shiftMinutes: 480 },
    );
    close(result.twa, 0.175);
    close(result.upperBound, 0.175);
    close(result.lowerBound, 0.15);
    expect(result).toMatchObject({ nonDetect: false, nonDetectPeriods: 1 });
  });

  it('all parts below detection give a non-detect below the TWA of the limits: (0.05·240 + 0.02·240)/480 = 0.035', () => {
    const result = shiftTwa(
      [
        { concentration: 0.05, minutes: 240, nonDetect: true },
        { concentration: 0.02, minutes: 240, nonDetect: true },
      ],
      { assumption: 'zero', shiftMinutes: 480 },
    );
    close(result.twa, 0.035);
    expect(result.nonDetect).toBe(true);
    expect(result.lowerBound).toBe(0);
  });

  it('refuses samples longer than the shift when unsampled time is zero, but not with the sampled average', () => {
    const long = [
      { concentration: 1, minutes: 300, nonDetect: false },
      { concentration: 1, minutes: 300, nonDetect: false },
    ];
    expect(() => shiftTwa(long, { assumption: 'zero', shiftMinutes: 480 })).toThrow(
      new RangeError('shiftTwa: the samples cover 600 min, more than the shift of 480 min'),
    );
    close(shiftTwa(long, { assumption: 'sampled-average', shiftMinutes: 480 }).twa, 1);
  });

  it('refuses empty input, zero durations, negative concentrations, a zero detection limit and bad shift lengths, naming the rule', () => {
    expect(() => shiftTwa([], { assumption: 'zero', shiftMinutes: 480 })).toThrow('shiftTwa: needs at least one sample period');
    expect(() => shiftTwa([{ concentration: 1, minutes: 0, nonDetect: false }], { assumption: 'zero', shiftMinutes: 480 })).toThrow(
      'shiftTwa: period 1 must last more than 0 minutes, got 0',
    );
    expect(() => shiftTwa([{ concentration: -1, minutes: 10, nonDetect: false }], { assumption: 'zero', shiftMinutes: 480 })).toThrow(
      /period 1 needs a concentration ≥ 0/,
    );
    expect(() => shiftTwa([{ concentration: 0, minutes: 10, nonDetect: true }], { assumption: 'zero', shiftMinutes: 480 })).toThrow(
      /a detection limit > 0 for a non-detect/,
    );
    expect(() => shiftTwa(periods, { assumption: 'zero', shiftMinutes: 0 })).toThrow('shiftTwa: shiftMinutes must be a number above 0 and at most 1440, got 0');
  });
});
