import { createHash } from 'node:crypto';
import { and, count, desc, eq } from 'drizzle-orm';
import { agents, exposureUnitLabels, type Agent, type ExposureUnit } from '@schema/agents';
import { exposureGroups, type ExposureGroup } from '@schema/exposure-groups';
import {
  importBatches,
  type DateFormat,
  type ImportBatch,
  type ImportBatchListQuery,
  type ImportBatchSummary,
  type LabImportCommit,
  type LabImportField,
  type LabImportPreview,
  type LabImportProblem,
} from '@schema/lab-imports';
import type { ListPage } from '@schema/list-query';
import { shiftResults, type ShiftResultDetails, type ShiftResultPart } from '@schema/shift-results';
import { groupMemberships, workers, type Worker } from '@schema/workers';
import { shiftTwa } from '@stats/shift-twa';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict } from '../errors';
import { audit, fieldErrors, ownedOrNotFound, type Actor, type Tx } from './changes';
import { isCalendarDate, latestPossibleDate } from './dates';
import { decodeLabFile, importRejected, parseLabFile, previewOf, type LabFile } from './lab-file';
import { pageOf, pageWindow, searchCondition } from './list';
import { sampleMinutes } from './sample-times';
import { touchGroupResults } from './exposure-groups';
import { getShiftResultsOfImport, insertShiftResult, shiftResultWriter, type ShiftResultView } from './shift-results';
import { conversionBetween, parseUnit } from './units';
import type { NameAccess } from './workers';

/*
 * Lab CSV import: upload (kept with its SHA-256) → preview with a suggested mapping → check or
 * commit with the user's mapping. A commit is all or nothing: every row is checked first and every
 * problem is listed by row and column; a single problem stores nothing. Samples of the same worker,
 * date, group and agent are combined into one shift TWA (stats/shift-twa.ts) under the
 * unsampled-time assumption the user chose, stated in each result's details.
 */

const twaSource = 'TWA = Σ(Cᵢ·tᵢ)/T (OSHA 29 CFR 1910.1000(d)(1)(i); OSHA Technical Manual Sec. II Ch. 1)';

function summaryOf(batch: ImportBatch): ImportBatchSummary {
  const { content: _content, ...summary } = batch;
  return summary;
}

function findBatch(db: Tx, organizationId: number, batchId: number): ImportBatch {
  return ownedOrNotFound(db, importBatches, organizationId, batchId, 'lab import');
}

/**
 * Stores an uploaded lab file (text, size, SHA-256) once it reads as a table, and returns the
 * preview. A file that cannot be read is refused with its problems and nothing is stored.
 */
export function uploadLabFile(
  db: Db,
  clock: Clock,
  input: { organizationId: number; actor: Actor; fileName: string; bytes: Buffer },
): { batch: ImportBatchSummary; preview: LabImportPreview; warnings: string[] } {
  const text = decodeLabFile(input.bytes);
  const file = parseLabFile(text);
  const sha256 = createHash('sha256').update(input.bytes).digest('hex');
  const now = clock.now();
  const stamp = now.toISOString();
  const batch = db.transaction((tx) => {
    const row = tx
      .insert(importBatches)
      .values({
        organizationId: input.organizationId,
        fileName: input.fileName.slice(0, 255),
        fileSize: input.bytes.length,
        sha256,
        content: text,
        delimiter: file.delimiter,
        rowCount: file.rows.length,
        uploadedByUserId: input.actor?.id ?? null,
        createdAt: stamp,
        updatedAt: stamp,
      })
      .returning()
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'import_batch',
      entityId: row.id,
      action: 'uploaded',
      after: { fileName: row.fileName, fileSize: row.fileSize, sha256, rowCount: row.rowCount },
      at: now,
    });
    return row;
  });
  const earlier = db
    .select({ id: importBatches.id, committedAt: importBatches.committedAt })
    .from(importBatches)
    .where(and(eq(importBatches.organizationId, input.organizationId), eq(importBatches.sha256, sha256), eq(importBatches.status, 'committed')))
    .all();
  const warnings = earlier.map((other) => `The same file (same SHA-256) was committed before as lab import ${other.id} on ${other.committedAt}.`);
  return { batch: summaryOf(batch), preview: previewOf(file), warnings };
}

