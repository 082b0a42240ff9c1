import { describe, expect, it } from 'vitest';
import { briefScalaAdjustedLimit, briefScalaReductionFactor } from '@stats/extended-shift';
import { convertAirConcentration, milligramsPerCubicMetreToPpm, ppmToMilligramsPerCubicMetre } from '@stats/unit-conversion';

describe('ppm ↔ mg/m³ at 25 °C and 760 torr (mg/m³ = ppm × MW / 24.45)', () => {
  // REFERENCES.md "Chemical units and long shifts" (ACGIH): toluene 100 ppm = 376.9 mg/m³.
  // Toluene C7H8: MW = 7 × 12.011 + 8 × 1.008 = 92.141 g/mol (standard atomic weights; computed).
  // The reference prints 4 significant digits, so the tolerance is half a unit in the last place (0.05).
  const toluene = 92.14;

  it('toluene 100 ppm is 376.9 mg/m³ to the printed digits', () => {
    expect(Math.abs(ppmToMilligramsPerCubicMetre(100, toluene) - 376.9)).toBeLessThanOrEqual(0.05);
  });

  it('toluene 376.9 mg/m³ is 100.0 ppm to the printed digits', () => {
    // 376.9 carries ±0.05 from rounding, i.e. ±0.013 ppm: the printed 100.0 holds to ±0.05.
    expect(Math.abs(milligramsPerCubicMetreToPpm(376.9, toluene) - 100)).toBeLessThanOrEqual(0.05);
  });

  it('converts either way through one entry point, and the same unit is left as it is', () => {
    expect(convertAirConcentration(100, 'ppm', 'mg/m3', toluene)).toBe(ppmToMilligramsPerCubicMetre(100, toluene));
    expect(convertAirConcentration(376.9, 'mg/m3', 'ppm', toluene)).toBe(milligramsPerCubicMetreToPpm(376.9, toluene));
    expect(convertAirConcentration(3, 'mg/m3', 'mg/m3', null)).toBe(3);
  });

  it('refuses a conversion without a molecular weight, and bad numbers, naming the function', () => {
    expect(() => convertAirConcentration(1, 'ppm', 'mg/m3', null)).toThrow(
      new RangeError('convertAirConcentration: converting ppm to mg/m3 needs the molecular weight'),
    );
    expect(() => ppmToMilligramsPerCubicMetre(1, 0)).toThrow(/ppmToMilligramsPerCubicMetre: the molecular weight must be a finite number > 0/);
    expect(() => ppmToMilligramsPerCubicMetre(-1, toluene)).toThrow(/the concentration must be a finite number ≥ 0/);
    expect(() => milligramsPerCubicMetreToPpm(Number.NaN, toluene)).toThrow(RangeError);
  });
});

describe('Brief & Scala reduction factor RF = (8/h)·(24−h)/16', () => {
  // REFERENCES.md "Chemical units and long shifts": 10 h → 0.7, 12 h → 0.5. The formula gives these
  // exactly in real arithmetic; 1e-12 allows only floating-point rounding.
  it('is 0.7 for a 10-hour shift', () => {
    expect(Math.abs(briefScalaReductionFactor(10) - 0.7)).toBeLessThan(1e-12);
  });

  it('is 0.5 for a 12-hour shift', () => {
    expect(Math.abs(briefScalaReductionFactor(12) - 0.5)).toBeLessThan(1e-12);
  });

  it('turns a 100 ppm limit into 50 ppm over 12 hours (REFERENCES.md)', () => {
    expect(Math.abs(briefScalaAdjustedLimit(100, 12) - 50)).toBeLessThan(1e-10);
  });

  it('never raises a limit for a shift of 8 hours or less (common practice: capped at 1)', () => {
    expect(briefScalaReductionFactor(8)).toBe(1);
    expect(briefScalaReductionFactor(6)).toBe(1);
  });

  it('refuses shifts outside (0, 24] hours, naming the function', () => {
    expect(() => briefScalaReductionFactor(0)).toThrow(/^briefScalaReductionFactor: shiftHours must be a number above 0 and at most 24, got 0$/);
    expect(() => briefScalaReductionFactor(25)).toThrow(RangeError);
    expect(() => briefScalaAdjustedLimit(0, 10)).toThrow(/briefScalaAdjustedLimit: the OEL must be a number above 0/);
  });
});
