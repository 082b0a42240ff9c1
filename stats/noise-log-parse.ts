/**
 * Reader for our noise log format, version 1 (PRODUCT.md, "Noise log format, version 1").
 *
 * Two ways in:
 * - {@link parseNoiseLog}(text): the whole file as a string (CLI, tests).
 * - {@link NoiseLogReader}: rows pushed one at a time, so a streaming papaparse reader (`step` or
 *   `chunk` callback, `delimiter: ','`, `skipEmptyLines: false`) on the server or in the browser
 *   can feed it while the file arrives, then call `finish()`.
 *
 * Every problem is a {@link NoiseLogError} naming the file line (1-based) and the column or
 * metadata key. Choices (see docs/decisions/004-noise-log-computation.md): a UTF-8 byte-order mark
 * is accepted and ignored; UTF-16 is rejected; blank lines are ignored; the size limit defaults to
 * 50 MB; values outside physical ranges are rejected as "out of range" (usually wrong units).
 */
import Papa from 'papaparse';
import { defaultNoiseLogMaxBytes, noiseLogLimits, noiseLogTimeToleranceSeconds, type NoiseLog, type NoiseLogMetadata } from './noise-log';

/** A problem in a noise log file, with where it is. */
export class NoiseLogError extends Error {
  override readonly name = 'NoiseLogError';
  /** 1-based line number in the file, or null for whole-file problems (empty, too large). */
  readonly row: number | null;
  /** CSV column name the problem is in, or null. */
  readonly column: string | null;
  /** Metadata key (`# key: value` line) the problem is in, or null. */
  readonly metadataKey: string | null;
  /** The message without the location prefix. */
  readonly detail: string;

  constructor(detail: string, where: { row?: number | null; column?: string | null; metadataKey?: string | null } = {}) {
    const row = where.row ?? null;
    const column = where.column ?? null;
    const metadataKey = where.metadataKey ?? null;
    const location = [
      row === null ? null : `row ${row}`,
      column === null ? null : `column "${column}"`,
      metadataKey === null ? null : `metadata "${metadataKey}"`,
    ]
      .filter((part) => part !== null)
      .join(', ');
    super(location ? `${location}: ${detail}` : detail);
    this.row = row;
    this.column = column;
    this.metadataKey = metadataKey;
    this.detail = detail;
  }
}

/** Options for reading a noise log. */
export interface NoiseLogReadOptions {
  /** Largest accepted file, bytes. Default {@link defaultNoiseLogMaxBytes} (50 MB). */
  maxBytes?: number;
}

type ColumnName = 't_s' | 'laeq_db' | 'lcpeak_db' | 'ax_mg' | 'ay_mg' | 'az_mg' | 'apeak_mg' | 'moving';
const knownColumns: readonly ColumnName[] = ['t_s', 'laeq_db', 'lcpeak_db', 'ax_mg', 'ay_mg', 'az_mg', 'apeak_mg', 'moving'];
const accelerationColumns: readonly ColumnName[] = ['ax_mg', 'ay_mg', 'az_mg'];

const columnRules: Record<Exclude<ColumnName, 'moving'>, { min: number; max: number; unit: string }> = {
  t_s: { ...noiseLogLimits.tS, unit: 's' },
  laeq_db: { ...noiseLogLimits.laeqDb, unit: 'dB' },
  lcpeak_db: { ...noiseLogLimits.lcPeakDb, unit: 'dB' },
  ax_mg: { ...noiseLogLimits.accelerationMg, unit: 'mg' },
  ay_mg: { ...noiseLogLimits.accelerationMg, unit: 'mg' },
  az_mg: { ...noiseLogLimits.accelerationMg, unit: 'mg' },
  apeak_mg: { ...noiseLogLimits.apeakMg, unit: 'mg' },
};

type NumericMetadataKey = 'interval_s' | 'shift_hours' | 'calibration_reference_db' | 'calibration_before_db' | 'calibration_after_db';
const numericMetadata: Record<NumericMetadataKey, { min: number; max: number; minExclusive: boolean; unit: string }> = {
  interval_s: { ...noiseLogLimits.intervalSeconds, minExclusive: false, unit: 's' },
  shift_hours: { ...noiseLogLimits.shiftHours, minExclusive: true, unit: 'h' },
  calibration_reference_db: { ...noiseLogLimits.calibrationDb, minExclusive: false, unit: 'dB' },
  calibration_before_db: { ...noiseLogLimits.calibrationDb, minExclusive: false, unit: 'dB' },
  calibration_after_db: { ...noiseLogLimits.calibrationDb, minExclusive: false, unit: 'dB' },
};
const textMetadata = ['noise-log', 'instrument', 'worker', 'start'] as const;