export function listLabImports(db: Db, organizationId: number, query: ImportBatchListQuery): ListPage<ImportBatchSummary> {
  const where = and(
    eq(importBatches.organizationId, organizationId),
    query.status ? eq(importBatches.status, query.status) : undefined,
    searchCondition(query.q, [importBatches.fileName, importBatches.sha256]),
  );
  const total = db.select({ total: count() }).from(importBatches).where(where).get()?.total ?? 0;
  const { limit, offset } = pageWindow(query.page, query.pageSize);
  const items = db
    .select()
    .from(importBatches)
    .where(where)
    .orderBy(desc(importBatches.createdAt), desc(importBatches.id))
    .limit(limit)
    .offset(offset)
    .all()
    .map(summaryOf);
  return pageOf(items, total, query.page, query.pageSize);
}

/**
 * A batch with its preview (the file is re-read from the stored text). A lab file may carry worker
 * names in columns of its own, so for roles that may not see names the preview keeps the column
 * names and the suggested mapping but leaves out the cells (`cellsHidden`).
 */
export function getLabImport(
  db: Db,
  organizationId: number,
  batchId: number,
  access: NameAccess,
): { batch: ImportBatchSummary; preview: LabImportPreview & { cellsHidden?: true } } {
  const batch = findBatch(db, organizationId, batchId);
  const preview = previewOf(parseLabFile(batch.content));
  if (access.canSeeNames) return { batch: summaryOf(batch), preview };
  return {
    batch: summaryOf(batch),
    preview: { ...preview, columns: preview.columns.map((column) => ({ name: column.name, examples: [] })), rows: [], cellsHidden: true },
  };
}

/** Everything in the organization the rows are matched against, loaded once per check. */
interface Lookups {
  workersByCode: Map<string, Worker>;
  groupsById: Map<number, ExposureGroup>;
  groupsByName: Map<string, ExposureGroup[]>;
  agentsById: Map<number, Agent>;
  agentsByKey: Map<string, Agent>;
  memberships: Map<string, Array<{ fromDate: string; toDate: string | null }>>;
  validResults: Map<string, { id: number; sampleIds: Set<string> }>;
}

function loadLookups(db: Tx, organizationId: number): Lookups {
  const workerRows = db.select().from(workers).where(eq(workers.organizationId, organizationId)).all();
  const groupRows = db.select().from(exposureGroups).where(eq(exposureGroups.organizationId, organizationId)).all();
  const agentRows = db.select().from(agents).where(eq(agents.organizationId, organizationId)).all();
  const groupsByName = new Map<string, ExposureGroup[]>();
  for (const group of groupRows) groupsByName.set(group.name.toLowerCase(), [...(groupsByName.get(group.name.toLowerCase()) ?? []), group]);
  const agentsByKey = new Map<string, Agent>();
  for (const agent of agentRows) {
    agentsByKey.set(agent.name.toLowerCase(), agent);
    if (agent.casNumber) agentsByKey.set(agent.casNumber, agent);
  }
  const memberships = new Map<string, Array<{ fromDate: string; toDate: string | null }>>();
  for (const period of db.select().from(groupMemberships).where(eq(groupMemberships.organizationId, organizationId)).all()) {
    const key = `${period.workerId}|${period.exposureGroupId}`;
    memberships.set(key, [...(memberships.get(key) ?? []), { fromDate: period.fromDate, toDate: period.toDate }]);
  }
  const validResults = new Map<string, { id: number; sampleIds: Set<string> }>();
  const resultRows = db
    .select({
      id: shiftResults.id,
      exposureGroupId: shiftResults.exposureGroupId,
      workerId: shiftResults.workerId,
      agentId: shiftResults.agentId,
      date: shiftResults.date,
      sampleId: shiftResults.sampleId,
      details: shiftResults.details,
    })
    .from(shiftResults)
    .where(and(eq(shiftResults.organizationId, organizationId), eq(shiftResults.status, 'valid')))
    .all();
  for (const result of resultRows) {
    const sampleIds = new Set<string>();
    if (result.sampleId) sampleIds.add(result.sampleId.toLowerCase());
    for (const part of result.details?.parts ?? []) if (part.sampleId) sampleIds.add(part.sampleId.toLowerCase());
    validResults.set(shiftKey(result.workerId, result.date, result.exposureGroupId, result.agentId), { id: result.id, sampleIds });
  }
  return {
    workersByCode: new Map(workerRows.map((worker) => [worker.code.toLowerCase(), worker])),
    groupsById: new Map(groupRows.map((group) => [group.id, group])),
    groupsByName,
    agentsById: new Map(agentRows.map((agent) => [agent.id, agent])),
    agentsByKey,
    memberships,
    validResults,
  };
}

