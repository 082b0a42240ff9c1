/**
 * Reading our noise log format version 1 (PRODUCT.md, "Noise log format, version 1"): valid files,
 * streaming through papaparse, and malformed files that must each give a clear error naming the
 * row and the column (or metadata key).
 */
import { Readable } from 'node:stream';
import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import { NoiseLogError, NoiseLogReader, decodeNoiseLogBytes, parseNoiseLog } from '@stats/noise-log-parse';
import { formatNoiseLog } from '@stats/noise-log-write';
import { generateNoiseDemoLog } from '@stats/noise-demo';
import { logText } from './build-log';

const basic = [
  '# noise-log: 1',
  '# instrument: RT-DOS-07',
  '# worker: RT-014',
  '# start: 2025-03-04T06:30:00-08:00',
  '# interval_s: 1',
  '# shift_hours: 8',
  '# calibration_reference_db: 114',
  '# calibration_before_db: 114.0',
  '# calibration_after_db: 114.3',
  'laeq_db,notes,t_s,lcpeak_db,az_mg,ax_mg,ay_mg,apeak_mg,moving',
  '85.5,saw on,0,101.2,990,40,-150,1200,0',
  '86.0,,1,102.0,995,42,-148,1300,1',
  '84.1,,3,99.9,991,41,-151,3100,0',
].join('\n');

function expectError(run: () => unknown): NoiseLogError {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(NoiseLogError);
    return error as NoiseLogError;
  }
  throw new Error('expected a NoiseLogError, but the file was accepted');
}