const numberPattern = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const notANumberPattern = /^[+-]?(?:nan|inf|infinity)$/i;
const decimalCommaPattern = /^[+-]?\d+,\d+$/;
const metadataPattern = /^#\s*([A-Za-z0-9_.-]+)\s*:\s*(.*?)\s*$/;
// ISO 8601 date-time with a UTC offset (PRODUCT.md: "start (ISO 8601 with offset)").
const isoWithOffsetPattern = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:?\d{2})$/;

/** Why a text value is not a plain decimal number, in words. */
function describeBadNumber(text: string): string {
  if (text === '') return 'empty value; every interval needs a number here';
  if (notANumberPattern.test(text)) return `"${text}" is not a measured value; every interval needs a finite number`;
  if (decimalCommaPattern.test(text)) {
    return `decimal comma in "${text}": write decimals with a point (${text.replace(',', '.')})`;
  }
  return `expected a number, got "${text}"`;
}

const powersOfTen = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

/**
 * A plain decimal number (optional sign, digits, optional point, optional exponent; surrounding
 * spaces allowed), else NaN. Hex, "Infinity", "NaN" and empty text are not numbers here although
 * `Number()` accepts some of them. Fast path (Clinger 1990, "How to read floating point numbers
 * accurately", the exact case): with at most 15 digits the digits form an exact integer and one
 * division by an exact power of ten is correctly rounded, so the result equals `Number(text)`.
 */
function parseDecimal(text: string): number {
  let start = 0;
  let end = text.length;
  while (start < end && text.charCodeAt(start) <= 32) start++;
  while (end > start && text.charCodeAt(end - 1) <= 32) end--;
  let i = start;
  let code = text.charCodeAt(i);
  const negative = code === 45;
  if (code === 45 || code === 43) i++;
  let mantissa = 0;
  let digits = 0;
  let decimals = -1;
  for (; i < end; i++) {
    code = text.charCodeAt(i);
    if (code >= 48 && code <= 57) {
      mantissa = mantissa * 10 + (code - 48);
      digits++;
      if (decimals >= 0) decimals++;
    } else if (code === 46 && decimals < 0) decimals = 0;
    else break;
  }
  if (i === end && digits > 0 && digits <= 15) {
    const value = decimals > 0 ? mantissa / powersOfTen[decimals] : mantissa;
    return negative ? -value : value;
  }
  const trimmed = text.slice(start, end);
  return numberPattern.test(trimmed) ? Number(trimmed) : Number.NaN;
}

/** A Float64Array that grows by doubling; `toArray` returns a compact copy. */
class GrowingChannel {
  private data = new Float64Array(4096);
  length = 0;
  push(value: number): void {
    if (this.length === this.data.length) {
      const bigger = new Float64Array(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.length++] = value;
  }
  /** A compact copy of the values; the growing buffer is released. */
  toArray(): Float64Array {
    const values = this.data.slice(0, this.length);
    this.data = new Float64Array(0);
    return values;
  }
}

interface PendingShortRow {
  row: number;
  fieldCount: number;
  missingColumn: string;
}

/**
 * Incremental reader: push every row of the file in order (fields already split on commas),
 * then call {@link NoiseLogReader.finish}. Row numbers count every line including comment and
 * blank lines; pass them explicitly or let the reader count (first call = line 1).
 * Throws a {@link NoiseLogError} at the first problem; after that the reader must not be used.
 */
export class NoiseLogReader {
  private lineNumber = 0;
  private sawAnyRow = false;
  private sawContent = false;
  private headerRow: number | null = null;
  private headerLength = 0;
  private readonly metadataText = new Map<string, { value: string; row: number }>();
  private readonly numeric: Partial<Record<NumericMetadataKey, number>> = {};
  private versionSeen = false;
  private intervalSeconds = 0;
  private columnIndex: Partial<Record<ColumnName, number>> = {};
  /** Numeric channels other than t_s, in the order they are read from each row. */
  private numericPlan: { name: Exclude<ColumnName, 'moving'>; index: number; min: number; max: number; unit: string; channel: GrowingChannel }[] = [];
  private timeIndex = 0;
  private movingIndex = -1;
  private pendingShortRow: PendingShortRow | null = null;
  private previousTime = Number.NaN;
  private previousTimeRow = 0;
  private readonly time = new GrowingChannel();
  private readonly level = new GrowingChannel();
  private peak: GrowingChannel | null = null;
  private ax: GrowingChannel | null = null;
  private ay: GrowingChannel | null = null;
  private az: GrowingChannel | null = null;
  private apeak: GrowingChannel | null = null;
  private moving: GrowingChannel | null = null;
  private finished = false;

