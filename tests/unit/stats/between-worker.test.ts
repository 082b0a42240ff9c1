/**
 * Between-worker analysis: refusals, exclusions, the flag for workers who may not belong, and the
 * probability that a worker's mean exceeds the OEL.
 *
 * Sources: the flag rule and formulas of stats/between-worker.ts (Rappaport 1991; Lyles, Kupper &
 * Rappaport 1997, from memory); the figures themselves are checked against R in
 * tests/reference/between-worker.test.ts. Data are invented (demo scenario worker codes).
 */
import { describe, expect, test } from 'vitest';
import { betweenWorkerAnalysis } from '@stats/between-worker';
import { createRandom } from '@stats/random';
import type { ShiftValue } from '@stats/types';

function workers(seed: number, spec: [string, number, number][], gsdWithin = 1.8): ShiftValue[] {
  const random = createRandom(seed);
  return spec.flatMap(([worker, n, gm]) =>
    Array.from({ length: n }, () => ({ value: Math.exp(Math.log(gm) + Math.log(gsdWithin) * random.normal()), nonDetect: false, worker })),
  );
}

describe('betweenWorkerAnalysis', () => {
  test('a worker 8-fold above similar colleagues is flagged, with the reason; the colleagues are not', () => {
    const data = workers(
      1,
      [
        ['RT-011', 5, 1],
        ['RT-012', 5, 1.1],
        ['RT-013', 5, 0.9],
        ['RT-014', 5, 1.05],
        ['RT-015', 5, 8],
      ],
      1.5,
    );
    const result = betweenWorkerAnalysis(data, { oel: 5 });
    const flagged = result.workerSummaries.filter((w) => w.flagged);
    expect(flagged.map((w) => w.worker)).toEqual(['RT-015']);
    expect(flagged[0].flagReason).toMatch(/^geometric mean \d+\.\d-fold above the other workers'/);
    expect(result.flagRule).toMatch(/2-fold/);
  });

  test('with no real differences between workers nobody is flagged and the between-worker GSD is near 1', () => {
    const data = workers(2, [
      ['A', 6, 2],
      ['B', 6, 2],
      ['C', 6, 2],
      ['D', 6, 2],
    ]);
    const result = betweenWorkerAnalysis(data, { oel: 10 });
    expect(result.workerSummaries.some((w) => w.flagged)).toBe(false);
    expect(result.betweenGsd).toBeLessThan(1.5);
    expect(result.pValue).toBeGreaterThan(0.01);
  });

  test('the probability that a worker mean exceeds the OEL follows 1 − Φ[(ln OEL − μ − σw²/2)/σb] and moves with the OEL', () => {
    const data = workers(3, [
      ['A', 4, 1],
      ['B', 4, 3],
      ['C', 4, 0.5],
      ['D', 4, 2],
      ['E', 4, 6],
    ]);
    const low = betweenWorkerAnalysis(data, { oel: 1 }).probabilityWorkerMeanAboveOel!;
    const high = betweenWorkerAnalysis(data, { oel: 50 }).probabilityWorkerMeanAboveOel!;
    expect(low).toBeGreaterThan(high);
    expect(low).toBeGreaterThan(0.5);
    expect(high).toBeLessThan(0.05);
    expect(betweenWorkerAnalysis(data).probabilityWorkerMeanAboveOel).toBeNull();
  });

  test('results without a worker code and workers with one result are left out and counted; non-detects are substituted and counted', () => {
    const data: ShiftValue[] = [
      ...workers(4, [
        ['A', 3, 1],
        ['B', 3, 2],
      ]),
      { value: 1, nonDetect: false },
      { value: 1.5, nonDetect: false, worker: 'C' },
      { value: 0.2, nonDetect: true, worker: 'A' },
    ];
    const result = betweenWorkerAnalysis(data);
    expect(result.workers).toBe(2);
    expect(result.excludedResults).toBe(2);
    expect(result.nonDetectsSubstituted).toBe(1);
    expect(result.n).toBe(7);
  });

  test.each([
    [
      'fewer than 2 workers with 2 or more results',
      [
        { value: 1, nonDetect: false, worker: 'A' },
        { value: 2, nonDetect: false, worker: 'A' },
        { value: 1, nonDetect: false, worker: 'B' },
      ],
      /needs at least 2 workers with 2 or more results each, got 1/,
    ],
    [
      'identical results within every worker',
      [
        { value: 1, nonDetect: false, worker: 'A' },
        { value: 1, nonDetect: false, worker: 'A' },
        { value: 2, nonDetect: false, worker: 'B' },
        { value: 2, nonDetect: false, worker: 'B' },
      ],
      /within-worker variation cannot be estimated/,
    ],
    ['a value that is not a positive number', [{ value: 0, nonDetect: false, worker: 'A' }], /result 1: value must be a finite number > 0/],
  ] as const)('%s is refused with a RangeError naming the rule', (_name, data, message) => {
    expect(() => betweenWorkerAnalysis(data as readonly ShiftValue[])).toThrow(RangeError);
    expect(() => betweenWorkerAnalysis(data as readonly ShiftValue[])).toThrow(message);
  });
});