describe('reading a valid noise log', () => {
  test('metadata and channels are read, columns found by name in any order, unknown columns ignored', () => {
    const log = parseNoiseLog(basic);
    expect(log.metadata).toMatchObject({
      version: 1,
      intervalSeconds: 1,
      instrument: 'RT-DOS-07',
      worker: 'RT-014',
      start: '2025-03-04T06:30:00-08:00',
      shiftHours: 8,
      calibrationReferenceDb: 114,
      calibrationBeforeDb: 114,
      calibrationAfterDb: 114.3,
    });
    expect(log.length).toBe(3);
    expect([...log.tS]).toEqual([0, 1, 3]);
    expect([...log.laeqDb]).toEqual([85.5, 86, 84.1]);
    expect([...log.lcPeakDb!]).toEqual([101.2, 102, 99.9]);
    expect([...log.acceleration!.xMg]).toEqual([40, 42, 41]);
    expect([...log.acceleration!.zMg]).toEqual([990, 995, 991]);
    expect([...log.apeakMg!]).toEqual([1200, 1300, 3100]);
    expect([...log.moving!]).toEqual([0, 1, 0]);
    expect(log.tS).toBeInstanceOf(Float64Array);
    expect(log.moving).toBeInstanceOf(Uint8Array);
  });

  test('optional channels that are absent are null', () => {
    const log = parseNoiseLog(logText({ columns: ['t_s', 'laeq_db'], rows: [[0, 80]] }));
    expect(log.lcPeakDb).toBeNull();
    expect(log.acceleration).toBeNull();
    expect(log.apeakMg).toBeNull();
    expect(log.moving).toBeNull();
    expect(log.metadata.shiftHours).toBeNull();
  });

  test('CRLF line ends read the same as LF, also when mixed in one file', () => {
    expect(parseNoiseLog(basic.replaceAll('\n', '\r\n'))).toEqual(parseNoiseLog(basic));
    const lines = basic.split('\n');
    const mixed = lines.map((line, i) => line + (i % 2 ? '\r\n' : '\n')).join('');
    expect(parseNoiseLog(mixed)).toEqual(parseNoiseLog(basic));
  });

  test('a UTF-8 byte-order mark is accepted and ignored, as a string or as bytes', () => {
    expect(parseNoiseLog(`\ufeff${basic}`)).toEqual(parseNoiseLog(basic));
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode(basic)]);
    expect(parseNoiseLog(decodeNoiseLogBytes(bytes))).toEqual(parseNoiseLog(basic));
  });

  test('blank lines and free comments are ignored; other metadata keys are kept as text', () => {
    const text = [
      '# noise-log: 1',
      '# exported by the field team',
      '# Site: Ridgeback sawmill',
      '# interval_s: 0.5',
      '',
      't_s,laeq_db',
      '0,80',
      '',
      '0.5,81',
      '',
    ].join('\n');
    const log = parseNoiseLog(text);
    expect(log.length).toBe(2);
    expect(log.metadata.other).toEqual({ site: 'Ridgeback sawmill' });
  });

  test('metadata keys named like object internals are kept as plain text', () => {
    const text = ['# noise-log: 1', '# constructor: a', '# __proto__: b', '# interval_s: 1', 't_s,laeq_db', '0,80'].join('\n');
    const other = parseNoiseLog(text).metadata.other;
    expect(Object.keys(other)).toEqual(['constructor', '__proto__']);
    expect(other.constructor).toBe('a');
    expect(Object.getPrototypeOf(other)).toBe(Object.prototype);
  });

  /** Feed text through papaparse's Node stream reader in small pieces, as the server does with an upload. */
  function streamInto(reader: NoiseLogReader, text: string, pieceLength: number): Promise<void> {
    return new Promise((resolve, reject) => {
      const parser = Papa.parse(Papa.NODE_STREAM_INPUT, { delimiter: ',', skipEmptyLines: false });
      parser.on('data', (row: string[]) => {
        try {
          reader.pushRow(row);
        } catch (error) {
          parser.destroy();
          reject(error);
        }
      });
      parser.on('end', () => resolve());
      parser.on('error', reject);
      const pieces = Array.from({ length: Math.ceil(text.length / pieceLength) }, (_, i) => text.slice(i * pieceLength, (i + 1) * pieceLength));
      Readable.from(pieces).pipe(parser);
    });
  }

  test('a reader fed by a streaming papaparse parse in small pieces gives the same log as parseNoiseLog', async () => {
    const { text } = generateNoiseDemoLog({ seed: 11, hours: 1, knockCount: 2 });
    const reader = new NoiseLogReader();
    await streamInto(reader, text, 4096); // rows split across piece borders
    expect(reader.dataRows).toBe(3600);
    expect(reader.finish()).toEqual(parseNoiseLog(text));
  });

  test('a streaming reader names the file line of an error found in a later piece', async () => {
    const rows = Array.from({ length: 2000 }, (_, i) => [i, 85]);
    rows[1500] = [1498, 85]; // goes back; file line = 3 metadata/header lines + 1501
    const text = logText({ columns: ['t_s', 'laeq_db'], rows });
    const error = await streamInto(new NoiseLogReader(), text, 1024).then(
      () => null,
      (failure: unknown) => failure,
    );
    expect(error).toBeInstanceOf(NoiseLogError);
    expect((error as NoiseLogError).row).toBe(1504);
    expect((error as NoiseLogError).column).toBe('t_s');
  });

  test('writing a parsed log and reading it again gives the same log', () => {
    const log = parseNoiseLog(basic);
    expect(parseNoiseLog(formatNoiseLog(log))).toEqual(log);
    expect(parseNoiseLog(formatNoiseLog(log, { lineEnd: '\r\n' }))).toEqual(log);
  });
});

