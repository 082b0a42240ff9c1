/**
 * What the command lines (`assess`, `noise`) share: where they write, their two error kinds and
 * exit codes (2 for bad usage, 1 for a bad input file), number options and file reading.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/** Where a command writes; tests pass their own. */
export interface CliOutput {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
}

export const processOutput: CliOutput = {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
};

/** A problem with the command line itself (exit code 2). */
export class UsageError extends Error {}
/** A problem with an input file (exit code 1); the message names the file (and row and column). */
export class InputError extends Error {}

const numberPattern = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** Parse an optional numeric option; `rule` says what was expected, e.g. "a number greater than 0". */
export function numberOption(name: string, text: string | undefined, check: (value: number) => boolean, rule: string): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text);
  if (!numberPattern.test(text.trim()) || !check(value)) throw new UsageError(`--${name} must be ${rule}, got "${text}"`);
  return value;
}

/** Read a UTF-8 text file or throw an InputError naming the file and what it was for. */
export function readTextFile(file: string, what: string): string {
  try {
    return readFileSync(file, 'utf8');
  } catch (error) {
    throw new InputError(`${file}: cannot read the ${what} (${(error as NodeJS.ErrnoException).code ?? String(error)})`);
  }
}

/** Parse JSON text or throw an InputError naming the file. */
export function parseJsonFile(text: string, file: string): unknown {
  try {
    return JSON.parse(text);
  } catch (error) {
    throw new InputError(`${file}: not valid JSON (${(error as Error).message})`);
  }
}

/**
 * Run a command body and turn its errors into messages and exit codes:
 * UsageError → message and usage on stderr, 2; InputError → message, 1; anything else → 1.
 */
export function runCommand(name: string, usage: string, output: CliOutput, body: () => number): number {
  try {
    return body();
  } catch (error) {
    if (error instanceof UsageError) {
      output.stderr(`${name}: ${error.message}\n${usage}\n`);
      return 2;
    }
    if (error instanceof InputError) {
      output.stderr(`${name}: ${error.message}\n`);
      return 1;
    }
    output.stderr(`${name}: unexpected error: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
    return 1;
  }
}

/** Whether the module at `moduleUrl` is the script node was started with. */
export function isInvokedDirectly(moduleUrl: string): boolean {
  return process.argv[1] !== undefined && path.resolve(process.argv[1]) === fileURLToPath(moduleUrl);
}
