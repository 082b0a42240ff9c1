/**
 * Test helper: build small format-v1 noise log texts by hand, so each test states its own data.
 */
import { parseNoiseLog } from '@stats/noise-log-parse';
import type { NoiseLog } from '@stats/noise-log';

export interface LogTextOptions {
  /** Metadata lines after `# noise-log: 1`, as key → value. interval_s defaults to 1. */
  metadata?: Record<string, string | number>;
  columns: string[];
  rows: (string | number)[][];
  lineEnd?: string;
}

/** Format a log text from columns and rows (no checks: tests also build broken files). */
export function logText({ metadata = {}, columns, rows, lineEnd = '\n' }: LogTextOptions): string {
  const meta = { interval_s: 1, ...metadata };
  const lines = ['# noise-log: 1', ...Object.entries(meta).map(([key, value]) => `# ${key}: ${value}`), columns.join(',')];
  for (const row of rows) lines.push(row.join(','));
  return lines.join(lineEnd) + lineEnd;
}

/** Parse a log built by {@link logText}. */
export function buildLog(options: LogTextOptions): NoiseLog {
  return parseNoiseLog(logText(options));
}

/** `count` copies of `value`. */
export function repeat<T>(value: T, count: number): T[] {
  return Array.from({ length: count }, () => value);
}