  /** Number of data rows read so far (for a progress bar). */
  get dataRows(): number {
    return this.time.length;
  }

  /** Push several rows (a papaparse `chunk` result); the first has `firstRowNumber` if given. */
  pushRows(rows: readonly (readonly string[])[], firstRowNumber?: number): void {
    rows.forEach((row, index) => this.pushRow(row, firstRowNumber === undefined ? undefined : firstRowNumber + index));
  }

  /** Push one row of fields; `rowNumber` is its 1-based line in the file (default: next line). */
  pushRow(fields: readonly string[], rowNumber?: number): void {
    if (this.finished) throw new Error('NoiseLogReader: pushRow after finish');
    const row = rowNumber ?? this.lineNumber + 1;
    this.lineNumber = row;
    let first = fields[0] ?? '';
    if (!this.sawAnyRow) {
      this.sawAnyRow = true;
      // A UTF-8 byte-order mark is accepted and dropped (spreadsheet programs add it).
      if (first.charCodeAt(0) === 0xfeff) {
        first = first.slice(1);
        fields = [first, ...fields.slice(1)];
      }
      if (first.includes('\u0000') || first.charCodeAt(0) === 0xfffe || first.charCodeAt(0) === 0xfffd) {
        throw new NoiseLogError('the file is not UTF-8 text (it looks like UTF-16); save it as UTF-8 CSV', { row });
      }
    }
    if (fields.length === 1 && first.trim() === '') return; // blank line
    this.sawContent = true;
    if (this.headerRow === null) {
      if (first.trimStart().startsWith('#')) this.readMetadataLine(fields.join(','), row);
      else this.readHeader(fields, row);
      return;
    }
    this.readDataRow(fields, row);
  }

  private readMetadataLine(line: string, row: number): void {
    const match = metadataPattern.exec(line.trim());
    if (!match) return; // a free comment, e.g. "# exported by the field team"
    const key = match[1].toLowerCase();
    const value = match[2];
    if (this.metadataText.has(key)) {
      throw new NoiseLogError(`appears twice (first on row ${this.metadataText.get(key)!.row})`, { row, metadataKey: key });
    }
    this.metadataText.set(key, { value, row });
    if (key === 'noise-log') {
      if (value !== '1') {
        throw new NoiseLogError(`unsupported version "${value}"; this reader reads noise-log version 1`, {
          row,
          metadataKey: key,
        });
      }
      this.versionSeen = true;
    } else if (Object.hasOwn(numericMetadata, key)) {
      const rule = numericMetadata[key as NumericMetadataKey];
      if (!numberPattern.test(value)) throw new NoiseLogError(describeBadNumber(value), { row, metadataKey: key });
      const number = Number(value);
      const aboveMin = rule.minExclusive ? number > rule.min : number >= rule.min;
      if (!aboveMin || number > rule.max) {
        throw new NoiseLogError(
          `${value} ${rule.unit} is out of range (${rule.minExclusive ? 'above' : 'from'} ${rule.min} to ${rule.max} ${rule.unit}); check the units`,
          { row, metadataKey: key },
        );
      }
      this.numeric[key as NumericMetadataKey] = number;
    } else if (key === 'start') {
      if (!isoWithOffsetPattern.test(value) || Number.isNaN(Date.parse(value))) {
        throw new NoiseLogError(`expected an ISO 8601 date-time with offset such as 2025-03-04T06:30:00-08:00, got "${value}"`, {
          row,
          metadataKey: key,
        });
      }
    }
  }

