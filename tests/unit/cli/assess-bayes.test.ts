/**
 * `npm run -s assess -- --bayes [--seed N]`: the `bayes` field exactly as PRODUCT.md ("Command-line
 * contracts") describes it, reproducible by seed, null for a group that cannot be assessed.
 * Source of the contract: PRODUCT.md; of the figures: stats/bayes-view.ts (checked against JAGS in
 * tests/reference/bayes-jags.test.ts). Data are invented.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { main } from '../../../backend/src/cli/assess';
import { startBayesBatch } from '../../../backend/src/cli/assess-bayes';

const folder = mkdtempSync(path.join(os.tmpdir(), 'assess-bayes-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

function run(args: string[]): { code: number; json: { groups: Record<string, unknown>[] } | null; stderr: string } {
  let stdout = '';
  let stderr = '';
  const code = main(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
  return { code, json: stdout ? JSON.parse(stdout) : null, stderr };
}

const csv = path.join(folder, 'results.csv');
writeFileSync(
  csv,
  [
    'group,value',
    ...['0.21', '0.35', '<0.1', '0.18', '0.52', '0.27', '<0.1', '0.44'].map((v) => `Cutter silica,${v}`),
    ...['81', '95', '77', '102', '88', '91'].map((v) => `Planer noise dose,${v}`),
    'Too few,1',
    'Too few,2',
  ].join('\n'),
);

describe('assess --bayes', () => {
  test('fills bayes with gm, gsd, p95, exceedanceFraction {median, lower, upper, q95} and five category probabilities', () => {
    const { code, json } = run(['--input', csv, '--oel', '1', '--bayes', '--seed', '7']);
    expect(code).toBe(0);
    const cutter = json!.groups[0] as { bayes: Record<string, unknown> };
    expect(Object.keys(cutter.bayes).sort()).toEqual(['categoryProbabilities', 'exceedanceFraction', 'gm', 'gsd', 'p95']);
    for (const key of ['gm', 'gsd', 'p95', 'exceedanceFraction']) {
      const summary = cutter.bayes[key] as Record<string, number>;
      expect(Object.keys(summary).sort()).toEqual(['lower', 'median', 'q95', 'upper']);
      expect(summary.lower).toBeLessThanOrEqual(summary.median);
      expect(summary.q95).toBeLessThanOrEqual(summary.upper);
    }
    const probabilities = cutter.bayes.categoryProbabilities as number[];
    expect(probabilities).toHaveLength(5);
    expect(Math.abs(probabilities.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(1e-12);
  });

  test('a group that cannot be assessed has bayes null and the others are still reported', () => {
    const { json } = run(['--input', csv, '--oel', '100', '--bayes']);
    const tooFew = json!.groups.find((g) => g.group === 'Too few')!;
    expect(tooFew.error).toEqual(expect.any(String));
    expect(tooFew.bayes).toBeNull();
    expect(json!.groups.find((g) => g.group === 'Planer noise dose')!.bayes).not.toBeNull();
  });

  test('the same --seed gives the same output; another seed changes only the Monte-Carlo digits', () => {
    const a = run(['--input', csv, '--oel', '1', '--bayes', '--seed', '11']).json!;
    const b = run(['--input', csv, '--oel', '1', '--bayes', '--seed', '11']).json!;
    const c = run(['--input', csv, '--oel', '1', '--bayes', '--seed', '12']).json!;
    expect(b).toEqual(a);
    const gmA = (a.groups[0].bayes as { gm: { median: number } }).gm.median;
    const gmC = (c.groups[0].bayes as { gm: { median: number } }).gm.median;
    expect(gmC).not.toBe(gmA);
    expect(Math.abs(gmC / gmA - 1)).toBeLessThan(0.01);
  });

  test('without --bayes the field is null', () => {
    const { json } = run(['--input', csv, '--oel', '1']);
    expect(json!.groups[0].bayes).toBeNull();
  });

  test('sharing groups among worker threads gives the same figures as computing them in one thread', () => {
    const jobs = [1, 2, 3, 4, 5].map((k) => ({ values: [0.1, 0.2, 0.15, 0.3, 0.12 * k].map((value) => ({ value, nonDetect: false })), oel: 1, seed: 3 }));
    const parallel = startBayesBatch(jobs, true);
    const serial = startBayesBatch(jobs, false);
    parallel.finish();
    for (let j = 0; j < jobs.length; j++) expect(parallel.take(j)).toEqual(serial.take(j));
  });
});
