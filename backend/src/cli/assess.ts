/**
 * `npm run -s assess -- --input FILE.csv [--groups groups.json] [--oel N] [--bayes] [--seed N]`
 *
 * Reads shift results (CSV with the header `group,value`; `<0.05` is a non-detect with detection
 * limit 0.05), assesses every exposure group with the classical engine (stats/assess-group.ts) and
 * prints one JSON document with the fields of PRODUCT.md ("Command-line contracts"), at full
 * precision. groups.json maps a group name to `{ "oel": N }` (optionally `"actionLevel": N`); --oel
 * is the OEL of every group not in it. A group that cannot be assessed gets `error` and null
 * figures; the others are still reported. Bad usage: message on stderr, exit code 2. An unreadable
 * file or a malformed row: message naming the file, row and column on stderr, exit code 1.
 */
import { parseArgs } from 'node:util';
import Papa from 'papaparse';
import { assessMany, DEFAULT_ASSESSMENT_SEED, type NamedGroupInput } from '@stats/assess-group';
import type { ShiftValue } from '@stats/types';
import { errorReportOf, refusalRule, reportOf, type AssessGroupReport } from '../services/assessment-engine';
import { startBayesBatch } from './assess-bayes';
import { InputError, isInvokedDirectly, numberOption, parseJsonFile, processOutput, readTextFile, runCommand, UsageError, type CliOutput } from './cli-support';

export type { CliOutput } from './cli-support';
const numberPattern = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

export const usage = 'usage: npm run -s assess -- --input FILE.csv [--groups groups.json] [--oel N] [--bayes] [--seed N]';

export type { AssessBayesFigures } from './assess-bayes';
// The report's shape and mapping are shared with the assessment API (services/assessment-engine.ts).
export type { AssessGroupReport } from '../services/assessment-engine';

/** A group as read from the CSV: its results, or the first bad value found with its row. */
interface ParsedGroup {
  name: string;
  values: ShiftValue[];
  valueError: string | null;
}

function parseValue(text: string, row: number): ShiftValue | string {
  const where = `row ${row}, column "value"`;
  const trimmed = text.trim();
  if (trimmed === '') return `${where}: empty; expected a number > 0 or a non-detect such as <0.05`;
  const nonDetect = trimmed.startsWith('<');
  const numberText = nonDetect ? trimmed.slice(1).trim() : trimmed;
  if (!numberPattern.test(numberText)) {
    return nonDetect
      ? `${where}: a non-detect needs its detection limit as a number, e.g. <0.05; got "${text}"`
      : `${where}: expected a number > 0 or a non-detect such as <0.05, got "${text}"`;
  }
  const value = Number(numberText);
  if (!(value > 0) || !Number.isFinite(value)) return `${where}: expected a number greater than 0, got "${text}"`;
  return { value, nonDetect };
}

/** Parse the CSV text into groups in order of first appearance. Throws InputError for a malformed file. */
export function parseAssessCsv(text: string, file: string): ParsedGroup[] {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { header: false, skipEmptyLines: 'greedy', delimiter: ',' });
  const fatal = parsed.errors.find((e) => e.type === 'Quotes');
  if (fatal) throw new InputError(`${file}: row ${(fatal.row ?? 0) + 1}: ${fatal.message}`);
  const rows = parsed.data;
  if (rows.length === 0) throw new InputError(`${file}: the file is empty; expected the header group,value`);
  const header = rows[0].map((cell) => cell.trim().toLowerCase());
  const groupColumn = header.indexOf('group');
  const valueColumn = header.indexOf('value');
  if (groupColumn < 0 || valueColumn < 0) {
    const missing = [groupColumn < 0 ? '"group"' : null, valueColumn < 0 ? '"value"' : null].filter(Boolean).join(' and ');
    throw new InputError(`${file}: row 1 (header): no ${missing} column; expected the header group,value, got "${rows[0].join(',')}"`);
  }
  if (rows.length === 1) throw new InputError(`${file}: no data rows after the header`);
  const groups = new Map<string, ParsedGroup>();
  for (let i = 1; i < rows.length; i++) {
    const row = i + 1;
    const cells = rows[i];
    if (cells.length !== header.length) {
      throw new InputError(
        `${file}: row ${row}: ${cells.length} field${cells.length === 1 ? '' : 's'} but the header has ${header.length}` +
          (cells.length > header.length ? ' (a decimal comma? write 0.5, not 0,5)' : ''),
      );
    }
    const name = cells[groupColumn].trim();
    if (name === '') throw new InputError(`${file}: row ${row}, column "group": empty group name`);
    let group = groups.get(name);
    if (!group) {
      group = { name, values: [], valueError: null };
      groups.set(name, group);
    }
    const value = parseValue(cells[valueColumn], row);
    if (typeof value === 'string') group.valueError ??= value;
    else group.values.push(value);
  }
  return [...groups.values()];
}

interface GroupLimits {
  oel: number;
  actionLevel?: number;
}

