/**
 * Airborne concentration units: parts per million by volume (ppm) ↔ milligrams per cubic metre
 * (mg/m³) for a gas or vapour at 25 °C and 760 torr.
 *
 * Method: mg/m³ = ppm × MW / 24.45, where MW is the molecular weight (g/mol) and 24.45 L/mol is
 * the molar volume of an ideal gas at 25 °C and 760 torr (101.325 kPa), the conversion ACGIH gives
 * with its TLVs (REFERENCES.md "Chemical units and long shifts"; the booklet section is cited from
 * memory). Check (REFERENCES.md): toluene 100 ppm = 376.9 mg/m³ (MW 92.14, the molecular weight of
 * C7H8 from standard atomic weights — computed, not from REFERENCES.md).
 *
 * Only for gases and vapours: aerosols (dusts, fibres) have no ppm, and a molecular weight does not
 * make one — callers must not offer the conversion for them.
 */

/** Molar volume of an ideal gas at 25 °C and 760 torr, litres per mole (ACGIH). */
export const molarVolumeLitresAt25C = 24.45;

/** The two concentration units this file converts between. */
export type AirConcentrationUnit = 'ppm' | 'mg/m3';

function checkArguments(name: string, value: number, molecularWeight: number): void {
  if (!Number.isFinite(value) || value < 0) throw new RangeError(`${name}: the concentration must be a finite number ≥ 0, got ${value}`);
  if (!Number.isFinite(molecularWeight) || molecularWeight <= 0)
    throw new RangeError(`${name}: the molecular weight must be a finite number > 0 g/mol, got ${molecularWeight}`);
}

/**
 * ppm → mg/m³ at 25 °C, 760 torr: ppm × MW / 24.45 (ACGIH).
 * `ppmToMilligramsPerCubicMetre(100, 92.14)` → 376.85… (toluene).
 */
export function ppmToMilligramsPerCubicMetre(ppm: number, molecularWeight: number): number {
  checkArguments('ppmToMilligramsPerCubicMetre', ppm, molecularWeight);
  return (ppm * molecularWeight) / molarVolumeLitresAt25C;
}

/**
 * mg/m³ → ppm at 25 °C, 760 torr: mg/m³ × 24.45 / MW (ACGIH).
 * `milligramsPerCubicMetreToPpm(376.9, 92.14)` → 100.01… (toluene).
 */
export function milligramsPerCubicMetreToPpm(milligramsPerCubicMetre: number, molecularWeight: number): number {
  checkArguments('milligramsPerCubicMetreToPpm', milligramsPerCubicMetre, molecularWeight);
  return (milligramsPerCubicMetre * molarVolumeLitresAt25C) / molecularWeight;
}

/**
 * Converts between ppm and mg/m³ (either direction; the same unit returns the value unchanged).
 * Throws a RangeError when a conversion needs a molecular weight and none is given.
 */
export function convertAirConcentration(value: number, from: AirConcentrationUnit, to: AirConcentrationUnit, molecularWeight: number | null): number {
  if (from === to) {
    if (!Number.isFinite(value) || value < 0) throw new RangeError(`convertAirConcentration: the concentration must be a finite number ≥ 0, got ${value}`);
    return value;
  }
  if (molecularWeight === null) throw new RangeError(`convertAirConcentration: converting ${from} to ${to} needs the molecular weight`);
  return from === 'ppm' ? ppmToMilligramsPerCubicMetre(value, molecularWeight) : milligramsPerCubicMetreToPpm(value, molecularWeight);
}