function shiftKey(workerId: number, date: string, groupId: number, agentId: number): string {
  return `${workerId}|${date}|${groupId}|${agentId}`;
}

/** One data row, read and checked. */
interface SampleRow {
  row: number;
  worker: Worker;
  group: ExposureGroup;
  agent: Agent;
  date: string;
  reportedValue: number;
  reportedUnit: ExposureUnit;
  nonDetect: boolean;
  /** In the group's OEL unit. */
  value: number;
  conversion: ShiftResultDetails['conversion'];
  sampleId: string | null;
  lab: string | null;
  startTime: string | null;
  endTime: string | null;
  startMinute: number | null;
  endMinute: number | null;
  minutes: number | null;
}

const numberPattern = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const nonDetectWords = /^(<\s*)?(lod|loq|dl|mdl|rl|nd|n\.d\.|bdl|not detected|below detection|<)$/i;

function parseDate(text: string, format: DateFormat): string | undefined {
  const trimmed = text.trim();
  if (format === 'YYYY-MM-DD') return isCalendarDate(trimmed) ? trimmed : undefined;
  const match = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/.exec(trimmed);
  if (!match) return undefined;
  const [day, month] = format === 'DD/MM/YYYY' ? [match[1], match[2]] : [match[2], match[1]];
  const iso = `${match[3]}-${month.padStart(2, '0')}-${day.padStart(2, '0')}`;
  return isCalendarDate(iso) ? iso : undefined;
}

type ValueReading = { kind: 'number'; value: number } | { kind: 'below'; limit: number | null } | { kind: 'bad'; message: string };

/** A value cell: a number, `<0.02` (a non-detect with its limit), `<LOD`/`ND` (limit from its column). */
function readValue(text: string): ValueReading {
  const trimmed = text.trim();
  if (trimmed === '') return { kind: 'bad', message: 'the value is empty' };
  if (numberPattern.test(trimmed)) {
    const value = Number(trimmed);
    return value > 0 ? { kind: 'number', value } : { kind: 'bad', message: `the value must be above 0, got "${trimmed}"` };
  }
  const below = /^<\s*(.*)$/.exec(trimmed);
  if (below && numberPattern.test(below[1])) {
    const limit = Number(below[1]);
    return limit > 0 ? { kind: 'below', limit } : { kind: 'bad', message: `a detection limit must be above 0, got "${trimmed}"` };
  }
  if (nonDetectWords.test(trimmed)) return { kind: 'below', limit: null };
  return { kind: 'bad', message: `expected a number or "<LOD" (e.g. 0.35 or <0.02), got "${trimmed}"` };
}

/**
 * Reads every row against the mapping; returns the rows that read well and every problem.
 * Request-level mistakes (a mapped column that does not exist, no group or unit at all) are a
 * 400 naming the `mapping.…` or `defaults.…` field before any row is read.
 */