/** Read groups.json: `{ "<group>": { "oel": N, "actionLevel"?: N } }`. */
export function parseGroupsJson(text: string, file: string): Map<string, GroupLimits> {
  const data = parseJsonFile(text, file);
  if (typeof data !== 'object' || data === null || Array.isArray(data)) {
    throw new InputError(`${file}: expected an object mapping each group to {"oel": N}`);
  }
  const limits = new Map<string, GroupLimits>();
  for (const [group, entry] of Object.entries(data as Record<string, unknown>)) {
    if (typeof entry !== 'object' || entry === null || Array.isArray(entry)) {
      throw new InputError(`${file}: group "${group}": expected an object {"oel": N}`);
    }
    const { oel, actionLevel } = entry as Record<string, unknown>;
    if (typeof oel !== 'number' || !Number.isFinite(oel) || oel <= 0) {
      throw new InputError(`${file}: group "${group}", field "oel": expected a number > 0, got ${JSON.stringify(oel)}`);
    }
    if (actionLevel !== undefined && (typeof actionLevel !== 'number' || !Number.isFinite(actionLevel) || actionLevel <= 0)) {
      throw new InputError(`${file}: group "${group}", field "actionLevel": expected a number > 0, got ${JSON.stringify(actionLevel)}`);
    }
    limits.set(group, { oel, ...(actionLevel === undefined ? {} : { actionLevel: actionLevel as number }) });
  }
  return limits;
}

export interface AssessOptions {
  oel?: number;
  groupLimits: Map<string, GroupLimits>;
  bayes: boolean;
  seed: number;
  /** Share the Bayesian view among worker threads (the command run directly); in-process otherwise. */
  bayesWorkers?: boolean;
}

/** Assess parsed groups; a group that cannot be assessed gets its error and null figures. */
export function assessParsedGroups(groups: readonly ParsedGroup[], options: AssessOptions): AssessGroupReport[] {
  const reports = new Map<string, AssessGroupReport>();
  const inputs: NamedGroupInput[] = [];
  for (const group of groups) {
    if (group.valueError !== null) {
      reports.set(group.name, errorReportOf(group.name, group.valueError));
      continue;
    }
    const limits = options.groupLimits.get(group.name) ?? (options.oel === undefined ? undefined : { oel: options.oel });
    if (!limits) {
      reports.set(group.name, errorReportOf(group.name, `no OEL for group "${group.name}": give --oel or an entry in the groups file`));
      continue;
    }
    inputs.push({ group: group.name, values: group.values, ...limits, seed: options.seed });
  }
  // --bayes (assess-bayes.ts): started before the classical figures so worker threads run alongside them.
  const bayesIndex = new Map(inputs.map((input, index) => [input.group, index]));
  const bayesBatch = options.bayes
    ? startBayesBatch(
        inputs.map((input) => ({ values: input.values, oel: input.oel, seed: options.seed })),
        options.bayesWorkers === true,
      )
    : null;
  for (const result of assessMany(inputs)) {
    if (result.error !== null) {
      // The engine names itself in its messages; the command reports the rule alone.
      reports.set(result.group, errorReportOf(result.group, refusalRule(result.error)));
    } else {
      const bayes = bayesBatch ? bayesBatch.take(bayesIndex.get(result.group) as number) : null;
      reports.set(result.group, reportOf(result.group, result.assessment, bayes));
    }
  }
  return groups.map((group) => reports.get(group.name) as AssessGroupReport);
}

/** Run the command with `argv` (arguments after the script name); returns the exit code. */
export function main(argv: readonly string[], output: CliOutput = processOutput, options: { bayesWorkers?: boolean } = {}): number {
  return runCommand('assess', usage, output, () => {
    let values: Record<string, string | boolean | undefined>;
    try {
      ({ values } = parseArgs({
        args: [...argv],
        strict: true,
        allowPositionals: false,
        options: {
          input: { type: 'string' },
          groups: { type: 'string' },
          oel: { type: 'string' },
          bayes: { type: 'boolean' },
          seed: { type: 'string' },
          help: { type: 'boolean', short: 'h' },
        },
      }));
    } catch (error) {
      throw new UsageError((error as Error).message);
    }
    if (values.help) {
      output.stdout(`${usage}\n`);
      return 0;
    }
    const input = values.input as string | undefined;
    if (!input) throw new UsageError('--input FILE.csv is required');
    const oel = numberOption('oel', values.oel as string | undefined, (v) => v > 0 && Number.isFinite(v), 'a number greater than 0');
    const seed =
      numberOption('seed', values.seed as string | undefined, (v) => Number.isInteger(v) && v >= 1 && v <= 4294967295, 'an integer from 1 to 4294967295') ??
      DEFAULT_ASSESSMENT_SEED;
    const groupsFile = values.groups as string | undefined;
    const groupLimits = groupsFile === undefined ? new Map<string, GroupLimits>() : parseGroupsJson(readTextFile(groupsFile, 'groups file'), groupsFile);
    if (groupsFile === undefined && oel === undefined) throw new UsageError('give --oel N, --groups groups.json, or both');

    const groups = parseAssessCsv(readTextFile(input, 'results file'), input);
    const bayes = values.bayes === true;
    const reports = assessParsedGroups(groups, { oel, groupLimits, bayes, seed, bayesWorkers: options.bayesWorkers });
    output.stdout(`${JSON.stringify({ groups: reports }, null, 2)}\n`);
    return 0;
  });
}

if (isInvokedDirectly(import.meta.url)) process.exitCode = main(process.argv.slice(2), processOutput, { bayesWorkers: true });
