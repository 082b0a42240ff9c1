import { exposureUnitLabels, type Agent, type ExposureUnit } from '@schema/agents';
import type { ShiftResultDetails } from '@schema/shift-results';
import { convertAirConcentration, molarVolumeLitresAt25C } from '@stats/unit-conversion';

/*
 * Converting a reported value into the group's OEL unit. Mass concentrations convert by a factor
 * (1 mg = 1000 µg); ppm ↔ mass concentration goes through mg/m³ at 25 °C and 760 torr from the
 * agent's molecular weight (stats/unit-conversion.ts). Nothing else converts: fibres have no mass
 * here, and dB(A) ↔ % dose depends on the criteria set and the shift length (noise logs do that).
 */

/** Milligrams per cubic metre in one of each mass-concentration unit. */
const massFactor: Partial<Record<ExposureUnit, number>> = { 'mg/m3': 1, 'ug/m3': 0.001 };

export type UnitConversion =
  { ok: true; convert: (value: number) => number; details: ShiftResultDetails['conversion'] | undefined } | { ok: false; message: string };

/**
 * How to turn a value in `from` into `to` for this agent, or why it cannot be done.
 * `conversionBetween('ppm', 'mg/m3', toluene).convert(100)` → 376.85…
 */
export function conversionBetween(from: ExposureUnit, to: ExposureUnit, agent: Pick<Agent, 'name' | 'kind' | 'molecularWeight'>): UnitConversion {
  if (from === to) return { ok: true, convert: (value) => value, details: undefined };
  const fromMass = massFactor[from];
  const toMass = massFactor[to];
  const cannot = `cannot convert ${exposureUnitLabels[from]} to ${exposureUnitLabels[to]}`;
  if (fromMass !== undefined && toMass !== undefined) {
    return {
      ok: true,
      convert: (value) => (value * fromMass) / toMass,
      details: { from, to, molecularWeight: null, molarVolumeLitres: null, source: '1 mg = 1000 µg' },
    };
  }
  const involvesPpm = (from === 'ppm' && toMass !== undefined) || (to === 'ppm' && fromMass !== undefined);
  if (!involvesPpm) return { ok: false, message: `${cannot}: the units measure different things` };
  if (agent.kind !== 'chemical' || agent.molecularWeight === null) {
    return {
      ok: false,
      message: `${cannot} for "${agent.name}": the agent has no molecular weight (set it on the agent, or report in ${exposureUnitLabels[to]})`,
    };
  }
  const molecularWeight = agent.molecularWeight;
  const details = {
    from,
    to,
    molecularWeight,
    molarVolumeLitres: molarVolumeLitresAt25C,
    source: 'mg/m³ = ppm × MW / 24.45 at 25 °C and 760 torr (ACGIH)',
  };
  if (from === 'ppm') {
    return { ok: true, convert: (value) => convertAirConcentration(value, 'ppm', 'mg/m3', molecularWeight) / toMass!, details };
  }
  return { ok: true, convert: (value) => convertAirConcentration(value * fromMass!, 'mg/m3', 'ppm', molecularWeight), details };
}

/**
 * Reads a unit as labs and people write it: `mg/m3`, `mg/m³`, `µg/m3`, `ug/m3`, `ppm`, `f/cc`,
 * `f/ml`, `fibres/cm3`, `dBA`, `dB(A)`, `%`, `% dose`… Undefined when not recognised.
 */
export function parseUnit(text: string): ExposureUnit | undefined {
  const key = text.trim().toLowerCase().replace(/³/g, '3').replace(/μ|µ/g, 'u').replace(/\s+/g, '').replace(/\^/g, '');
  const aliases: Record<string, ExposureUnit> = {
    'mg/m3': 'mg/m3',
    mgm3: 'mg/m3',
    'mgm-3': 'mg/m3',
    'mg/cum': 'mg/m3',
    'ug/m3': 'ug/m3',
    ugm3: 'ug/m3',
    'ugm-3': 'ug/m3',
    'mcg/m3': 'ug/m3',
    ppm: 'ppm',
    ppmv: 'ppm',
    'f/cc': 'f/cc',
    'f/ml': 'f/cc',
    'f/cm3': 'f/cc',
    'fibres/cc': 'f/cc',
    'fibers/cc': 'f/cc',
    'fibres/ml': 'f/cc',
    'fibers/ml': 'f/cc',
    'fibres/cm3': 'f/cc',
    'fibers/cm3': 'f/cc',
    dba: 'dBA',
    'db(a)': 'dBA',
    '%': 'dose-percent',
    '%dose': 'dose-percent',
    'dose%': 'dose-percent',
    dose: 'dose-percent',
    'dose-percent': 'dose-percent',
    percentdose: 'dose-percent',
  };
  return aliases[key];
}
