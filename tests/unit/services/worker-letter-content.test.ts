import { describe, expect, it } from 'vitest';
import { resolveActionLevel } from '@stats/action-level';
import { buildWorkerLetter, defaultDutyFor, letterPlainText, valueText, type LetterInput } from '../../../backend/src/services/worker-letter-content';

const silicaGroup: LetterInput['group'] = {
  id: 7,
  name: 'Cutter – respirable crystalline silica',
  agentName: 'Respirable crystalline silica',
  agentKind: 'chemical',
  oelValue: 0.05,
  oelUnit: 'mg/m3',
  oelSource: 'Example limit',
};

function silicaLetter(values: number[], name: string | null = 'Marin Estevan'): ReturnType<typeof buildWorkerLetter> {
  const level = resolveActionLevel({
    agentKind: 'chemical',
    oelValue: 0.05,
    oelUnit: 'mg/m3',
    oelAveragingTime: '8h-twa',
    actionLevel: 0.025,
    noiseCriteriaSet: null,
  })!;
  return buildWorkerLetter({
    organizationName: 'Slate Harbor Stoneworks',
    letterDate: '2025-03-03',
    worker: { code: 'SH-001', name, jobTitle: 'Cutter' },
    group: silicaGroup,
    actionLevel: level,
    results: values.map((value, index) => ({ id: index + 1, date: `2025-02-0${index + 1}`, value, unit: 'mg/m3' })),
    dutyCited: defaultDutyFor('chemical'),
    contact: { name: 'Sasha Marr', email: 'hygienist@slateharbor.example' },
  });
}

describe('worker letter content', () => {
  it('tells a chemical result against the action level and the limit, with controls and medical surveillance as next steps', () => {
    const letter = silicaLetter([0.031, 0.062]);
    const text = letterPlainText(letter);
    expect(letter.results.map((result) => [result.valueText, result.atOrAboveLimit])).toEqual([
      ['0.031 mg/m³', false],
      ['0.062 mg/m³', true],
    ]);
    expect(text).toContain('The action level for this work is 0.025 mg/m³.');
    expect(text).toContain('1 of these results is also at or above the exposure limit (0.05 mg/m³, Example limit)');
    expect(text).toContain('medical surveillance');
    expect(text).not.toContain('audiometric');
    expect(text).toContain('Follow the local regulation.');
    expect(text).toContain('contact Sasha Marr (hygienist@slateharbor.example)');
  });

  it('addresses a worker without a recorded name by code', () => {
    expect(silicaLetter([0.03], null).greeting).toBe('Dear colleague (worker SH-001),');
  });

  it('writes dB(A) to 0.1 dB and other values to 3 significant digits', () => {
    expect(valueText(85, 'dBA')).toBe('85.0 dB(A)');
    expect(valueText(73.456, 'dose-percent')).toBe('73.5 % of the daily noise dose');
    expect(valueText(0.0312345, 'mg/m3')).toBe('0.0312 mg/m³');
  });

  it('names OSHA 29 CFR 1910.95(e) for noise and defers to the local regulation', () => {
    expect(defaultDutyFor('noise')).toMatch(/^OSHA 29 CFR 1910\.95\(e\), employee notification/);
    expect(defaultDutyFor('noise')).toContain('follow the local regulation');
  });
});
