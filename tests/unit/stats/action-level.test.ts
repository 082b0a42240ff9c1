import { describe, expect, it } from 'vitest';
import { isAtOrAboveActionLevel, resolveActionLevel, resultsAtOrAboveActionLevel, type ActionLevelGroup, type ActionLevelResult } from '@stats/action-level';

const noiseDba: ActionLevelGroup = {
  agentKind: 'noise',
  oelValue: 90,
  oelUnit: 'dBA',
  oelAveragingTime: '8h-twa',
  actionLevel: null,
  noiseCriteriaSet: 'oshaHc',
};
const noiseDose: ActionLevelGroup = { ...noiseDba, oelValue: 100, oelUnit: 'dose-percent' };
const chemical: ActionLevelGroup = {
  agentKind: 'chemical',
  oelValue: 0.05,
  oelUnit: 'mg/m3',
  oelAveragingTime: '8h-twa',
  actionLevel: null,
  noiseCriteriaSet: null,
};

const valid = (value: number, unit: ActionLevelResult['unit']): ActionLevelResult => ({ value, unit, nonDetect: false, status: 'valid' });

describe('resolveActionLevel', () => {
  it('uses the group’s own action level whenever one is set, in the group’s unit', () => {
    const level = resolveActionLevel({ ...noiseDose, noiseCriteriaSet: 'nioshRel', actionLevel: 50 });
    expect(level).toMatchObject({ value: 50, unit: 'dose-percent', origin: 'group' });
  });

  it('falls back to 85 dBA for a noise group in dBA (OSHA 29 CFR 1910.95(c)(1): 8-hour TWA of 85 dB)', () => {
    expect(resolveActionLevel(noiseDba)).toMatchObject({ value: 85, unit: 'dBA', origin: 'hearing-conservation-default' });
  });

  it('falls back to exactly 50 % dose under the OSHA 90 dBA / 5 dB sets (1910.95(c)(1): "or, equivalently, a dose of fifty percent")', () => {
    // Exactly 50, not the 49.99… of the 16.61-slope TWA formula, so 49.995 % is not counted.
    expect(resolveActionLevel(noiseDose)?.value).toBe(50);
    expect(resolveActionLevel({ ...noiseDose, noiseCriteriaSet: 'oshaPel' })?.value).toBe(50);
  });

  it('expresses 85 dBA as 100 % dose under the NIOSH set (85 dBA criterion, NIOSH 98-126)', () => {
    expect(resolveActionLevel({ ...noiseDose, noiseCriteriaSet: 'nioshRel' })?.value).toBe(100);
  });

  it('gives no default for a % dose group judged with ISO 9612, which has no dose scale', () => {
    expect(resolveActionLevel({ ...noiseDose, noiseCriteriaSet: 'iso' })).toBeNull();
  });

  it('falls back to half the OEL for a chemical 8-hour limit (NIOSH 1977 sampling strategy manual, from memory)', () => {
    expect(resolveActionLevel(chemical)).toMatchObject({ value: 0.025, unit: 'mg/m3', origin: 'half-oel-default' });
  });

  it('gives no default for short-term or ceiling chemical limits', () => {
    expect(resolveActionLevel({ ...chemical, oelAveragingTime: '15min-stel' })).toBeNull();
    expect(resolveActionLevel({ ...chemical, oelAveragingTime: 'ceiling' })).toBeNull();
  });

  it('throws a RangeError naming the function for an action level that is not a positive number', () => {
    expect(() => resolveActionLevel({ ...chemical, actionLevel: Number.NaN })).toThrow(/resolveActionLevel/);
  });
});

describe('isAtOrAboveActionLevel', () => {
  const dba = resolveActionLevel(noiseDba)!;
  const dose = resolveActionLevel(noiseDose)!;

  it('includes a TWA of exactly 85.0 dBA ("equal to or exceeding", 1910.95(c)(1)) and leaves out 84.9', () => {
    expect(isAtOrAboveActionLevel(valid(85.0, 'dBA'), dba)).toBe(true);
    expect(isAtOrAboveActionLevel(valid(84.9, 'dBA'), dba)).toBe(false);
  });

  it('includes a dose of exactly 50 % and leaves out 49.9 %', () => {
    expect(isAtOrAboveActionLevel(valid(50, 'dose-percent'), dose)).toBe(true);
    expect(isAtOrAboveActionLevel(valid(49.9, 'dose-percent'), dose)).toBe(false);
  });

  it('never counts a non-detect, even when its detection limit is above the action level', () => {
    const level = resolveActionLevel(chemical)!;
    expect(isAtOrAboveActionLevel({ value: 0.2, unit: 'mg/m3', nonDetect: true, status: 'valid' }, level)).toBe(false);
  });

  it('never counts a void result', () => {
    expect(isAtOrAboveActionLevel({ value: 95, unit: 'dBA', nonDetect: false, status: 'void' }, dba)).toBe(false);
  });

  it('does not compare a result stored in another unit than the action level', () => {
    expect(isAtOrAboveActionLevel(valid(120, 'dose-percent'), dba)).toBe(false);
  });

  it('selects, in order, the chemical results at or above the group’s action level', () => {
    const level = resolveActionLevel({ ...chemical, actionLevel: 0.025 })!;
    const results = [valid(0.01, 'mg/m3'), valid(0.025, 'mg/m3'), valid(0.0249, 'mg/m3'), valid(0.3, 'mg/m3')];
    expect(resultsAtOrAboveActionLevel(results, level).map((result) => result.value)).toEqual([0.025, 0.3]);
  });
});