  private readHeader(fields: readonly string[], row: number): void {
    const names = fields.map((field) => field.trim().toLowerCase());
    if (names.length === 1) {
      const only = names[0];
      if (only.includes(';')) throw new NoiseLogError('the delimiter must be a comma; this header is separated by semicolons', { row });
      if (only.includes('\t')) throw new NoiseLogError('the delimiter must be a comma; this header is separated by tabs', { row });
    }
    if (!this.versionSeen) {
      throw new NoiseLogError('missing the version line "# noise-log: 1" before the header; a format version 1 noise log starts with it', {
        row,
        metadataKey: 'noise-log',
      });
    }
    if (this.numeric.interval_s === undefined) {
      throw new NoiseLogError('required metadata line "# interval_s: <seconds>" is missing before the header', {
        row,
        metadataKey: 'interval_s',
      });
    }
    this.intervalSeconds = this.numeric.interval_s;
    if (numberPattern.test(names[0]) && !names.includes('t_s')) {
      throw new NoiseLogError('expected the header row (t_s,laeq_db,…) but found numbers', { row });
    }
    const index: Partial<Record<ColumnName, number>> = {};
    names.forEach((name, position) => {
      if (!(knownColumns as readonly string[]).includes(name)) return; // unknown columns are ignored
      if (index[name as ColumnName] !== undefined) {
        throw new NoiseLogError('appears twice in the header', { row, column: name });
      }
      index[name as ColumnName] = position;
    });
    for (const required of ['t_s', 'laeq_db'] as const) {
      if (index[required] === undefined) {
        throw new NoiseLogError(`missing required column; the header has ${names.map((n) => `"${n}"`).join(', ')}`, {
          row,
          column: required,
        });
      }
    }
    const present = accelerationColumns.filter((name) => index[name] !== undefined);
    if (present.length > 0 && present.length < 3) {
      const missing = accelerationColumns.find((name) => index[name] === undefined)!;
      throw new NoiseLogError('acceleration needs all three columns ax_mg, ay_mg, az_mg or none; this one is missing', {
        row,
        column: missing,
      });
    }
    this.columnIndex = index;
    this.headerRow = row;
    this.headerLength = fields.length;
    if (index.lcpeak_db !== undefined) this.peak = new GrowingChannel();
    if (present.length === 3) {
      this.ax = new GrowingChannel();
      this.ay = new GrowingChannel();
      this.az = new GrowingChannel();
    }
    if (index.apeak_mg !== undefined) this.apeak = new GrowingChannel();
    if (index.moving !== undefined) this.moving = new GrowingChannel();
    const channels: [Exclude<ColumnName, 'moving' | 't_s'>, GrowingChannel | null][] = [
      ['laeq_db', this.level],
      ['lcpeak_db', this.peak],
      ['ax_mg', this.ax],
      ['ay_mg', this.ay],
      ['az_mg', this.az],
      ['apeak_mg', this.apeak],
    ];
    this.numericPlan = channels.flatMap(([name, channel]) => (channel ? [{ name, index: index[name]!, ...columnRules[name], channel }] : []));
    this.timeIndex = index.t_s!;
    this.movingIndex = index.moving ?? -1;
  }

  private badValue(text: string, rule: { min: number; max: number; unit: string }, column: string, row: number): never {
    const trimmed = text.trim();
    const value = parseDecimal(trimmed);
    if (Number.isNaN(value)) throw new NoiseLogError(describeBadNumber(trimmed), { row, column });
    throw new NoiseLogError(`${trimmed} ${rule.unit} is out of range (${rule.min} to ${rule.max} ${rule.unit}); check the units`, {
      row,
      column,
    });
  }