function readRows(file: LabFile, commit: LabImportCommit, lookups: Lookups, latestDate: string): { rows: SampleRow[]; problems: LabImportProblem[] } {
  const fields: Record<string, string> = {};
  const indexOf = new Map<LabImportField, number>();
  for (const [field, column] of Object.entries(commit.mapping) as Array<[LabImportField, string | null | undefined]>) {
    if (!column) continue;
    const index = file.header.findIndex((name) => name.toLowerCase() === column.toLowerCase());
    if (index < 0) fields[`mapping.${field}`] = `No column "${column}" in the file (its columns: ${file.header.join(', ')})`;
    else indexOf.set(field, index);
  }
  let defaultGroup: ExposureGroup | undefined;
  if (commit.defaults.exposureGroupId !== undefined) {
    defaultGroup = lookups.groupsById.get(commit.defaults.exposureGroupId);
    if (!defaultGroup) fields['defaults.exposureGroupId'] = `No exposure group ${commit.defaults.exposureGroupId} in this organization`;
    else if (defaultGroup.archived) fields['defaults.exposureGroupId'] = `Exposure group "${defaultGroup.name}" is archived`;
  }
  if (!commit.mapping.group && commit.defaults.exposureGroupId === undefined)
    fields['mapping.group'] = 'Map the column that names each row’s exposure group, or give defaults.exposureGroupId for every row';
  if (!commit.mapping.unit && commit.defaults.unit === undefined)
    fields['mapping.unit'] = 'Map the unit column, or give defaults.unit (the unit of every value)';
  if (Boolean(commit.mapping.startTime) !== Boolean(commit.mapping.endTime))
    fields[commit.mapping.startTime ? 'mapping.endTime' : 'mapping.startTime'] = 'Map both the start and the end time columns, or neither';
  if (Object.keys(fields).length > 0) throw fieldErrors(fields);

  const problems: LabImportProblem[] = [];
  const rows: SampleRow[] = [];
  const columnOf = (field: LabImportField) => file.header[indexOf.get(field)!];
  for (const record of file.rows) {
    const cell = (field: LabImportField) => {
      const index = indexOf.get(field);
      return index === undefined ? '' : (record.values[index] ?? '').trim();
    };
    const problem = (field: LabImportField | null, message: string) =>
      problems.push({ row: record.row, column: field === null ? null : columnOf(field), message });
    const before = problems.length;

    const code = cell('workerCode');
    const worker = lookups.workersByCode.get(code.toLowerCase());
    if (code === '') problem('workerCode', 'the worker code is empty');
    else if (!worker) problem('workerCode', `no worker "${code}" in this organization`);

    const dateText = cell('date');
    const date = parseDate(dateText, commit.dateFormat);
    if (dateText === '') problem('date', 'the date is empty');
    else if (!date) problem('date', `expected a date written ${commit.dateFormat}, got "${dateText}" (choose the file's date format if it uses another)`);
    else if (date > latestDate) problem('date', `${date} is in the future`);

    let group = defaultGroup;
    if (indexOf.has('group')) {
      const text = cell('group');
      if (text !== '') {
        const matches = /^\d+$/.test(text)
          ? [lookups.groupsById.get(Number(text))].filter((item) => item !== undefined)
          : (lookups.groupsByName.get(text.toLowerCase()) ?? []);
        group = undefined;
        if (matches.length === 0) problem('group', `no exposure group "${text}" in this organization`);
        else if (matches.length > 1)
          problem('group', `"${text}" names ${matches.length} groups (ids ${matches.map((item) => item.id).join(', ')}): use the group id`);
        else if (matches[0].archived) problem('group', `exposure group "${matches[0].name}" is archived`);
        else group = matches[0];
      } else if (!defaultGroup) problem('group', 'the exposure group is empty');
    }

    let agent = group ? lookups.agentsById.get(group.agentId) : undefined;
    if (indexOf.has('agent') && cell('agent') !== '') {
      const text = cell('agent');
      const named = lookups.agentsByKey.get(text.toLowerCase()) ?? lookups.agentsByKey.get(text);
      if (!named) problem('agent', `no agent "${text}" in this organization`);
      else if (group && named.id !== group.agentId) problem('agent', `"${named.name}" is not the agent of "${group.name}" (which is for "${agent?.name}")`);
      if (!named || (group && named.id !== group.agentId)) agent = undefined;
    }

    if (worker && group && date && date <= latestDate) {
      const periods = lookups.memberships.get(`${worker.id}|${group.id}`) ?? [];
      if (!periods.some((period) => period.fromDate <= date && (period.toDate === null || period.toDate >= date))) {
        const words =
          periods.length === 0 ? 'never a member' : `member ${periods.map((period) => `${period.fromDate} – ${period.toDate ?? 'open'}`).join(', ')}`;
        problem('workerCode', `${worker.code} is not a member of "${group.name}" on ${date} (${words})`);
      }
    }

    let unit: ExposureUnit | undefined = commit.defaults.unit;
    if (indexOf.has('unit')) {
      const text = cell('unit');
      if (text !== '') {
        unit = parseUnit(text);
        if (!unit) problem('unit', `unknown unit "${text}" (use mg/m3, µg/m3, ppm, f/cc, dBA or % dose)`);
      } else if (!commit.defaults.unit) problem('unit', 'the unit is empty');
    }

    const reading = readValue(cell('value'));
    let nonDetect = false;
    let reportedValue: number | undefined;
    if (reading.kind === 'bad') problem('value', reading.message);
    else if (reading.kind === 'number') reportedValue = reading.value;
    else {
      nonDetect = true;
      const limitText = cell('detectionLimit');
      const columnLimit = limitText !== '' && numberPattern.test(limitText.replace(/^<\s*/, '')) ? Number(limitText.replace(/^<\s*/, '')) : undefined;
      if (limitText !== '' && (columnLimit === undefined || columnLimit <= 0))
        problem('detectionLimit', `expected a detection limit above 0, got "${limitText}"`);
      else if (reading.limit !== null && columnLimit !== undefined && Math.abs(reading.limit - columnLimit) > 1e-12 * Math.max(reading.limit, columnLimit))
        problem('detectionLimit', `the value says <${reading.limit} but this column says ${limitText}`);
      else if (reading.limit === null && columnLimit === undefined)
        problem('value', `"${cell('value')}" needs its detection limit: write it as "<0.02", or map the detection-limit column`);
      reportedValue = reading.limit ?? columnLimit;
    }

    let conversion: ReturnType<typeof conversionBetween> | undefined;
    if (unit && group && agent) {
      conversion = conversionBetween(unit, group.oelUnit, agent);
      if (!conversion.ok) problem(indexOf.has('unit') ? 'unit' : null, `${conversion.message}${indexOf.has('unit') ? '' : ' (defaults.unit)'}`);
    }

    const sampleId = cell('sampleId') || null;
    if (sampleId && sampleId.length > 100) problem('sampleId', 'the sample id is longer than 100 characters');
    const lab = cell('lab') || null;
    if (lab && lab.length > 200) problem('lab', 'the lab name is longer than 200 characters');

    let minutes: number | null = null;
    let startMinute: number | null = null;
    let endMinute: number | null = null;
    const startTime = cell('startTime') || null;
    const endTime = cell('endTime') || null;
    if (date && (startTime || endTime)) {
      if (!startTime || !endTime) problem(startTime ? 'endTime' : 'startTime', 'give both the start and the end time of the sample, or neither');
      else {
        const period = sampleMinutes(startTime, endTime, date);
        if (!period.ok) problem(period.field, period.message);
        else ({ minutes, startMinute, endMinute } = period);
      }
    }
    const minutesText = cell('minutes');
    if (minutesText !== '') {
      const value = numberPattern.test(minutesText) ? Number(minutesText) : NaN;
      if (!(value > 0 && value <= 1440)) problem('minutes', `expected minutes above 0 and at most 1440, got "${minutesText}"`);
      else if (minutes !== null && Math.abs(minutes - value) > 1)
        problem('minutes', `${value} min does not match the start and end times (${Math.round(minutes * 10) / 10} min)`);
      else minutes ??= value;
    }

    if (problems.length > before || !worker || !group || !agent || !date || !unit || reportedValue === undefined || !conversion?.ok) continue;
    rows.push({
      row: record.row,
      worker,
      group,
      agent,
      date,
      reportedValue,
      reportedUnit: unit,
      nonDetect,
      value: conversion.convert(reportedValue),
      conversion: conversion.details,
      sampleId,
      lab,
      startTime,
      endTime,
      startMinute,
      endMinute,
      minutes,
    });
  }
  return { rows, problems };
}

