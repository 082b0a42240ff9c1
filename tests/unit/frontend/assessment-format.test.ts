import { describe, expect, it } from 'vitest';
import { formatFigure, formatProbability, formatShare } from '@frontend/features/assessment/lib/format-figure';
import { parseExcludeParam } from '@frontend/features/assessment/lib/use-assessment-variant';

// How the assessment page writes figures (3 significant figures, common practice for reporting
// exposure statistics) and reads the what-if exclusions from its address.

describe('figures on the assessment page', () => {
  it('rounds to 3 significant figures with grouping, and writes "—" for a missing figure', () => {
    expect(formatFigure(0.004123)).toBe('0.00412');
    expect(formatFigure(63.3456)).toBe('63.3');
    expect(formatFigure(12345)).toBe('12,300');
    expect(formatFigure(null)).toBe('—');
    expect(formatFigure(Number.NaN)).toBe('—');
  });

  it('writes shares as percentages, and says "< 0.001 %" rather than a string of zeros', () => {
    expect(formatShare(0.0123)).toBe('1.23 %');
    expect(formatShare(0)).toBe('0 %');
    expect(formatShare(0.000000004)).toBe('< 0.001 %');
  });

  it('writes probabilities in whole percent but never rounds a small chance to 0 % or a near-certainty to 100 %', () => {
    expect(formatProbability(0.784)).toBe('78 %');
    expect(formatProbability(0.001)).toBe('< 1 %');
    expect(formatProbability(0.999)).toBe('> 99 %');
    expect(formatProbability(0)).toBe('0 %');
  });
});

describe('the what-if address', () => {
  it('reads ?exclude= as sorted ids without repeats and ignores anything that is not an id', () => {
    expect(parseExcludeParam('17,3,3, 9')).toEqual([3, 9, 17]);
    expect(parseExcludeParam('4,x,-2,0,5')).toEqual([4, 5]);
    expect(parseExcludeParam(null)).toEqual([]);
    expect(parseExcludeParam('')).toEqual([]);
  });
});
