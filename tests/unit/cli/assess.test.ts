import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../../backend/src/cli/assess';

let directory: string;
const file = (name: string, content: string) => {
  const target = path.join(directory, name);
  writeFileSync(target, content);
  return target;
};

function run(argv: string[]): { code: number; stdout: string; stderr: string } {
  let stdout = '';
  let stderr = '';
  const code = main(argv, { stdout: (text) => (stdout += text), stderr: (text) => (stderr += text) });
  return { code, stdout, stderr };
}

const CONTRACT_FIELDS = [
  'group',
  'n',
  'nCensored',
  'error',
  'gm',
  'gsd',
  'am',
  'sd',
  'p95',
  'utl95_95',
  'exceedanceFraction',
  'exceedanceFractionUcl95',
  'amMvue',
  'amUcl95',
  'shapiroWilk',
  'en689',
  'categoryByP95',
  'categoryByUtl',
  'bayes',
];

// A file of mixed good and bad groups (Ridgeback Timber Co. job titles; invented numbers).
const MIXED = [
  'group,value',
  // The published question-and-answer data (REFERENCES.md): GM 0.0552, GSD 3.04, MVUE 0.085, UTL 16.8.
  'planer feeder,0.043',
  'planer feeder,0.236',
  'planer feeder,0.057',
  'planer feeder,0.016',
  'saw filer,0.4',
  'saw filer,0.4',
  'saw filer,0.4',
  'edger operator,0.2',
  'edger operator,0.3',
  'head sawyer,0.12',
  'head sawyer,<0.05',
  'head sawyer,0.3',
  'head sawyer,0.08',
  'head sawyer,0.21',
  'head sawyer,<0.05',
  'head sawyer,0.15',
  'forklift driver,0.2',
  'forklift driver,n/a',
  'forklift driver,0.3',
  'maintenance fitter,0.2',
  'maintenance fitter,-0.1',
  'maintenance fitter,0.4',
].join('\n');

beforeAll(() => {
  directory = mkdtempSync(path.join(os.tmpdir(), 'assess-cli-'));
});
afterAll(() => rmSync(directory, { recursive: true, force: true }));