  private readDataRow(fields: readonly string[], row: number): void {
    if (this.pendingShortRow) this.throwShortRow(false);
    const first = fields[0];
    if (first.charCodeAt(0) === 35 || (first.charCodeAt(0) <= 32 && first.trimStart().startsWith('#'))) {
      throw new NoiseLogError('metadata line after the header; "# key: value" lines must come before the header', { row });
    }
    if (fields.length < this.headerLength) {
      // Decide at the next row (or at finish) whether this is a truncated last row.
      const columns = this.headerColumnNames();
      this.pendingShortRow = { row, fieldCount: fields.length, missingColumn: columns[fields.length] };
      return;
    }
    if (fields.length > this.headerLength) {
      const hint = fields.some((field, i) => i > 0 && /^\d+$/.test(field.trim()) && /^\d+$/.test(fields[i - 1].trim()))
        ? '; a decimal comma (94,3) splits a number in two: write decimals with a point'
        : '';
      throw new NoiseLogError(`${fields.length} values but the header has ${this.headerLength} columns${hint}`, { row });
    }
    const timeText = fields[this.timeIndex];
    const time = parseDecimal(timeText);
    // NaN fails both comparisons, so one test catches non-numbers and out-of-range values.
    if (!(time >= columnRules.t_s.min && time <= columnRules.t_s.max)) this.badValue(timeText, columnRules.t_s, 't_s', row);
    if (this.time.length > 0) {
      const step = time - this.previousTime;
      if (step === 0) {
        throw new NoiseLogError(`t_s ${time} repeats the time of row ${this.previousTimeRow}; t_s must increase`, { row, column: 't_s' });
      }
      if (step < 0) {
        throw new NoiseLogError(`t_s ${time} goes back from ${this.previousTime} on row ${this.previousTimeRow}; t_s must increase`, {
          row,
          column: 't_s',
        });
      }
      if (step < this.intervalSeconds - noiseLogTimeToleranceSeconds) {
        throw new NoiseLogError(
          `t_s advances by ${step} s from row ${this.previousTimeRow}, less than interval_s (${this.intervalSeconds} s); intervals would overlap`,
          { row, column: 't_s' },
        );
      }
    }
    this.previousTime = time;
    this.previousTimeRow = row;
    this.time.push(time);
    const plan = this.numericPlan;
    for (let c = 0; c < plan.length; c++) {
      const column = plan[c];
      const text = fields[column.index];
      const value = parseDecimal(text);
      if (!(value >= column.min && value <= column.max)) this.badValue(text, column, column.name, row);
      column.channel.push(value);
    }
    if (this.moving) {
      const text = fields[this.movingIndex].trim();
      if (text !== '0' && text !== '1') {
        throw new NoiseLogError(`expected 1 (moving) or 0 (not moving), got "${text}"`, { row, column: 'moving' });
      }
      this.moving.push(text === '1' ? 1 : 0);
    }
  }

  private headerColumnNames(): string[] {
    const names: string[] = new Array<string>(this.headerLength).fill('');
    for (const [name, position] of Object.entries(this.columnIndex)) names[position as number] = name;
    return names.map((name, position) => name || `column ${position + 1}`);
  }

  private throwShortRow(isLast: boolean): never {
    const pending = this.pendingShortRow!;
    const what = `${pending.fieldCount} of ${this.headerLength} values`;
    throw new NoiseLogError(isLast ? `the last row is cut short (${what}); was the file truncated?` : `the row is cut short (${what})`, {
      row: pending.row,
      column: pending.missingColumn,
    });
  }

  /** End of input: check what only the whole file can show and return the log. */
  finish(): NoiseLog {
    if (this.finished) throw new Error('NoiseLogReader: finish called twice');
    this.finished = true;
    if (!this.sawContent) {
      throw new NoiseLogError('the file is empty');
    }
    if (this.headerRow === null) {
      if (!this.versionSeen) {
        throw new NoiseLogError('missing the version line "# noise-log: 1"; this is not a format version 1 noise log', {
          metadataKey: 'noise-log',
        });
      }
      throw new NoiseLogError(`no header row after the metadata (the file ends at row ${this.lineNumber})`);
    }
    if (this.pendingShortRow) this.throwShortRow(true);
    if (this.time.length === 0) {
      throw new NoiseLogError(`no data rows after the header on row ${this.headerRow}`);
    }
    const text = (key: string) => this.metadataText.get(key)?.value ?? null;
    // fromEntries defines own properties, so a key such as "__proto__" stays plain data.
    const other: Record<string, string> = Object.fromEntries(
      [...this.metadataText]
        .filter(([key]) => !(textMetadata as readonly string[]).includes(key) && !Object.hasOwn(numericMetadata, key))
        .map(([key, entry]) => [key, entry.value]),
    );
    const metadata: NoiseLogMetadata = {
      version: 1,
      intervalSeconds: this.intervalSeconds,
      instrument: text('instrument'),
      worker: text('worker'),
      start: text('start'),
      shiftHours: this.numeric.shift_hours ?? null,
      calibrationReferenceDb: this.numeric.calibration_reference_db ?? null,
      calibrationBeforeDb: this.numeric.calibration_before_db ?? null,
      calibrationAfterDb: this.numeric.calibration_after_db ?? null,
      other,
    };
    const moving = this.moving ? Uint8Array.from(this.moving.toArray()) : null;
    return {
      metadata,
      intervalSeconds: this.intervalSeconds,
      length: this.time.length,
      tS: this.time.toArray(),
      laeqDb: this.level.toArray(),
      lcPeakDb: this.peak ? this.peak.toArray() : null,
      acceleration: this.ax && this.ay && this.az ? { xMg: this.ax.toArray(), yMg: this.ay.toArray(), zMg: this.az.toArray() } : null,
      apeakMg: this.apeak ? this.apeak.toArray() : null,
      moving,
    };
  }
}

/**
 * Throw a NoiseLogError when a file of `byteLength` bytes is over the limit. Streaming callers
 * check the size (File.size, Content-Length, upload limits) before feeding a {@link NoiseLogReader}.
 */
export function checkNoiseLogSize(byteLength: number, maxBytes: number = defaultNoiseLogMaxBytes): void {
  if (byteLength > maxBytes) {
    const size = (bytes: number) => (bytes >= 1024 * 1024 ? `${(bytes / (1024 * 1024)).toFixed(1)} MB` : `${bytes} bytes`);
    throw new NoiseLogError(`the file is ${size(byteLength)}, over the ${size(maxBytes)} limit for a noise log`);
  }
}

/** UTF-8 length of a string without allocating an encoded copy. */
function utf8Length(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (code < 0x80) bytes += 1;
    else if (code < 0x800) bytes += 2;
    else if (code >= 0xd800 && code <= 0xdbff) {
      bytes += 4;
      i++;
    } else bytes += 3;
  }
  return bytes;
}

