import { describe, expect, it } from 'vitest';
import { candidateShifts, drawShifts, type MemberPeriod } from '../../../backend/src/services/sampling-draw';

const periods: MemberPeriod[] = [
  { workerId: 1, workerCode: 'A-1', fromDate: '2025-01-01', toDate: null },
  { workerId: 2, workerCode: 'A-2', fromDate: '2025-01-01', toDate: '2025-01-08' },
  { workerId: 3, workerCode: 'A-3', fromDate: '2025-01-09', toDate: null },
];
const window = { startDate: '2025-01-06', endDate: '2025-01-17', includeWeekends: false };

describe('candidate worker-shifts', () => {
  it('are each working day × each member on that day, in date and code order', () => {
    const candidates = candidateShifts(periods, window);
    // 10 working days; A-1 on all 10, A-2 on 6–8 January (3), A-3 from 9 January (7): 20.
    expect(candidates).toHaveLength(20);
    expect(candidates.slice(0, 2)).toEqual([
      { workerId: 1, workerCode: 'A-1', date: '2025-01-06' },
      { workerId: 2, workerCode: 'A-2', date: '2025-01-06' },
    ]);
    expect(candidates.filter((candidate) => candidate.workerCode === 'A-2').map((candidate) => candidate.date)).toEqual([
      '2025-01-06',
      '2025-01-07',
      '2025-01-08',
    ]);
    expect(candidates.some((candidate) => candidate.date === '2025-01-11' || candidate.date === '2025-01-12')).toBe(false);
  });

  it('include Saturdays and Sundays when asked', () => {
    expect(candidateShifts(periods, { ...window, includeWeekends: true })).toHaveLength(24);
  });

  it('do not depend on the order the periods come in', () => {
    expect(candidateShifts([...periods].reverse(), window)).toEqual(candidateShifts(periods, window));
  });
});

describe('drawing worker-shifts', () => {
  const candidates = candidateShifts(periods, window);

  it('the same seed draws the same shifts; another seed draws others', () => {
    const first = drawShifts(candidates, 6, 20_250_106);
    expect(drawShifts(candidates, 6, 20_250_106)).toEqual(first);
    expect(drawShifts(candidates, 6, 20_250_107)).not.toEqual(first);
  });

  it('draws distinct candidates, in date order, each with the position it was drawn at', () => {
    const drawn = drawShifts(candidates, 8, 42);
    expect(new Set(drawn.map((shift) => `${shift.workerId}|${shift.date}`)).size).toBe(8);
    expect(drawn.map((shift) => shift.date)).toEqual(drawn.map((shift) => shift.date).sort());
    expect(drawn.map((shift) => shift.position).sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    for (const shift of drawn) expect(candidates).toContainEqual({ workerId: shift.workerId, workerCode: shift.workerCode, date: shift.date });
  });

  it('takes every candidate when the target is larger', () => {
    expect(drawShifts(candidates.slice(0, 3), 6, 42)).toHaveLength(3);
  });

  it('gives each candidate the same chance: over 2000 seeds each of 20 candidates is drawn about 6/20 of the time', () => {
    // Binomial(2000, 0.3): sd ≈ 20.5, so ±5 sd = ±103 around 600 — a bound a fair draw breaks with
    // negligible probability and a biased one (e.g. always the first candidates) breaks at once.
    const counts = new Map<string, number>();
    for (let seed = 1; seed <= 2000; seed++) {
      for (const shift of drawShifts(candidates, 6, seed))
        counts.set(`${shift.workerId}|${shift.date}`, (counts.get(`${shift.workerId}|${shift.date}`) ?? 0) + 1);
    }
    expect(counts.size).toBe(20);
    for (const count of counts.values()) expect(Math.abs(count - 600)).toBeLessThan(103);
  });
});
