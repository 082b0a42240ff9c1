import { describe, expect, it } from 'vitest';
import { agentCreate, isValidCasNumber } from '@schema/agents';

// The check-digit rule is CAS's published verification formula; the numbers below are well-known
// CAS Registry Numbers (from memory) whose check digits were re-worked by hand from the rule:
// quartz 14808-60-7: (0·1+6·2+8·3+0·4+8·5+4·6+1·7) = 107 → 7; water 7732-18-5: 105 → 5; benzene 71-43-2: 42 → 2.
describe('CAS Registry Number check', () => {
  it('accepts well-formed numbers with the right check digit', () => {
    expect(isValidCasNumber('14808-60-7')).toBe(true);
    expect(isValidCasNumber('7732-18-5')).toBe(true);
    expect(isValidCasNumber('71-43-2')).toBe(true);
  });

  it('rejects a wrong check digit and malformed numbers', () => {
    expect(isValidCasNumber('14808-60-8')).toBe(false);
    expect(isValidCasNumber('14808607')).toBe(false);
    expect(isValidCasNumber('1-43-2')).toBe(false);
    expect(isValidCasNumber('71-4-2')).toBe(false);
  });

  it('a chemical agent with a bad CAS number is refused naming casNumber; noise may not carry one', () => {
    const chemical = agentCreate.safeParse({ name: 'Quartz', kind: 'chemical', casNumber: '14808-60-8' });
    expect(chemical.success).toBe(false);
    expect(chemical.error?.issues.map((issue) => issue.path.join('.'))).toEqual(['casNumber']);
    const noise = agentCreate.safeParse({ name: 'Noise', kind: 'noise', casNumber: '14808-60-7', molecularWeight: 60.08 });
    expect(noise.error?.issues.map((issue) => issue.path.join('.')).sort()).toEqual(['casNumber', 'molecularWeight']);
    expect(agentCreate.safeParse({ name: 'Quartz', kind: 'chemical', casNumber: '14808-60-7', molecularWeight: 60.08 }).success).toBe(true);
  });
});
