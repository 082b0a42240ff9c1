import Papa from 'papaparse';
import { labImportFields, labImportMaximumRows, type LabImportField, type LabImportPreview, type LabImportProblem } from '@schema/lab-imports';
import { BadRequest } from '../errors';

/*
 * Reading a lab results file: bytes → UTF-8 text → rows (papaparse, delimiter detected among
 * comma, semicolon, tab and bar) → a preview with a suggested column mapping. Rows are numbered as
 * a spreadsheet shows them: the header is row 1, the first data row is row 2.
 */

/** A parsed file: the header and each data row with its row number. */
export interface LabFile {
  delimiter: string;
  header: string[];
  rows: Array<{ row: number; values: string[] }>;
}

/** Problems listed in a 400 whose message names the first few and says nothing was stored. */
export function importRejected(summary: string, problems: LabImportProblem[], fields?: Record<string, string>): BadRequest {
  const shown = problems.slice(0, 5).map(describeProblem);
  const more = problems.length > shown.length ? `; and ${problems.length - shown.length} more` : '';
  const count = `${problems.length} problem${problems.length === 1 ? '' : 's'}`;
  return new BadRequest(`${summary} (${count}; nothing was stored): ${shown.join('; ')}${more}`, fields, { problems });
}

/** `row 14, column "value": expected a number…` */
export function describeProblem(problem: LabImportProblem): string {
  const where = [problem.row === null ? undefined : `row ${problem.row}`, problem.column === null ? undefined : `column "${problem.column}"`]
    .filter(Boolean)
    .join(', ');
  return where ? `${where}: ${problem.message}` : problem.message;
}

/**
 * The file's bytes as text. Refused: an empty file, bytes that are not UTF-8 (a spreadsheet
 * saved as .xlsx, a PDF), NUL bytes. A UTF-8 byte-order mark is dropped.
 */
export function decodeLabFile(bytes: Buffer): string {
  if (bytes.length === 0) throw importRejected('The file is empty', [{ row: null, column: null, message: 'the file has no bytes at all' }]);
  if (bytes.includes(0))
    throw importRejected('The file is not a text file', [
      { row: null, column: null, message: 'it contains NUL bytes (a spreadsheet or binary file?): save it as CSV (UTF-8) and upload that' },
    ]);
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw importRejected('The file is not UTF-8 text', [{ row: null, column: null, message: 'save it as CSV (UTF-8) and upload that' }]);
  }
  text = text.replace(/^\uFEFF/, '');
  if (text.trim() === '') throw importRejected('The file is empty', [{ row: null, column: null, message: 'the file holds only blank lines' }]);
  return text;
}

const otherDelimiters = [',', ';', '\t', '|'];
const delimiterNames: Record<string, string> = { ',': 'a comma', ';': 'a semicolon', '\t': 'a tab', '|': 'a bar' };

/** Parses the text; every structural problem (quotes, field counts, header) is listed with its row. */
export function parseLabFile(text: string): LabFile {
  const parsed = Papa.parse<string[]>(text, { delimiter: '', delimitersToGuess: otherDelimiters, skipEmptyLines: false, header: false });
  const problems: LabImportProblem[] = [];
  for (const error of parsed.errors) {
    if (error.type === 'Quotes')
      problems.push({ row: (error.row ?? 0) + 1, column: null, message: `a quoted field is not closed or has a stray quote (${error.message})` });
  }
  const records = parsed.data
    .map((values, index) => ({ row: index + 1, values }))
    .filter((record) => !(record.values.length === 1 && record.values[0].trim() === ''));
  if (records.length === 0) throw importRejected('The file is empty', [{ row: null, column: null, message: 'no header row was found' }]);
  const delimiter = parsed.meta.delimiter;
  const [headerRecord, ...dataRecords] = records;
  const header = headerRecord.values.map((name) => name.trim());
  if (header.length < 2) {
    const used = otherDelimiters.find((other) => other !== delimiter && header[0].includes(other));
    problems.push({
      row: headerRecord.row,
      column: null,
      message: used
        ? `the header uses ${delimiterNames[used]} but most rows use ${delimiterNames[delimiter] ?? `"${delimiter}"`} — use one delimiter throughout`
        : `only one column was found ("${header[0]}"): separate the columns with commas (or semicolons or tabs) and give each a name`,
    });
  }
  const seen = new Map<string, number>();
  header.forEach((name, index) => {
    if (name === '') problems.push({ row: headerRecord.row, column: `#${index + 1}`, message: 'the header is blank: name every column' });
    else if (seen.has(name.toLowerCase()))
      problems.push({
        row: headerRecord.row,
        column: name,
        message: `the column name appears twice (columns ${seen.get(name.toLowerCase())! + 1} and ${index + 1})`,
      });
    else seen.set(name.toLowerCase(), index);
  });
  if (dataRecords.length === 0) problems.push({ row: null, column: null, message: 'the file has a header but no data rows' });
  if (dataRecords.length > labImportMaximumRows)
    problems.push({ row: null, column: null, message: `the file has ${dataRecords.length} data rows; at most ${labImportMaximumRows} are read in one import` });
  for (const record of dataRecords) {
    const count = record.values.length;
    if (count === header.length) continue;
    // Spreadsheets often add empty trailing fields: harmless.
    if (count > header.length && record.values.slice(header.length).every((value) => value.trim() === '')) {
      record.values = record.values.slice(0, header.length);
      continue;
    }
    const mixed = otherDelimiters.find((other) => other !== delimiter && record.values.some((value) => value.includes(other)));
    problems.push({
      row: record.row,
      column: null,
      message: mixed
        ? `${count} field${count === 1 ? '' : 's'} where the header has ${header.length}: this row seems to use ${delimiterNames[mixed]} where the header uses ${delimiterNames[delimiter] ?? `"${delimiter}"`} — use one delimiter throughout`
        : `${count} field${count === 1 ? '' : 's'} where the header has ${header.length}`,
    });
    if (problems.length >= 200) break;
  }
  if (problems.length > 0) throw importRejected('The file cannot be read as a table', problems);
  return { delimiter, header, rows: dataRecords };
}

