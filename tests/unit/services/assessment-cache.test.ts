import { afterEach, describe, expect, it } from 'vitest';
import type { AssessmentSettings } from '@schema/assessment';
import { assessmentDataHash, canonicalJson, createAssessmentEngine, type AssessmentEngine } from '../../../backend/src/services/assessment';

// The assessment's data hash and its in-memory LRU cache (docs/decisions/014). No worker thread is
// started here: the cache is exercised with computations of our own.

const settings: AssessmentSettings = {
  seed: 1,
  prior: 'reference',
  unacceptableThreshold: 0.3,
  unacceptableThresholdSource: 'default',
  mcmc: { chains: 4, burnIn: 5000, kept: 25000 },
  planner: { maxAdditional: 12, simulations: 2000, targetProbability: 0.8 },
};
const result = (id: number, value: number) => ({ id, workerCode: 'RT-001', date: `2024-09-0${id}`, value, nonDetect: false, source: 'entered' as const });

let engine: AssessmentEngine | undefined;
afterEach(async () => {
  await engine?.close();
  engine = undefined;
});

describe('canonical JSON and the data hash', () => {
  it('writes object keys in sorted order at every level, so key order never changes the text', () => {
    expect(canonicalJson({ b: 1, a: { d: [1, { f: 2, e: 3 }], c: null } })).toBe('{"a":{"c":null,"d":[1,{"e":3,"f":2}]},"b":1}');
    expect(canonicalJson({ a: 1, b: 2 })).toBe(canonicalJson({ b: 2, a: 1 }));
  });

  it('the hash ignores result ids but changes with a value, the OEL or a setting', () => {
    const base = assessmentDataHash({ results: [result(1, 0.5), result(2, 0.7)], oel: 1, actionLevel: null, settings });
    expect(base).toMatch(/^[0-9a-f]{64}$/);
    expect(
      assessmentDataHash({
        results: [
          { ...result(1, 0.5), id: 91 },
          { ...result(2, 0.7), id: 92 },
        ],
        oel: 1,
        actionLevel: null,
        settings,
      }),
    ).toBe(base);
    expect(assessmentDataHash({ results: [result(1, 0.5), result(2, 0.71)], oel: 1, actionLevel: null, settings })).not.toBe(base);
    expect(assessmentDataHash({ results: [result(1, 0.5), result(2, 0.7)], oel: 2, actionLevel: null, settings })).not.toBe(base);
    expect(
      assessmentDataHash({ results: [result(1, 0.5), result(2, 0.7)], oel: 1, actionLevel: null, settings: { ...settings, prior: 'gsd-informative' } }),
    ).not.toBe(base);
  });
});

describe('the assessment cache', () => {
  const figures = (label: string) => Promise.resolve({ refusal: label, descriptive: null, milliseconds: 1 });

  it('returns the same promise for the same hash, computes once, and says whether it was cached', async () => {
    engine = createAssessmentEngine();
    let runs = 0;
    const first = engine.figures('h1', () => (runs++, figures('a')));
    const second = engine.figures('h1', () => (runs++, figures('b')));
    expect(first.cached).toBe(false);
    expect(second.cached).toBe(true);
    expect(second.result).toBe(first.result);
    expect(runs).toBe(1);
    expect((await second.result).refusal).toBe('a');
  });

  it('drops the least recently used entry beyond its capacity', () => {
    engine = createAssessmentEngine({ cacheEntries: 2 });
    engine.figures('a', () => figures('a'));
    engine.figures('b', () => figures('b'));
    engine.figures('a', () => figures('a again')); // a is now the most recently used
    engine.figures('c', () => figures('c')); // b goes
    expect(engine.cacheSize()).toBe(2);
    expect(engine.figures('a', () => figures('x')).cached).toBe(true);
    expect(engine.figures('b', () => figures('x')).cached).toBe(false);
  });

  it('does not keep a computation that failed, so the next request tries again', async () => {
    engine = createAssessmentEngine();
    const failed = engine.figures('h', () => Promise.reject(new Error('thread stopped')));
    await expect(failed.result).rejects.toThrow('thread stopped');
    expect(engine.figures('h', () => figures('ok')).cached).toBe(false);
  });
});