describe('assess command on a file of mixed good and bad groups', () => {
  it('prints one JSON document with every contract field for every group, in file order', () => {
    const { code, stdout, stderr } = run(['--input', file('mixed.csv', MIXED), '--oel', '0.1']);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const report = JSON.parse(stdout) as { groups: Record<string, unknown>[] };
    expect(report.groups.map((g) => g.group)).toEqual(['planer feeder', 'saw filer', 'edger operator', 'head sawyer', 'forklift driver', 'maintenance fitter']);
    for (const group of report.groups) for (const field of CONTRACT_FIELDS) expect(group, `${String(group.group)}.${field}`).toHaveProperty(field);
  });

  it('reports the published figures for a good group: GM 0.0552, GSD 3.04, MVUE 0.085, P95 0.343, UTL 16.8', () => {
    const { stdout } = run(['--input', file('mixed.csv', MIXED), '--oel', '0.1']);
    const group = (JSON.parse(stdout) as { groups: Record<string, any>[] }).groups[0];
    expect(group.error).toBeNull();
    expect(group.n).toBe(4);
    expect(group.nCensored).toBe(0);
    expect(Math.abs(group.gm - 0.0552)).toBeLessThanOrEqual(0.00005);
    expect(Math.abs(group.gsd - 3.04)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(group.amMvue - 0.085)).toBeLessThanOrEqual(0.0005);
    expect(Math.abs(group.p95 - 0.343)).toBeLessThanOrEqual(0.0005);
    expect(Math.abs(group.utl95_95 - 16.8)).toBeLessThanOrEqual(0.05);
    expect(Math.abs(group.amUcl95 / 11.6 - 1)).toBeLessThan(0.01); // see tests/reference/land.test.ts
    expect(group.en689).toEqual({ ur: null, ut: null, result: 'non-compliant' }); // 0.236 > OEL 0.1, preliminary test
    expect(group.categoryByP95).toBe(4);
    expect(group.categoryByUtl).toBe(4);
    expect(Object.keys(group.shapiroWilk)).toEqual(['w', 'p']);
    expect(group.method).toBe('complete');
    expect(group.bayes).toBeNull();
  });

  it('gives each bad group a clear error and null figures while the good groups are still reported', () => {
    const { stdout } = run(['--input', file('mixed.csv', MIXED), '--oel', '0.1']);
    const groups = (JSON.parse(stdout) as { groups: Record<string, unknown>[] }).groups;
    const byName = Object.fromEntries(groups.map((g) => [g.group, g]));
    expect(byName['saw filer'].error).toBe('all 3 values are equal (0.4) (rule: all values equal); their spread cannot be estimated');
    expect(byName['edger operator'].error).toBe('at least 3 results are needed (rule: fewer than 3 results), got 2');
    expect(byName['forklift driver'].error).toBe('row 19, column "value": expected a number > 0 or a non-detect such as <0.05, got "n/a"');
    expect(byName['maintenance fitter'].error).toBe('row 22, column "value": expected a number greater than 0, got "-0.1"');
    for (const name of ['saw filer', 'edger operator', 'forklift driver', 'maintenance fitter']) {
      for (const field of CONTRACT_FIELDS.filter((f) => f !== 'group' && f !== 'error')) expect(byName[name][field], `${name}.${field}`).toBeNull();
    }
    expect(byName['head sawyer'].error).toBeNull();
  });

  it('reads <0.05 as a non-detect at 0.05 and says the censored-data method was used', () => {
    const { stdout } = run(['--input', file('mixed.csv', MIXED), '--oel', '0.1', '--seed', '11']);
    const sawyer = (JSON.parse(stdout) as { groups: Record<string, any>[] }).groups[3];
    expect(sawyer.n).toBe(7);
    expect(sawyer.nCensored).toBe(2);
    expect(['ros', 'censored-mle']).toContain(sawyer.method);
    expect(sawyer.en689.result).toMatch(/^(compliant|non-compliant)$/);
    expect(typeof sawyer.en689.ut).toBe('number'); // 7 results: the statistical test
    // Same seed, same bootstrap limits.
    const again = (JSON.parse(run(['--input', file('mixed.csv', MIXED), '--oel', '0.1', '--seed', '11']).stdout) as { groups: Record<string, any>[] })
      .groups[3];
    expect(again.utl95_95).toBe(sawyer.utl95_95);
  });

  it('takes each group’s OEL from groups.json and --oel for the rest, and reports a group with no OEL as an error', () => {
    const groups = file('groups.json', JSON.stringify({ 'planer feeder': { oel: 50 } }));
    const withDefault = JSON.parse(run(['--input', file('mixed.csv', MIXED), '--groups', groups, '--oel', '0.1']).stdout) as { groups: Record<string, any>[] };
    expect(withDefault.groups[0].categoryByUtl).toBe(2); // UTL 16.8 is 34 % of 50
    const withoutDefault = JSON.parse(run(['--input', file('mixed.csv', MIXED), '--groups', groups]).stdout) as { groups: Record<string, any>[] };
    expect(withoutDefault.groups[0].error).toBeNull();
    expect(withoutDefault.groups[3].error).toBe('no OEL for group "head sawyer": give --oel or an entry in the groups file');
  });

  it('fills bayes only when --bayes is given, in the contract shape, and leaves it null for groups with an error', () => {
    const input = file('bayes.csv', MIXED.split('\n').slice(0, 8).join('\n')); // planer feeder (good) and saw filer (all equal)
    const without = JSON.parse(run(['--input', input, '--oel', '0.1']).stdout) as { groups: { bayes: unknown }[] };
    expect(without.groups.every((g) => g.bayes === null)).toBe(true);
    const { code, stdout } = run(['--input', input, '--oel', '0.1', '--bayes']);
    expect(code).toBe(0);
    const [good, bad] = (JSON.parse(stdout) as { groups: { bayes: Record<string, any> | null }[] }).groups;
    for (const key of ['gm', 'gsd', 'p95', 'exceedanceFraction'])
      expect(Object.keys(good.bayes?.[key] ?? {}).sort()).toEqual(['lower', 'median', 'q95', 'upper']);
    expect(good.bayes?.categoryProbabilities).toHaveLength(5);
    expect(bad.bayes).toBeNull();
  }, 60_000);
});

