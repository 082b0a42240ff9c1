/**
 * Writer for our noise log format, version 1 (PRODUCT.md, "Noise log format, version 1"): the
 * inverse of parseNoiseLog. Used by the demo generator and by tests to build files.
 */
import type { NoiseLog } from './noise-log';

/** Metadata keys in the order they are written. */
const metadataOrder = [
  ['instrument', 'instrument'],
  ['worker', 'worker'],
  ['start', 'start'],
  ['interval_s', 'intervalSeconds'],
  ['shift_hours', 'shiftHours'],
  ['calibration_reference_db', 'calibrationReferenceDb'],
  ['calibration_before_db', 'calibrationBeforeDb'],
  ['calibration_after_db', 'calibrationAfterDb'],
] as const;

/**
 * Format a log as format-v1 text: `# noise-log: 1`, the other metadata, a header with the channels
 * present (t_s, laeq_db, lcpeak_db, ax_mg, ay_mg, az_mg, apeak_mg, moving) and one row per
 * interval. Numbers are written in JavaScript's shortest round-trip form, so parsing the text
 * gives back the same values. `lineEnd` defaults to "\n".
 */
export function formatNoiseLog(log: NoiseLog, options: { lineEnd?: '\n' | '\r\n' } = {}): string {
  const lineEnd = options.lineEnd ?? '\n';
  const lines: string[] = ['# noise-log: 1'];
  for (const [key, field] of metadataOrder) {
    const value = log.metadata[field];
    if (value !== null && value !== undefined) lines.push(`# ${key}: ${value}`);
  }
  for (const [key, value] of Object.entries(log.metadata.other)) lines.push(`# ${key}: ${value}`);

  const columns: { name: string; values: ArrayLike<number> }[] = [
    { name: 't_s', values: log.tS },
    { name: 'laeq_db', values: log.laeqDb },
  ];
  if (log.lcPeakDb) columns.push({ name: 'lcpeak_db', values: log.lcPeakDb });
  if (log.acceleration) {
    columns.push({ name: 'ax_mg', values: log.acceleration.xMg });
    columns.push({ name: 'ay_mg', values: log.acceleration.yMg });
    columns.push({ name: 'az_mg', values: log.acceleration.zMg });
  }
  if (log.apeakMg) columns.push({ name: 'apeak_mg', values: log.apeakMg });
  if (log.moving) columns.push({ name: 'moving', values: log.moving });
  lines.push(columns.map((column) => column.name).join(','));
  const cells = new Array<string>(columns.length);
  for (let i = 0; i < log.length; i++) {
    for (let c = 0; c < columns.length; c++) cells[c] = String(columns[c].values[i]);
    lines.push(cells.join(','));
  }
  return lines.join(lineEnd) + lineEnd;
}