/** A shift result the import will store. */
export interface PlannedShiftResult {
  rows: number[];
  group: ExposureGroup;
  worker: Worker;
  agent: Agent;
  date: string;
  value: number;
  nonDetect: boolean;
  detectionLimit: number | null;
  sampleId: string | null;
  lab: string | null;
  startTime: string | null;
  endTime: string | null;
  sampledMinutes: number | null;
  reportedValue: number | null;
  reportedUnit: ExposureUnit | null;
  details: ShiftResultDetails;
}

function formatNumber(value: number): string {
  return String(Number(value.toPrecision(4)));
}

/** Combines one worker-shift's samples into its result, or adds problems. */
function combineShift(
  parts: SampleRow[],
  commit: LabImportCommit,
  problems: LabImportProblem[],
  needsAssumption: { count: number },
): PlannedShiftResult | undefined {
  const first = parts[0];
  const { group, worker, agent, date } = first;
  const unitLabel = exposureUnitLabels[group.oelUnit];
  const shiftMinutes = (commit.shiftHours ?? group.shiftHours) * 60;
  const shiftWords = `${worker.code} on ${date} in "${group.name}"`;
  const conversions = parts.map((part) => part.conversion).filter((item) => item !== undefined);
  const conversionWords =
    conversions.length > 0
      ? ` Values converted from ${exposureUnitLabels[conversions[0].from]} to ${unitLabel} (${conversions[0].source}${conversions[0].molecularWeight ? `, MW ${conversions[0].molecularWeight} g/mol` : ''}).`
      : '';
  const flags: string[] = [];
  const partDetails: ShiftResultPart[] = parts.map((part) => ({
    row: part.row,
    sampleId: part.sampleId,
    startTime: part.startTime,
    endTime: part.endTime,
    minutes: part.minutes,
    reportedValue: part.reportedValue,
    reportedUnit: part.reportedUnit,
    nonDetect: part.nonDetect,
    value: part.value,
  }));
  const sampleIds = [...new Set(parts.map((part) => part.sampleId).filter((item) => item !== null))];
  const labs = [...new Set(parts.map((part) => part.lab).filter((item) => item !== null))];
  const starts = parts.filter((part) => part.startMinute !== null).sort((a, b) => a.startMinute! - b.startMinute!);
  const common = {
    rows: parts.map((part) => part.row),
    group,
    worker,
    agent,
    date,
    sampleId: sampleIds.length > 0 ? sampleIds.join(' + ').slice(0, 400) : null,
    lab: labs.length > 0 ? labs.join(' + ').slice(0, 400) : null,
    startTime: starts[0]?.startTime ?? null,
    endTime: starts.length > 0 ? [...starts].sort((a, b) => b.endMinute! - a.endMinute!)[0].endTime : null,
  };

  // One sample and no duration, or one covering the whole shift: the lab's figure is the shift result.
  const single = parts.length === 1 && (first.minutes === null || Math.abs(first.minutes - shiftMinutes) <= 1);
  if (single) {
    const statement =
      (first.nonDetect
        ? `One sample, below its detection limit of ${formatNumber(first.value)} ${unitLabel}: the shift result is a non-detect.`
        : `One sample taken as the shift result${first.minutes === null ? ' (the file gives no sample duration: the lab’s figure is taken to cover the shift)' : ', covering the whole shift'}.`) +
      conversionWords;
    return {
      ...common,
      value: first.value,
      nonDetect: first.nonDetect,
      detectionLimit: first.nonDetect ? first.value : null,
      sampledMinutes: first.minutes,
      reportedValue: first.reportedValue,
      reportedUnit: first.reportedUnit,
      details: {
        statement,
        parts: partDetails,
        combination: {
          assumption: 'single',
          formula: 'the sample’s value',
          sampledMinutes: first.minutes,
          averagingMinutes: first.minutes,
          shiftMinutes,
          lowerBound: first.nonDetect ? 0 : first.value,
          upperBound: first.value,
          nonDetectParts: first.nonDetect ? 1 : 0,
        },
        conversion: first.conversion,
        flags,
      },
    };
  }

  const missing = parts.filter((part) => part.minutes === null);
  if (missing.length > 0) {
    for (const part of missing)
      problems.push({
        row: part.row,
        column: null,
        message: `${shiftWords} has ${parts.length} samples: each needs its minutes or its start and end times to be combined into a shift TWA`,
      });
    return undefined;
  }
  for (let index = 1; index < starts.length; index++) {
    const previous = starts[index - 1];
    const current = starts[index];
    if (current.startMinute! < previous.endMinute!)
      problems.push({
        row: current.row,
        column: null,
        message: `this sample (${current.startTime}–${current.endTime}) overlaps the one in row ${previous.row} (${previous.startTime}–${previous.endTime})`,
      });
  }
  if (!commit.unsampledTime) {
    needsAssumption.count += 1;
    return undefined;
  }
  let twa;
  try {
    twa = shiftTwa(
      parts.map((part) => ({ concentration: part.value, minutes: part.minutes!, nonDetect: part.nonDetect })),
      { assumption: commit.unsampledTime, shiftMinutes },
    );
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
    const sampled = parts.reduce((sum, part) => sum + part.minutes!, 0);
    problems.push({
      row: first.row,
      column: null,
      message: `the samples of ${shiftWords} cover ${formatNumber(sampled)} min, more than the ${formatNumber(shiftMinutes)}-min shift: check the times, or give the shift length (shiftHours)`,
    });
    return undefined;
  }
  const formula =
    commit.unsampledTime === 'zero'
      ? `TWA = Σ(Cᵢ·tᵢ)/T, T = ${formatNumber(twa.averagingMinutes)} min (the shift)`
      : `TWA = Σ(Cᵢ·tᵢ)/Σtᵢ, Σtᵢ = ${formatNumber(twa.averagingMinutes)} min (the sampled time)`;
  const assumptionWords =
    twa.unsampledMinutes <= 0
      ? 'the samples cover the whole shift'
      : commit.unsampledTime === 'zero'
        ? `the ${formatNumber(twa.unsampledMinutes)} unsampled minutes of the ${formatNumber(shiftMinutes)}-min shift are taken as zero exposure`
        : `the ${formatNumber(twa.unsampledMinutes)} unsampled minutes of the ${formatNumber(shiftMinutes)}-min shift are taken as exposed at the average of the sampled periods`;
  let nonDetectWords = '';
  if (twa.nonDetect) nonDetectWords = ' Every sample was below its detection limit: the shift result is a non-detect below the TWA of the limits.';
  else if (twa.nonDetectPeriods > 0) {
    nonDetectWords = ` ${twa.nonDetectPeriods} of ${parts.length} samples were below detection and are counted at their detection limits: the result is an upper bound (with them at zero it would be ${formatNumber(twa.lowerBound)} ${unitLabel}).`;
    flags.push(
      `Upper bound: ${twa.nonDetectPeriods} non-detect sample(s) counted at the detection limit; lower bound ${formatNumber(twa.lowerBound)} ${unitLabel}.`,
    );
  }
  const statement = `Shift TWA from ${parts.length} sample${parts.length === 1 ? '' : 's'} (${formatNumber(twa.sampledMinutes)} min): ${formula}; ${assumptionWords}.${nonDetectWords}${conversionWords} Source: ${twaSource}.`;
  return {
    ...common,
    value: twa.twa,
    nonDetect: twa.nonDetect,
    detectionLimit: twa.nonDetect ? twa.twa : null,
    sampledMinutes: twa.sampledMinutes,
    reportedValue: null,
    reportedUnit: null,
    details: {
      statement,
      parts: partDetails,
      combination: {
        assumption: commit.unsampledTime,
        formula,
        sampledMinutes: twa.sampledMinutes,
        averagingMinutes: twa.averagingMinutes,
        shiftMinutes,
        lowerBound: twa.lowerBound,
        upperBound: twa.upperBound,
        nonDetectParts: twa.nonDetectPeriods,
      },
      conversion: first.conversion ?? conversions[0],
      flags,
    },
  };
}