/**
 * Decode file bytes as UTF-8 for {@link parseNoiseLog}. A UTF-8 byte-order mark is dropped;
 * a UTF-16 byte-order mark or bytes that are not valid UTF-8 give a NoiseLogError with the row.
 */
export function decodeNoiseLogBytes(bytes: Uint8Array, options: NoiseLogReadOptions = {}): string {
  checkNoiseLogSize(bytes.byteLength, options.maxBytes);
  if ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff)) {
    throw new NoiseLogError('the file is UTF-16 text (it starts with a UTF-16 byte-order mark); save it as UTF-8 CSV', { row: 1 });
  }
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    const lenient = new TextDecoder('utf-8').decode(bytes);
    const bad = lenient.indexOf('\ufffd');
    let row = 1;
    for (let i = 0; i < bad; i++) if (lenient.charCodeAt(i) === 10) row++;
    throw new NoiseLogError('the file is not valid UTF-8 text (save it as UTF-8 CSV)', { row });
  }
}

/**
 * Parse a whole noise log held in a string (format version 1). Uses papaparse with a comma
 * delimiter row by row through a {@link NoiseLogReader}, so it applies exactly the rules a
 * streaming reader applies. Throws a {@link NoiseLogError} at the first problem.
 */
export function parseNoiseLog(text: string, options: NoiseLogReadOptions = {}): NoiseLog {
  const maxBytes = options.maxBytes ?? defaultNoiseLogMaxBytes;
  if (text.length > maxBytes || text.length * 3 > maxBytes) checkNoiseLogSize(utf8Length(text), maxBytes);
  if (
    text
      .trim()
      .replace(/^\ufeff/, '')
      .trim() === ''
  )
    throw new NoiseLogError('the file is empty');
  const reader = new NoiseLogReader();
  let failure: unknown = null;
  let row = 0;
  if (text.indexOf('\n') < 0 && text.includes('\r')) {
    throw new NoiseLogError('lines end with a bare carriage return; line ends must be LF or CRLF', { row: 1 });
  }
  Papa.parse<string[]>(text, {
    delimiter: ',',
    // Split on LF always: a CRLF file leaves a trailing "\r" that the reader trims as white space,
    // so CRLF, LF and mixed files read alike and papaparse need not guess the line end.
    newline: '\n',
    skipEmptyLines: false,
    step: (results, parser) => {
      if (failure !== null) return;
      row++;
      try {
        const quoteError = results.errors.find((error) => error.type === 'Quotes');
        if (quoteError) throw new NoiseLogError(`unbalanced quote (${quoteError.message})`, { row });
        reader.pushRow(results.data, row);
      } catch (error) {
        failure = error;
        parser.abort();
      }
    },
  });
  if (failure !== null) throw failure;
  return reader.finish();
}