describe('malformed noise logs give a clear error naming the row and the column', () => {
  const header = 't_s,laeq_db,lcpeak_db';
  const meta = ['# noise-log: 1', '# interval_s: 1'];
  const file = (...lines: string[]) => [...meta, header, ...lines].join('\n');
  const utf16 = (text: string) => {
    const bytes = new Uint8Array(2 + text.length * 2);
    bytes[0] = 0xff;
    bytes[1] = 0xfe;
    for (let i = 0; i < text.length; i++) bytes[2 + 2 * i] = text.charCodeAt(i);
    return bytes;
  };

  // [case, text or bytes, row, column, metadata key, message pattern]
  const cases: [string, string | Uint8Array, number | null, string | null, string | null, RegExp][] = [
    ['an empty file', '', null, null, null, /the file is empty/],
    ['a file of blank lines', '\n\r\n  \n', null, null, null, /the file is empty/],
    ['no version line (header first)', 't_s,laeq_db\n0,80\n', 1, null, 'noise-log', /missing the version line "# noise-log: 1"/],
    ['only free comments', '# hello\n# world\n', null, null, 'noise-log', /missing the version line/],
    ['a wrong version', '# noise-log: 2\n# interval_s: 1\nt_s,laeq_db\n0,80\n', 1, null, 'noise-log', /unsupported version "2"/],
    ['no interval_s line', '# noise-log: 1\nt_s,laeq_db\n0,80\n', 2, null, 'interval_s', /"# interval_s: <seconds>" is missing/],
    ['a negative interval', '# noise-log: 1\n# interval_s: -1\nt_s,laeq_db\n0,80\n', 2, null, 'interval_s', /-1 s is out of range/],
    ['an interval over 60 s', '# noise-log: 1\n# interval_s: 90\nt_s,laeq_db\n0,80\n', 2, null, 'interval_s', /out of range/],
    ['an interval with a decimal comma', '# noise-log: 1\n# interval_s: 0,5\nt_s,laeq_db\n', 2, null, 'interval_s', /decimal comma in "0,5"/],
    ['metadata after the header', file('0,80,100', '# worker: RT-014', '1,80,100'), 5, null, null, /metadata line after the header/],
    ['a header without laeq_db', '# noise-log: 1\n# interval_s: 1\nt_s,level\n0,80\n', 3, 'laeq_db', null, /missing required column/],
    ['a header without t_s', '# noise-log: 1\n# interval_s: 1\ntime,laeq_db\n0,80\n', 3, 't_s', null, /missing required column/],
    ['no header row (numbers after the metadata)', '# noise-log: 1\n# interval_s: 1\n0,80\n1,81\n', 3, null, null, /expected the header row/],
    ['a column named twice', '# noise-log: 1\n# interval_s: 1\nt_s,laeq_db,laeq_db\n', 3, 'laeq_db', null, /appears twice/],
    ['two of the three acceleration columns', '# noise-log: 1\n# interval_s: 1\nt_s,laeq_db,ax_mg,ay_mg\n0,80,1,2\n', 3, 'az_mg', null, /all three columns/],
    ['a non-numeric level', file('0,80,100', '1,loud,100'), 5, 'laeq_db', null, /expected a number, got "loud"/],
    ['NaN as a level', file('0,80,100', '1,NaN,100'), 5, 'laeq_db', null, /"NaN" is not a measured value/],
    ['Infinity as a peak', file('0,80,Infinity'), 4, 'lcpeak_db', null, /"Infinity" is not a measured value/],
    ['an empty value', file('0,80,100', '1,,100'), 5, 'laeq_db', null, /empty value/],
    ['t_s that repeats', file('0,80,100', '1,80,100', '1,81,100'), 6, 't_s', null, /repeats the time of row 5/],
    ['t_s that goes back', file('0,80,100', '5,80,100', '3,81,100'), 6, 't_s', null, /goes back from 5 on row 5/],
    ['t_s steps shorter than the interval (overlap)', file('0,80,100', '0.5,80,100'), 5, 't_s', null, /less than interval_s.*overlap/],
    ['a negative t_s', file('-1,80,100'), 4, 't_s', null, /out of range/],
    ['a level of 1400 dB (wrong units)', file('0,80,100', '1,1400,100'), 5, 'laeq_db', null, /1400 dB is out of range/],
    ['a level in pascals squared (negative dB)', file('0,-3,100'), 4, 'laeq_db', null, /out of range/],
    ['a moving flag that is not 0 or 1', '# noise-log: 1\n# interval_s: 1\nt_s,laeq_db,moving\n0,80,2\n', 4, 'moving', null, /expected 1 \(moving\) or 0/],
    ['a semicolon delimiter', '# noise-log: 1\n# interval_s: 1\nt_s;laeq_db;lcpeak_db\n0;80,5;100\n', 3, null, null, /the delimiter must be a comma/],
    ['a tab delimiter', '# noise-log: 1\n# interval_s: 1\nt_s\tlaeq_db\n0\t80\n', 3, null, null, /the delimiter must be a comma/],
    ['a quoted decimal comma', file('0,"80,5",100'), 4, 'laeq_db', null, /decimal comma in "80,5".*point \(80\.5\)/],
    ['an unquoted decimal comma', file('0,80,5,100,2'), 4, null, null, /5 values but the header has 3 columns; a decimal comma/],
    ['a row cut short in the middle', file('0,80,100', '1,80', '2,80,100'), 5, 'lcpeak_db', null, /the row is cut short \(2 of 3 values\)/],
    ['a truncated last row', file('0,80,100', '1,80,100', '2,8'), 6, 'lcpeak_db', null, /the last row is cut short \(2 of 3 values\); was the file truncated/],
    ['a header and no data', file(), null, null, null, /no data rows after the header on row 3/],
    ['metadata and no header', '# noise-log: 1\n# interval_s: 1\n', null, null, null, /no header row/],
    ['a metadata key given twice', '# noise-log: 1\n# interval_s: 1\n# interval_s: 2\n', 3, null, 'interval_s', /appears twice \(first on row 2\)/],
    [
      'a start without a UTC offset',
      '# noise-log: 1\n# interval_s: 1\n# start: 2025-03-04 06:30\nt_s,laeq_db\n',
      3,
      null,
      'start',
      /ISO 8601 date-time with offset/,
    ],
    ['shift hours of 0', '# noise-log: 1\n# interval_s: 1\n# shift_hours: 0\n', 3, null, 'shift_hours', /out of range/],
    ['an unbalanced quote', file('0,"80,100'), 4, null, null, /unbalanced quote/],
    ['old Mac line ends (CR only)', '# noise-log: 1\r# interval_s: 1\rt_s,laeq_db\r0,80\r', 1, null, null, /bare carriage return/],
    ['a UTF-16 file (byte-order mark)', utf16(file('0,80,100')), 1, null, null, /UTF-16/],
    ['UTF-16 text read as UTF-8', '\u0000#\u0000 \u0000n\u0000o\u0000i\u0000s\u0000e', 1, null, null, /not UTF-8 text/],
    [
      'bytes that are not UTF-8',
      new Uint8Array([...new TextEncoder().encode(file('0,80,100', '1,80,100')), 0x0a, 0xff, 0x31]),
      6,
      null,
      null,
      /not valid UTF-8/,
    ],
  ];

  test.each(cases)('%s', (_name, input, row, column, metadataKey, message) => {
    const error = expectError(() => parseNoiseLog(typeof input === 'string' ? input : decodeNoiseLogBytes(input)));
    expect(error.row).toBe(row);
    expect(error.column).toBe(column);
    expect(error.metadataKey).toBe(metadataKey);
    expect(error.message).toMatch(message);
    // The message starts with where the problem is, in words.
    if (row !== null) expect(error.message.startsWith(`row ${row}`)).toBe(true);
    if (column !== null) expect(error.message).toContain(`column "${column}"`);
  });

  test('a file over the size limit is refused before parsing, with its size and the limit', () => {
    const text = logText({ columns: ['t_s', 'laeq_db'], rows: Array.from({ length: 200 }, (_, i) => [i, 80]) });
    const error = expectError(() => parseNoiseLog(text, { maxBytes: 1024 }));
    expect(error.row).toBeNull();
    expect(error.message).toMatch(/the file is \d+ bytes, over the 1024 bytes limit/);
    const bytes = new TextEncoder().encode(text);
    expect(expectError(() => decodeNoiseLogBytes(bytes, { maxBytes: 1024 })).message).toMatch(/over the/);
    // The default limit (50 MB) accepts it.
    expect(parseNoiseLog(text).length).toBe(200);
  });

  test('a file of multi-byte characters is measured in UTF-8 bytes against the limit', () => {
    const text = `${logText({ columns: ['t_s', 'laeq_db'], rows: [[0, 80]] })}`.replace('# interval_s: 1', `# interval_s: 1\n# note: ${'é'.repeat(600)}`);
    // 600 two-byte characters push the file over 1 KB although it has fewer than 1024 characters.
    expect(text.length).toBeLessThan(1024);
    expect(expectError(() => parseNoiseLog(text, { maxBytes: 1024 })).message).toMatch(/over the/);
  });
});