/**
 * Reads the batch with the mapping and plans every shift result, or throws a 400 listing every
 * problem (rows, columns, duplicates of stored results, shifts that cannot be combined).
 */
function planImport(db: Tx, clock: Clock, batch: ImportBatch, commit: LabImportCommit): PlannedShiftResult[] {
  const file = parseLabFile(batch.content);
  const lookups = loadLookups(db, batch.organizationId);
  const { rows, problems } = readRows(file, commit, lookups, latestPossibleDate(clock));
  const shifts = new Map<string, SampleRow[]>();
  for (const row of rows) {
    const key = shiftKey(row.worker.id, row.date, row.group.id, row.agent.id);
    const parts = shifts.get(key) ?? [];
    const repeated = row.sampleId === null ? undefined : parts.find((part) => part.sampleId?.toLowerCase() === row.sampleId!.toLowerCase());
    if (repeated) {
      problems.push({ row: row.row, column: null, message: `repeats row ${repeated.row} (same worker, date, group, agent and sample id "${row.sampleId}")` });
      continue;
    }
    shifts.set(key, [...parts, row]);
  }
  const planned: PlannedShiftResult[] = [];
  const needsAssumption = { count: 0 };
  for (const [key, parts] of shifts) {
    const stored = lookups.validResults.get(key);
    if (stored) {
      const duplicates = parts.filter((part) => part.sampleId !== null && stored.sampleIds.has(part.sampleId.toLowerCase()));
      for (const part of duplicates)
        problems.push({
          row: part.row,
          column: null,
          message: `duplicate of result ${stored.id}, already stored (same worker, date, group, agent and sample id "${part.sampleId}")`,
        });
      if (duplicates.length === 0)
        problems.push({
          row: parts[0].row,
          column: null,
          message: `${parts[0].worker.code} already has a valid result in "${parts[0].group.name}" on ${parts[0].date} (result ${stored.id}): void it before importing another`,
        });
      continue;
    }
    const result = combineShift(parts, commit, problems, needsAssumption);
    if (result) planned.push(result);
  }
  const fields: Record<string, string> = {};
  if (needsAssumption.count > 0) {
    const message = `${needsAssumption.count} shift(s) combine samples or cover only part of the shift: choose what the unsampled time is taken as (zero or sampled-average)`;
    problems.push({ row: null, column: null, message: `unsampledTime: ${message}` });
    fields.unsampledTime = message;
  }
  if (problems.length > 0) {
    problems.sort((a, b) => (a.row ?? 0) - (b.row ?? 0));
    throw importRejected('The lab import was refused', problems, Object.keys(fields).length > 0 ? fields : undefined);
  }
  return planned;
}