describe('assess command errors', () => {
  it('exits with code 2 and the usage on stderr for bad usage', () => {
    for (const argv of [
      [],
      ['--oel', '1'],
      ['--input', 'x.csv', '--oel', 'abc'],
      ['--input', 'x.csv', '--oel', '1', '--seed', '0'],
      ['--input', 'x.csv'],
      ['--nope'],
    ]) {
      const { code, stdout, stderr } = run(argv);
      expect(code, argv.join(' ')).toBe(2);
      expect(stdout).toBe('');
      expect(stderr).toMatch(/^assess: .+\nusage: npm run -s assess -- --input FILE.csv/);
    }
  });

  it('exits with code 1 naming the file when it cannot be read', () => {
    const missing = path.join(directory, 'missing.csv');
    const { code, stderr } = run(['--input', missing, '--oel', '1']);
    expect(code).toBe(1);
    expect(stderr).toBe(`assess: ${missing}: cannot read the results file (ENOENT)\n`);
  });

  it('exits with code 1 naming the file, row and column for a malformed row', () => {
    const extraField = file('comma.csv', 'group,value\nhead sawyer,0.2\nhead sawyer,0,5\n');
    expect(run(['--input', extraField, '--oel', '1']).stderr).toBe(
      `assess: ${extraField}: row 3: 3 fields but the header has 2 (a decimal comma? write 0.5, not 0,5)\n`,
    );
    const noGroup = file('nogroup.csv', 'group,value\n,0.2\n');
    const result = run(['--input', noGroup, '--oel', '1']);
    expect(result.code).toBe(1);
    expect(result.stderr).toBe(`assess: ${noGroup}: row 2, column "group": empty group name\n`);
    const badHeader = file('header.csv', 'name,result\na,1\n');
    expect(run(['--input', badHeader, '--oel', '1']).stderr).toMatch(/row 1 \(header\): no "group" and "value" column/);
    const badGroups = file('bad-groups.json', '{"head sawyer": {"oel": "ten"}}');
    expect(run(['--input', extraField, '--groups', badGroups]).stderr).toBe(
      `assess: ${badGroups}: group "head sawyer", field "oel": expected a number > 0, got "ten"\n`,
    );
  });
});

describe('assess command as a child process (npm run -s assess, the contract in PRODUCT.md)', () => {
  const npmAssess = (argv: string[]) => spawnSync('npm', ['run', '-s', 'assess', '--', ...argv], { encoding: 'utf8' });

  it('prints the JSON document and exits 0; bad usage exits 2', () => {
    const input = file('process.csv', 'group,value\ncutter,0.02\ncutter,0.05\ncutter,0.03\ncutter,0.04\n');
    const ok = npmAssess(['--input', input, '--oel', '0.05']);
    expect(ok.status).toBe(0);
    const report = JSON.parse(ok.stdout) as { groups: { group: string; n: number; categoryByP95: number }[] };
    expect(report.groups[0]).toMatchObject({ group: 'cutter', n: 4 });
    const bad = npmAssess(['--oel', '1']);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--input FILE.csv is required/);
  }, 120_000);

  it('with --bayes and enough groups for worker threads, prints exactly what the in-process command prints', () => {
    // Four or more groups start worker threads from the prebuilt bundle (dist/cli/assessment-worker.mjs);
    // each group's chains are seeded from --seed alone, so the thread that computed a group cannot show.
    const rows = ['group,value'];
    for (const [group, scale] of [
      ['cutter', 0.02],
      ['polisher', 0.05],
      ['installer', 0.01],
      ['saw filer', 0.03],
    ] as const) {
      for (let i = 0; i < 8; i++) rows.push(i === 0 ? `${group},<${scale}` : `${group},${(scale * (1 + ((i * 37) % 11) / 5)).toFixed(4)}`);
    }
    const input = file('threads.csv', rows.join('\n') + '\n');
    const argv = ['--input', input, '--oel', '0.1', '--bayes', '--seed', '7'];
    const child = npmAssess(argv);
    expect(child.stderr).toBe('');
    expect(child.status).toBe(0);
    const inProcess = run(argv);
    expect(inProcess.code).toBe(0);
    expect(JSON.parse(child.stdout)).toEqual(JSON.parse(inProcess.stdout));
    expect((JSON.parse(child.stdout) as { groups: { bayes: unknown }[] }).groups.every((g) => g.bayes !== null)).toBe(true);
  }, 120_000);
});