/**
 * Header names (lower case, letters and digits only) that suggest each field, most specific
 * first. A header matches exactly, or starts with one of these (e.g. "Result (mg/m3)").
 */
const headerHints: Record<LabImportField, string[]> = {
  workerCode: ['workercode', 'worker', 'employeecode', 'employeeid', 'employee', 'personid', 'person', 'staffid', 'code'],
  date: ['sampledate', 'shiftdate', 'datesampled', 'samplingdate', 'date'],
  group: ['exposuregroup', 'group', 'seg', 'segname'],
  agent: ['agent', 'analyte', 'substance', 'chemical', 'compound', 'parameter', 'determinand'],
  value: ['value', 'result', 'concentration', 'conc', 'twa'],
  unit: ['units', 'unit', 'resultunit', 'resultunits'],
  detectionLimit: ['lod', 'detectionlimit', 'limitofdetection', 'reportinglimit', 'mdl', 'dl'],
  sampleId: ['sampleid', 'labsampleid', 'samplenumber', 'sampleno', 'samplecode', 'sample', 'fieldid'],
  lab: ['laboratory', 'lab', 'labname'],
  startTime: ['starttime', 'samplestart', 'timeon', 'start', 'on'],
  endTime: ['endtime', 'stoptime', 'sampleend', 'samplestop', 'timeoff', 'end', 'stop', 'off'],
  minutes: ['sampledminutes', 'durationminutes', 'durationmin', 'minutes', 'duration', 'sampletime', 'mins', 'min'],
};

function normalize(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]/g, '');
}

/** A mapping guessed from the header names (exact matches first, then prefixes); unmatched fields are null. */
export function suggestMapping(header: readonly string[]): Partial<Record<LabImportField, string | null>> {
  const mapping: Partial<Record<LabImportField, string | null>> = {};
  const taken = new Set<string>();
  for (const pass of ['exact', 'prefix'] as const) {
    for (const field of labImportFields) {
      if (mapping[field]) continue;
      const match = headerHints[field]
        .map((hint) =>
          header.find((name) => !taken.has(name) && (pass === 'exact' ? normalize(name) === hint : hint.length >= 3 && normalize(name).startsWith(hint))),
        )
        .find((name) => name !== undefined);
      if (match) {
        mapping[field] = match;
        taken.add(match);
      }
    }
  }
  for (const field of labImportFields) mapping[field] ??= null;
  return mapping;
}

/** Columns with examples, the suggested mapping and the first rows. */
export function previewOf(file: LabFile, rowLimit = 20): LabImportPreview {
  return {
    delimiter: file.delimiter,
    columns: file.header.map((name, index) => ({
      name,
      examples: file.rows
        .map((record) => record.values[index]?.trim() ?? '')
        .filter((value) => value !== '')
        .slice(0, 3),
    })),
    suggestedMapping: suggestMapping(file.header),
    rows: file.rows.slice(0, rowLimit).map((record) => ({
      row: record.row,
      values: Object.fromEntries(file.header.map((name, index) => [name, record.values[index] ?? ''])),
    })),
    rowCount: file.rows.length,
  };
}