function uploadedBatch(db: Tx, organizationId: number, batchId: number): ImportBatch {
  const batch = findBatch(db, organizationId, batchId);
  if (batch.status === 'committed')
    throw new Conflict(`Lab import ${batch.id} was already committed on ${batch.committedAt}: upload the file again to import it once more`);
  return batch;
}

/** What a check (dry run) returns: the results the commit would store. */
export function checkLabImport(db: Db, clock: Clock, input: { organizationId: number; batchId: number; commit: LabImportCommit }) {
  const batch = uploadedBatch(db, input.organizationId, input.batchId);
  const planned = planImport(db, clock, batch, input.commit);
  return {
    batch: summaryOf(batch),
    resultCount: planned.length,
    results: planned.map((result) => ({
      rows: result.rows,
      workerCode: result.worker.code,
      date: result.date,
      exposureGroupId: result.group.id,
      exposureGroupName: result.group.name,
      value: result.value,
      unit: result.group.oelUnit,
      nonDetect: result.nonDetect,
      detectionLimit: result.detectionLimit,
      sampleId: result.sampleId,
      statement: result.details.statement,
      flags: result.details.flags,
    })),
  };
}

/**
 * Commits the batch: every planned result is stored in one transaction (all or nothing), each
 * audited; each group's data version moves once; the batch records the mapping and the count.
 * The answer lists the stored results, read back in one query.
 */
