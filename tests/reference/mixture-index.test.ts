import { describe, expect, it } from 'vitest';
import { mixtureIndex } from '@stats/index';

// Relative tolerance 1e-12: the index is a sum of three quotients, so only floating-point rounding separates it from the exact figure.
const closeTo = (actual: number, expected: number) => expect(Math.abs(actual - expected) / expected).toBeLessThan(1e-12);

describe('additive mixture index Em = Σ Ci/Li (OSHA 29 CFR 1910.1000(d)(2)(i))', () => {
  it('500 ppm of A (limit 1000), 45 of B (200) and 40 of C (200) give 0.925 — the printed example of 1910.1000(d)(2)(i) as remembered (from memory)', () => {
    const result = mixtureIndex([
      { value: 500, nonDetect: false, oel: 1000 },
      { value: 45, nonDetect: false, oel: 200 },
      { value: 40, nonDetect: false, oel: 200 },
    ]);
    closeTo(result.index, 0.925);
    expect(result.ratios.map((ratio) => Number(ratio.toFixed(6)))).toEqual([0.5, 0.225, 0.2]);
    expect(result.allNonDetect).toBe(false);
  });

  it('counts a non-detect at its detection limit and reports the lower bound with it at 0 (hand-worked: 0.5 + 0.05 = 0.55; lower 0.5)', () => {
    const result = mixtureIndex([
      { value: 50, nonDetect: false, oel: 100 },
      { value: 1, nonDetect: true, oel: 20 },
    ]);
    closeTo(result.index, 0.55);
    closeTo(result.lowerBound, 0.5);
    expect(result.nonDetectComponents).toBe(1);
  });

  it('when every component is a non-detect the index is a non-detect at Σ LOD/OEL (0.01 + 0.05 = 0.06)', () => {
    const result = mixtureIndex([
      { value: 1, nonDetect: true, oel: 100 },
      { value: 1, nonDetect: true, oel: 20 },
    ]);
    expect(result.allNonDetect).toBe(true);
    closeTo(result.index, 0.06);
    expect(result.lowerBound).toBe(0);
  });

  it('refuses fewer than 2 components and a limit of 0, naming the function', () => {
    expect(() => mixtureIndex([{ value: 1, nonDetect: false, oel: 1 }])).toThrow(new RangeError('mixtureIndex: a mixture needs at least 2 components'));
    expect(() =>
      mixtureIndex([
        { value: 1, nonDetect: false, oel: 1 },
        { value: 1, nonDetect: false, oel: 0 },
      ]),
    ).toThrow(/component 2 needs a limit above 0/);
  });
});
