/**
 * `npm run -s noise` (PRODUCT.md, "Command-line contracts"): the printed document, masks.json,
 * option overrides, and errors on stderr with exit codes 1 (bad file) and 2 (bad usage).
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { main } from '../../../backend/src/cli/noise';
import { analyzeNoiseLog, noiseCliReport } from '@stats/noise-analyze';
import { generateNoiseDemoLog } from '@stats/noise-demo';
import { parseNoiseLog } from '@stats/noise-log-parse';

let folder: string;
let logFile: string;
let demoText: string;

function write(name: string, content: string): string {
  const file = path.join(folder, name);
  writeFileSync(file, content);
  return file;
}

function run(args: string[]) {
  let stdout = '';
  let stderr = '';
  const code = main(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
  return { code, stdout, stderr };
}

beforeAll(() => {
  folder = mkdtempSync(path.join(os.tmpdir(), 'noise-cli-'));
  demoText = generateNoiseDemoLog({ seed: 77, hours: 8, benchMinutes: 20, knockCount: 3 }).text;
  logFile = write('shift.csv', demoText);
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('printing the figures', () => {
  test('without masks.json the document matches the analysis of the file, proposed masks applied', () => {
    const { code, stdout, stderr } = run(['--input', logFile]);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const printed = JSON.parse(stdout);
    expect(printed).toEqual(JSON.parse(JSON.stringify(noiseCliReport(analyzeNoiseLog(parseNoiseLog(demoText))))));
    expect(printed.knocks).toHaveLength(3);
    expect(printed.stillStretches).toHaveLength(1);
    expect(printed.maskedSeconds).toBeGreaterThan(0);
  });

  test('numbers are printed at full precision (they parse back to the computed doubles)', () => {
    const printed = JSON.parse(run(['--input', logFile]).stdout);
    const computed = analyzeNoiseLog(parseNoiseLog(demoText));
    expect(printed.asLogged.nioshRel.dose).toBe(computed.asLogged.nioshRel.dose);
    expect(printed.reviewed.iso.lex8h).toBe(computed.reviewed.iso.lex8h);
  });

  test('masks.json replaces the proposed masks for the reviewed figures', () => {
    const masksFile = write(
      'masks.json',
      JSON.stringify([
        { startS: 0, endS: 3600 },
        { startS: 1800, endS: 5400, reason: 'left in the office' },
      ]),
    );
    const { code, stdout } = run(['--input', logFile, '--masks', masksFile]);
    expect(code).toBe(0);
    const printed = JSON.parse(stdout);
    expect(printed.maskedSeconds).toBe(5400); // overlapping masks counted once
    expect(printed.proposedMasks).toHaveLength(3); // still listed as proposals
    const expected = analyzeNoiseLog(parseNoiseLog(demoText), {
      masks: [
        { startS: 0, endS: 3600 },
        { startS: 1800, endS: 5400 },
      ],
    });
    expect(printed.reviewed).toEqual(expected.reviewed);
    const empty = JSON.parse(run(['--input', logFile, '--masks', write('none.json', '[]')]).stdout);
    expect(empty.reviewed).toEqual(empty.asLogged);
  });

  test('--shift-hours overrides the file and changes only LEX,8h', () => {
    const file = JSON.parse(run(['--input', logFile]).stdout);
    const option = JSON.parse(run(['--input', logFile, '--shift-hours', '12']).stdout);
    expect(option.asLogged.oshaPel).toEqual(file.asLogged.oshaPel);
    // The file says shift_hours 8: LEX rises by 10·lg(12/8) (ISO 9612:2009).
    expect(option.asLogged.iso.lex8h - file.asLogged.iso.lex8h).toBeCloseTo(10 * Math.log10(12 / 8), 12);
  });

  test('--still-minutes and --knock-mg change the wear check', () => {
    const strict = JSON.parse(run(['--input', logFile, '--still-minutes', '30']).stdout);
    expect(strict.stillStretches).toEqual([]); // the 20 min bench is under 30 min
    const high = JSON.parse(run(['--input', logFile, '--knock-mg', '1000000']).stdout);
    expect(high.knocks).toEqual([]);
    expect(high.maskedSeconds).toBe(0);
  });
});

describe('errors', () => {
  test('a malformed log exits 1 with the file, row and column on stderr and nothing on stdout', () => {
    const bad = write('bad.csv', demoText.replace('\n3,', '\n3x,'));
    const { code, stdout, stderr } = run(['--input', bad]);
    expect(code).toBe(1);
    expect(stdout).toBe('');
    expect(stderr).toMatch(/^noise: .*bad\.csv: row 16, column "t_s": expected a number, got "3x"/);
  });

  test('a missing file exits 1 naming it', () => {
    const { code, stderr } = run(['--input', path.join(folder, 'nope.csv')]);
    expect(code).toBe(1);
    expect(stderr).toMatch(/nope\.csv: cannot read the noise log \(ENOENT\)/);
  });

  test.each([
    ['not JSON', '[{', /masks\.json: not valid JSON/],
    ['not an array', '{"startS": 1, "endS": 2}', /expected a JSON array/],
    ['a text time', '[{"startS": 1, "endS": 2}, {"startS": "1 min", "endS": 120}]', /entry 2, field "startS": expected a number of seconds/],
    ['an end before the start', '[{"startS": 10, "endS": 5}]', /entry 1, field "endS": must be greater than startS \(10\), got 5/],
  ])('a masks.json that is %s exits 1 naming the entry', (_name, content, message) => {
    const { code, stderr } = run(['--input', logFile, '--masks', write('masks.json', content)]);
    expect(code).toBe(1);
    expect(stderr).toMatch(message);
  });

  test.each([
    [[], /--input LOG\.csv is required/],
    [['--input'], /argument missing|--input/],
    [['--input', 'x.csv', '--colour', 'red'], /Unknown option '--colour'/],
    [['--input', 'x.csv', '--shift-hours', 'ten'], /--shift-hours must be a number of hours > 0 and ≤ 24, got "ten"/],
    [['--input', 'x.csv', '--shift-hours', '30'], /--shift-hours must be/],
    [['--input', 'x.csv', '--still-minutes', '0'], /--still-minutes must be/],
    [['--input', 'x.csv', '--knock-mg=-5'], /--knock-mg must be a number of mg > 0, got "-5"/],
    [['x.csv'], /positional/],
  ])('usage error %j exits 2 with the usage line', (args, message) => {
    const { code, stderr, stdout } = run(args);
    expect(code).toBe(2);
    expect(stdout).toBe('');
    expect(stderr).toMatch(message);
    expect(stderr).toContain('usage: npm run -s noise -- --input LOG.csv');
  });
});

describe('as a child process (npm run -s noise, the contract in PRODUCT.md)', () => {
  const exec = promisify(execFile);

  test('prints the same document as main and exits 0', async () => {
    const { stdout } = await exec('npm', ['run', '-s', 'noise', '--', '--input', logFile], { cwd: path.resolve(__dirname, '../../..') });
    expect(JSON.parse(stdout)).toEqual(JSON.parse(run(['--input', logFile]).stdout));
  }, 60_000);

  test('exits 1 with the error on stderr for a truncated file', async () => {
    const truncated = write('truncated.csv', demoText.slice(0, demoText.lastIndexOf(',')));
    const failure = await exec('npm', ['run', '-s', 'noise', '--', '--input', truncated], { cwd: path.resolve(__dirname, '../../..') }).then(
      () => null,
      (error: { code: number; stderr: string; stdout: string }) => error,
    );
    expect(failure).not.toBeNull();
    expect(failure!.code).toBe(1);
    expect(failure!.stdout).toBe('');
    expect(failure!.stderr).toMatch(/truncated\.csv: row \d+, column "apeak_mg": the last row is cut short/);
  }, 60_000);
});