export function commitLabImport(
  db: Db,
  clock: Clock,
  input: { organizationId: number; batchId: number; actor: Actor; commit: LabImportCommit },
  access: NameAccess,
): { batch: ImportBatchSummary; results: ShiftResultView[] } {
  const now = clock.now();
  db.transaction((tx) => {
    const batch = uploadedBatch(tx, input.organizationId, input.batchId);
    const planned = planImport(tx, clock, batch, input.commit);
    const writer = shiftResultWriter(tx);
    const created = planned.map(
      (result) =>
        insertShiftResult(
          tx,
          now,
          input.actor,
          {
            organizationId: input.organizationId,
            group: result.group,
            worker: result.worker,
            agent: result.agent,
            date: result.date,
            value: result.value,
            nonDetect: result.nonDetect,
            detectionLimit: result.detectionLimit,
            source: 'lab-import',
            sampleId: result.sampleId,
            lab: result.lab,
            startTime: result.startTime,
            endTime: result.endTime,
            sampledMinutes: result.sampledMinutes,
            reportedValue: result.reportedValue,
            reportedUnit: result.reportedUnit,
            details: result.details,
            importBatchId: batch.id,
          },
          { touchGroup: false, writer },
        ).id,
    );
    for (const groupId of new Set(planned.map((result) => result.group.id))) touchGroupResults(tx, groupId, now);

    tx.update(importBatches)
      .set({
        status: 'committed',
        mapping: input.commit,
        resultCount: created.length,
        committedByUserId: input.actor?.id ?? null,
        committedAt: now.toISOString(),
        updatedAt: now.toISOString(),
      })
      .where(eq(importBatches.id, batch.id))
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'import_batch',
      entityId: batch.id,
      action: 'committed',
      before: { status: 'uploaded' },
      after: { status: 'committed', sha256: batch.sha256, resultCount: created.length, unsampledTime: input.commit.unsampledTime ?? null },
      at: now,
    });
  });
  return {
    batch: summaryOf(findBatch(db, input.organizationId, input.batchId)),
    results: getShiftResultsOfImport(db, input.organizationId, input.batchId, access),
  };
}
