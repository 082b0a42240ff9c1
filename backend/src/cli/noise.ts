/**
 * `npm run -s noise -- --input LOG.csv [--masks masks.json] [--shift-hours H] [--still-minutes M] [--knock-mg G]`
 *
 * Reads a noise log in our format version 1 and prints one JSON document with the figures defined
 * in PRODUCT.md ("Command-line contracts"), at full precision. masks.json (`[{"startS","endS"}]`)
 * replaces the proposed masks for the reviewed figures; --shift-hours overrides the file's
 * shift_hours (LEX,8h only). Errors go to stderr naming the file, row and column: exit code 1 for
 * bad files, 2 for bad usage.
 */
import { readFileSync, statSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { analyzeNoiseLog, noiseCliReport } from '@stats/noise-analyze';
import type { NoiseMaskSpan } from '@stats/noise-exposure';
import { defaultNoiseLogMaxBytes } from '@stats/noise-log';
import { checkNoiseLogSize, decodeNoiseLogBytes, NoiseLogError, parseNoiseLog } from '@stats/noise-log-parse';
import type { NoiseSettings } from '@stats/noise-settings';
import { InputError, isInvokedDirectly, numberOption, parseJsonFile, processOutput, readTextFile, runCommand, UsageError, type CliOutput } from './cli-support';

export const usage = 'usage: npm run -s noise -- --input LOG.csv [--masks masks.json] [--shift-hours H] [--still-minutes M] [--knock-mg G]';

function readMasks(file: string): NoiseMaskSpan[] {
  const data = parseJsonFile(readTextFile(file, 'masks file'), file);
  if (!Array.isArray(data)) throw new InputError(`${file}: expected a JSON array of {"startS","endS"} objects`);
  return data.map((entry: unknown, index) => {
    const where = `${file}: entry ${index + 1}`;
    if (typeof entry !== 'object' || entry === null || Array.isArray(entry)) {
      throw new InputError(`${where}: expected an object {"startS","endS"}`);
    }
    const { startS, endS, reason } = entry as Record<string, unknown>;
    for (const [key, value] of [
      ['startS', startS],
      ['endS', endS],
    ] as const) {
      if (typeof value !== 'number' || !Number.isFinite(value)) {
        throw new InputError(`${where}, field "${key}": expected a number of seconds from the log start, got ${JSON.stringify(value)}`);
      }
    }
    if (!((endS as number) > (startS as number))) {
      throw new InputError(`${where}, field "endS": must be greater than startS (${String(startS)}), got ${String(endS)}`);
    }
    return { startS: startS as number, endS: endS as number, ...(typeof reason === 'string' ? { reason } : {}) };
  });
}

function readLog(file: string) {
  let size: number;
  try {
    const stats = statSync(file);
    if (!stats.isFile()) throw new InputError(`${file}: not a file`);
    size = stats.size;
  } catch (error) {
    if (error instanceof InputError) throw error;
    throw new InputError(`${file}: cannot read the noise log (${(error as NodeJS.ErrnoException).code ?? String(error)})`);
  }
  try {
    // Check the size before reading so an oversized file is never loaded.
    checkNoiseLogSize(size, defaultNoiseLogMaxBytes);
    return parseNoiseLog(decodeNoiseLogBytes(readFileSync(file)));
  } catch (error) {
    if (error instanceof NoiseLogError) throw new InputError(`${file}: ${error.message}`);
    throw error;
  }
}

/** Run the command with `argv` (arguments after the script name); returns the exit code. */
export function main(argv: readonly string[], output: CliOutput = processOutput): number {
  return runCommand('noise', usage, output, () => {
    let values: Record<string, string | boolean | undefined>;
    try {
      ({ values } = parseArgs({
        args: [...argv],
        strict: true,
        allowPositionals: false,
        options: {
          input: { type: 'string' },
          masks: { type: 'string' },
          'shift-hours': { type: 'string' },
          'still-minutes': { type: 'string' },
          'knock-mg': { type: 'string' },
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
    if (!input) throw new UsageError('--input LOG.csv is required');
    const shiftHours = numberOption('shift-hours', values['shift-hours'] as string | undefined, (v) => v > 0 && v <= 24, 'a number of hours > 0 and ≤ 24');
    const stillMinutes = numberOption(
      'still-minutes',
      values['still-minutes'] as string | undefined,
      (v) => v > 0 && v <= 1440,
      'a number of minutes > 0 and ≤ 1440',
    );
    const knockMg = numberOption('knock-mg', values['knock-mg'] as string | undefined, (v) => v > 0 && v <= 1_000_000, 'a number of mg > 0');
    const masksFile = values.masks as string | undefined;

    const log = readLog(input);
    const masks = masksFile === undefined ? undefined : readMasks(masksFile);
    const settings: Partial<NoiseSettings> = {
      ...(stillMinutes === undefined ? {} : { stillMinutes }),
      ...(knockMg === undefined ? {} : { knockThresholdMg: knockMg }),
    };
    const analysis = analyzeNoiseLog(log, { settings, masks, shiftHours });
    output.stdout(`${JSON.stringify(noiseCliReport(analysis), null, 2)}\n`);
    return 0;
  });
}

if (isInvokedDirectly(import.meta.url)) process.exitCode = main(process.argv.slice(2));
