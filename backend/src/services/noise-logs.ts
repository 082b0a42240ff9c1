import { createHash } from 'node:crypto';
import { and, asc, desc, eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { agents } from '@schema/agents';
import { exposureGroups, type ExposureGroup } from '@schema/exposure-groups';
import {
  noiseLogChannels,
  noiseLogs,
  noiseMappingPresets,
  noiseMasks,
  type NoiseChannelName,
  type NoiseColumnMapping,
  type NoiseLogRow,
  type NoiseLogStoredMetadata,
  type NoiseLogSummary,
  type NoiseMask,
  type NoiseSettingsValues,
} from '@schema/noise-logs';
import { organizations, organizationSettings } from '@schema/organizations';
import { shiftResults, type ShiftResultDetails } from '@schema/shift-results';
import { users } from '@schema/users';
import { workers } from '@schema/workers';
import { analyzePreparedNoiseLog, prepareNoiseAnalysis, type NoiseAnalysis, type PreparedNoiseAnalysis } from '@stats/noise-analyze';
import { noiseLogFromChannels, type NoiseLog } from '@stats/noise-log';
import { decodeNoiseLogBytes, NoiseLogError, parseNoiseLog } from '@stats/noise-log-parse';
import { resolveNoiseSettings, type NoiseSettings } from '@stats/noise-settings';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { BadRequest, Conflict, NotFound } from '../errors';
import { audit, fieldError, ownedOrNotFound, type Actor, type Tx } from './changes';
import { exposureGroupFromBody, touchGroupResults } from './exposure-groups';
import { saveOrganizationSettings } from './organization-settings';
import { insertShiftResult } from './shift-results';
import { isMemberOn, periodsInWords, workerFromBody } from './workers';

/*
 * Noise logs: upload (our format v1, or any CSV through a column mapping), storage of the raw file
 * and the parsed channels, masks and reviewed figures, acceptance into the group as a shift result.
 * Computation is stats/noise-analyze.ts (docs/decisions/004); this file only stores and wires it.
 */

// ---------------------------------------------------------------- settings

/** The organization's noise settings (organization settings JSON, PRODUCT.md defaults). */
export function organizationNoiseSettings(db: Tx, organizationId: number): NoiseSettingsValues {
  const row = db.select({ settings: organizations.settings }).from(organizations).where(eq(organizations.id, organizationId)).get();
  const parsed = organizationSettings.safeParse(row?.settings ?? {});
  const settings = parsed.success ? parsed.data : organizationSettings.parse({});
  return {
    stillMinutes: settings.stillMinutes,
    motionChangeMg: settings.motionChangeMg,
    knockMg: settings.knockMg,
    maskBeforeS: settings.maskBeforeS,
    maskAfterS: settings.maskAfterS,
    driftLimitDb: settings.driftLimitDb,
  };
}

/** The organization's settings in the names of stats/noise-settings.ts. */
export function toStatsSettings(values: NoiseSettingsValues): NoiseSettings {
  return resolveNoiseSettings({
    stillMinutes: values.stillMinutes,
    motionThresholdMg: values.motionChangeMg,
    knockThresholdMg: values.knockMg,
    maskBeforeS: values.maskBeforeS,
    maskAfterS: values.maskAfterS,
    driftLimitDb: values.driftLimitDb,
  });
}

/** Saves the organization's noise settings (audited). Logs already uploaded keep the settings they were checked with. */
export function updateNoiseSettings(db: Db, clock: Clock, input: { organizationId: number; actor: Actor; values: NoiseSettingsValues }): NoiseSettingsValues {
  saveOrganizationSettings(db, clock, {
    organizationId: input.organizationId,
    actor: input.actor,
    values: input.values,
    action: 'noise_settings_changed',
    before: (tx) => organizationNoiseSettings(tx, input.organizationId),
  });
  return organizationNoiseSettings(db, input.organizationId);
}

// ---------------------------------------------------------------- reading files

/** A file problem as a 400 naming the row and column (nothing is stored). */
function fileError(error: NoiseLogError, fileName: string): BadRequest {
  return new BadRequest(
    `${fileName}: ${error.message}; nothing was stored`,
    { file: error.message },
    {
      problems: [{ row: error.row, column: error.column ?? error.metadataKey, message: error.detail }],
    },
  );
}

/** True when the first non-blank line is our `# noise-log:` marker (BOM allowed). */
export function looksLikeNoiseLogV1(text: string): boolean {
  const first = text
    .replace(/^\ufeff/, '')
    .split('\n')
    .find((line) => line.trim() !== '');
  return first !== undefined && /^#\s*noise-log\s*:/i.test(first.trim());
}

/** Headers and first rows of any CSV, for the column-mapping step. */
export function previewNoiseCsv(bytes: Uint8Array, fileName: string) {
  let text: string;
  try {
    text = decodeNoiseLogBytes(bytes);
  } catch (error) {
    if (error instanceof NoiseLogError) throw fileError(error, fileName);
    throw error;
  }
  if (looksLikeNoiseLogV1(text)) return { format: 'v1' as const, delimiter: ',', headers: [] as string[], rows: [] as string[][], headerRow: null };
  const lines = text.replace(/^\ufeff/, '').split('\n');
  let headerIndex = lines.findIndex((line) => line.trim() !== '' && !line.trim().startsWith('#'));
  if (headerIndex < 0) throw fileError(new NoiseLogError('the file has no header row'), fileName);
  const head = lines.slice(headerIndex, headerIndex + 11).join('\n');
  const parsed = Papa.parse<string[]>(head, { skipEmptyLines: true });
  const [headers = [], ...rows] = parsed.data.map((row) => row.map((cell) => cell.trim()));
  headerIndex += 1;
  return { format: 'csv' as const, delimiter: parsed.meta.delimiter, headers, rows, headerRow: headerIndex };
}

const timeFactor = { s: 1, ms: 0.001, min: 60 } as const;

/**
 * Reads any CSV with a column mapping into a noise log: picks the mapped columns by header,
 * converts time to seconds from the first row and acceleration to mg, then applies the same
 * ranges and time rules as our format (noiseLogFromChannels). Throws NoiseLogError with the row.
 */
export function readMappedNoiseCsv(text: string, mapping: NoiseColumnMapping): NoiseLog {
  const parsed = Papa.parse<string[]>(text.replace(/^\ufeff/, ''), { skipEmptyLines: false });
  const rows = parsed.data;
  const headerIndex = rows.findIndex((row) => row.some((cell) => cell.trim() !== '') && !row[0].trim().startsWith('#'));
  if (headerIndex < 0) throw new NoiseLogError('the file is empty');
  const headers = rows[headerIndex].map((cell) => cell.trim());
  const find = (name: string | null | undefined, role: string): number | null => {
    if (!name) return null;
    const index = headers.indexOf(name);
    if (index < 0) throw new NoiseLogError(`the ${role} column "${name}" is not in the header (${headers.join(', ')})`, { row: headerIndex + 1, column: name });
    return index;
  };
  const columns = {
    time: find(mapping.time, 'time'),
    level: find(mapping.level, 'level'),
    peak: find(mapping.peak, 'peak'),
    x: find(mapping.accelerationX, 'acceleration x'),
    y: find(mapping.accelerationY, 'acceleration y'),
    z: find(mapping.accelerationZ, 'acceleration z'),
    apeak: find(mapping.accelerationPeak, 'acceleration peak'),
    moving: find(mapping.moving, 'motion'),
  };
  const axes = [columns.x, columns.y, columns.z].filter((column) => column !== null).length;
  if (axes !== 0 && axes !== 3) throw new NoiseLogError('map all three acceleration axes (x, y, z) or none', { row: headerIndex + 1 });
  const gFactor = mapping.accelerationUnit === 'g' ? 1000 : 1;
  const dataRows: { row: number; cells: string[] }[] = [];
  for (let i = headerIndex + 1; i < rows.length; i++) {
    const cells = rows[i];
    if (cells.every((cell) => cell.trim() === '')) continue;
    dataRows.push({ row: i + 1, cells });
  }
  if (dataRows.length === 0) throw new NoiseLogError('the file has a header but no data rows', { row: headerIndex + 1 });
  const length = dataRows.length;
  const channel = () => new Float64Array(length);
  const tS = channel();
  const laeqDb = channel();
  const lcPeakDb = columns.peak === null ? null : channel();
  const xMg = axes ? channel() : null;
  const yMg = axes ? channel() : null;
  const zMg = axes ? channel() : null;
  const apeakMg = columns.apeak === null ? null : channel();
  const moving = columns.moving === null ? null : new Uint8Array(length);
  const read = (entry: { row: number; cells: string[] }, column: number, name: string): number => {
    const text = (entry.cells[column] ?? '').trim();
    if (!/^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(text)) {
      const why =
        text === ''
          ? 'empty value'
          : /^[+-]?\d+,\d+$/.test(text)
            ? `decimal comma in "${text}": write decimals with a point`
            : `expected a number, got "${text}"`;
      throw new NoiseLogError(why, { row: entry.row, column: name });
    }
    return Number(text);
  };
  let firstTime = 0;
  dataRows.forEach((entry, i) => {
    const time = read(entry, columns.time!, headers[columns.time!]) * timeFactor[mapping.timeUnit];
    if (i === 0) firstTime = time;
    tS[i] = Math.round((time - firstTime) * 1e6) / 1e6;
    if (i > 0 && tS[i] <= tS[i - 1]) {
      throw new NoiseLogError(`time ${tS[i]} s does not increase (previous row ${tS[i - 1]} s)`, { row: entry.row, column: headers[columns.time!] });
    }
    laeqDb[i] = read(entry, columns.level!, headers[columns.level!]);
    if (lcPeakDb) lcPeakDb[i] = read(entry, columns.peak!, headers[columns.peak!]);
    if (xMg && yMg && zMg) {
      xMg[i] = read(entry, columns.x!, headers[columns.x!]) * gFactor;
      yMg[i] = read(entry, columns.y!, headers[columns.y!]) * gFactor;
      zMg[i] = read(entry, columns.z!, headers[columns.z!]) * gFactor;
    }
    if (apeakMg) apeakMg[i] = read(entry, columns.apeak!, headers[columns.apeak!]) * gFactor;
    if (moving) {
      const flag = read(entry, columns.moving!, headers[columns.moving!]);
      if (flag !== 0 && flag !== 1) throw new NoiseLogError(`motion must be 0 or 1, got ${flag}`, { row: entry.row, column: headers[columns.moving!] });
      moving[i] = flag;
    }
  });
  const metadata: NoiseLogStoredMetadata = {
    version: 1,
    intervalSeconds: mapping.intervalSeconds,
    instrument: null,
    worker: null,
    start: null,
    shiftHours: null,
    calibrationReferenceDb: null,
    calibrationBeforeDb: null,
    calibrationAfterDb: null,
    other: { mapped_time_offset_s: String(firstTime) },
  };
  try {
    return noiseLogFromChannels({ metadata, tS, laeqDb, lcPeakDb, acceleration: xMg && yMg && zMg ? { xMg, yMg, zMg } : null, apeakMg, moving });
  } catch (error) {
    if (error instanceof RangeError) {
      // "channel[i] = value is outside …" → the file row of index i.
      const match = /noiseLogFromChannels: (\w+)(?:\.(\w+))?\[(\d+)\]/.exec(error.message);
      const index = match ? Number(match[3]) : null;
      const detail = error.message.replace(/^noiseLogFromChannels: /, '');
      throw new NoiseLogError(`${detail} (check the units)`, { row: index === null ? null : dataRows[index].row });
    }
    throw error;
  }
}

// ---------------------------------------------------------------- storage

function channelBytes(values: Float64Array | Uint8Array): Buffer {
  return Buffer.from(values.buffer, values.byteOffset, values.byteLength);
}

function channelsOf(log: NoiseLog): Partial<Record<NoiseChannelName, Float64Array | Uint8Array>> {
  return {
    tS: log.tS,
    laeqDb: log.laeqDb,
    ...(log.lcPeakDb ? { lcPeakDb: log.lcPeakDb } : {}),
    ...(log.acceleration ? { axMg: log.acceleration.xMg, ayMg: log.acceleration.yMg, azMg: log.acceleration.zMg } : {}),
    ...(log.apeakMg ? { apeakMg: log.apeakMg } : {}),
    ...(log.moving ? { moving: log.moving } : {}),
  };
}

/** Float64Array from stored bytes (copied: SQLite buffers need not be 8-byte aligned). */
function float64(buffer: Buffer): Float64Array {
  const copy = new Uint8Array(buffer.byteLength);
  copy.set(buffer);
  return new Float64Array(copy.buffer);
}

/** Rebuilds the parsed log from its stored channels. */
function loadLog(db: Tx, row: NoiseLogRow): NoiseLog {
  const stored = new Map(
    db
      .select({ channel: noiseLogChannels.channel, data: noiseLogChannels.data })
      .from(noiseLogChannels)
      .where(eq(noiseLogChannels.noiseLogId, row.id))
      .all()
      .map((entry) => [entry.channel, entry.data] as const),
  );
  const get = (name: NoiseChannelName) => {
    const data = stored.get(name);
    return data ? float64(data) : null;
  };
  const x = get('axMg');
  const y = get('ayMg');
  const z = get('azMg');
  const moving = stored.get('moving');
  return noiseLogFromChannels({
    metadata: row.metadata,
    tS: get('tS')!,
    laeqDb: get('laeqDb')!,
    lcPeakDb: get('lcPeakDb'),
    acceleration: x && y && z ? { xMg: x, yMg: y, zMg: z } : null,
    apeakMg: get('apeakMg'),
    moving: moving ? new Uint8Array(moving) : null,
  });
}

/**
 * Prepared analyses per database and log (weights and wear check computed once), so a mask edit
 * only sums arrays (docs/decisions/004: under 1 ms for 43,200 rows). Channels never change after
 * upload, so an entry never goes stale; at most 16 logs per database are kept.
 */
const preparedCache = new WeakMap<object, Map<number, PreparedNoiseAnalysis>>();

function preparedOf(db: Tx, row: NoiseLogRow): PreparedNoiseAnalysis {
  const key = (db as { $client?: object }).$client ?? db;
  let cache = preparedCache.get(key);
  if (!cache) preparedCache.set(key, (cache = new Map()));
  const hit = cache.get(row.id);
  if (hit) {
    cache.delete(row.id);
    cache.set(row.id, hit);
    return hit;
  }
  const prepared = prepareNoiseAnalysis(loadLog(db, row), { settings: row.settings as Partial<NoiseSettings> });
  cache.set(row.id, prepared);
  if (cache.size > 16) cache.delete(cache.keys().next().value!);
  return prepared;
}

function activeMasks(db: Tx, logId: number): NoiseMask[] {
  return db
    .select()
    .from(noiseMasks)
    .where(and(eq(noiseMasks.noiseLogId, logId), eq(noiseMasks.status, 'active')))
    .orderBy(asc(noiseMasks.startS), asc(noiseMasks.id))
    .all();
}

function analysisOf(db: Tx, row: NoiseLogRow): { analysis: NoiseAnalysis; masks: NoiseMask[] } {
  const masks = activeMasks(db, row.id);
  const analysis = analyzePreparedNoiseLog(
    preparedOf(db, row),
    masks.map((mask) => ({ startS: mask.startS, endS: mask.endS })),
  );
  return { analysis, masks };
}

export interface NoiseUploadInput {
  organizationId: number;
  actor: Actor;
  exposureGroupId: number;
  workerId: number;
  instrument: string;
  shiftDate: string;
  fileName: string;
  bytes: Uint8Array;
  mapping?: NoiseColumnMapping | null;
  presetName?: string | null;
}

function noiseGroupOrError(tx: Tx, organizationId: number, groupId: number): ExposureGroup {
  const group = exposureGroupFromBody(tx, organizationId, groupId);
  const agent = tx.select({ kind: agents.kind }).from(agents).where(eq(agents.id, group.agentId)).get();
  if (agent?.kind !== 'noise') throw fieldError('exposureGroupId', `"${group.name}" is not a noise group: a noise log belongs to a group exposed to noise`);
  return group;
}

/**
 * Reads, checks and stores one uploaded noise log in one transaction: the raw file with its
 * SHA-256, the channels, the as-logged summary and the proposed masks for knocks. A bad file is a
 * 400 naming the row and column, and nothing is stored.
 */
export function uploadNoiseLog(
  db: Db,
  clock: Clock,
  input: NoiseUploadInput,
): { id: number; stillStretchOverLimit: boolean; longestStillMinutes: number | null } {
  const now = clock.now();
  let log: NoiseLog;
  try {
    const text = decodeNoiseLogBytes(input.bytes);
    if (input.mapping) log = readMappedNoiseCsv(text, input.mapping);
    else if (looksLikeNoiseLogV1(text)) log = parseNoiseLog(text);
    else {
      throw new NoiseLogError(
        'this is not a noise log in our format version 1 (the first line should be "# noise-log: 1"): map its columns to read it as any CSV',
        { row: 1 },
      );
    }
  } catch (error) {
    if (error instanceof NoiseLogError) throw fileError(error, input.fileName);
    throw error;
  }
  const settingsValues = organizationNoiseSettings(db, input.organizationId);
  const settings = toStatsSettings(settingsValues);
  const prepared = prepareNoiseAnalysis(log, { settings });
  const analysis = analyzePreparedNoiseLog(prepared);
  const stamp = now.toISOString();
  const id = db.transaction((tx) => {
    const group = noiseGroupOrError(tx, input.organizationId, input.exposureGroupId);
    const worker = workerFromBody(tx, input.organizationId, input.workerId);
    const summary: NoiseLogSummary = {
      asLogged: analysis.asLogged as unknown as Record<string, unknown>,
      maxLcPeakDb: analysis.maxLcPeakDb,
      calibrationDriftDb: analysis.calibrationDriftDb,
      stillStretchCount: analysis.stillStretches?.length ?? null,
      longestStillStretchSeconds: analysis.details.longestStillStretchSeconds,
      knockCount: analysis.knocks?.length ?? null,
    };
    const row = tx
      .insert(noiseLogs)
      .values({
        organizationId: input.organizationId,
        exposureGroupId: group.id,
        workerId: worker.id,
        instrument: input.instrument || log.metadata.instrument || '',
        shiftDate: input.shiftDate,
        uploadedByUserId: input.actor?.id ?? null,
        fileName: input.fileName,
        fileSize: input.bytes.byteLength,
        rawFile: Buffer.from(input.bytes.buffer, input.bytes.byteOffset, input.bytes.byteLength),
        sha256: createHash('sha256').update(input.bytes).digest('hex'),
        format: input.mapping ? 'mapped' : 'v1',
        mapping: input.mapping ?? null,
        metadata: { ...log.metadata, other: { ...log.metadata.other } },
        settings: { ...settings },
        intervalSeconds: log.intervalSeconds,
        intervalCount: log.length,
        runSeconds: analysis.runSeconds,
        summary,
        status: 'uploaded',
        createdAt: stamp,
        updatedAt: stamp,
      })
      .returning({ id: noiseLogs.id })
      .get();
    for (const [channel, values] of Object.entries(channelsOf(log)) as [NoiseChannelName, Float64Array | Uint8Array][]) {
      tx.insert(noiseLogChannels)
        .values({ noiseLogId: row.id, channel, data: channelBytes(values) })
        .run();
    }
    for (const mask of analysis.proposedMasks) {
      tx.insert(noiseMasks)
        .values({
          organizationId: input.organizationId,
          noiseLogId: row.id,
          startS: mask.startS,
          endS: mask.endS,
          reason: mask.reason,
          origin: 'proposed',
          authorUserId: null,
          createdAt: stamp,
          updatedAt: stamp,
        })
        .run();
    }
    if (input.mapping && input.presetName)
      saveMappingPreset(tx, now, { organizationId: input.organizationId, actor: input.actor, name: input.presetName, mapping: input.mapping });
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'noise_log',
      entityId: row.id,
      action: 'uploaded',
      after: {
        fileName: input.fileName,
        sha256: createHash('sha256').update(input.bytes).digest('hex'),
        exposureGroupId: group.id,
        workerId: worker.id,
        shiftDate: input.shiftDate,
        intervals: log.length,
        proposedMasks: analysis.proposedMasks.length,
      },
      at: now,
    });
    return row.id;
  });
  const longest = analysis.details.longestStillStretchSeconds;
  return {
    id,
    stillStretchOverLimit: (analysis.stillStretches?.length ?? 0) > 0,
    longestStillMinutes: longest === null ? null : longest / 60,
  };
}

// ---------------------------------------------------------------- views

function logRowOrNotFound(db: Tx, organizationId: number, logId: number): NoiseLogRow {
  return ownedOrNotFound(db, noiseLogs, organizationId, logId, 'noise log');
}

/** Columns for lists (never the raw file). */
const listColumns = {
  id: noiseLogs.id,
  exposureGroupId: noiseLogs.exposureGroupId,
  workerId: noiseLogs.workerId,
  instrument: noiseLogs.instrument,
  shiftDate: noiseLogs.shiftDate,
  fileName: noiseLogs.fileName,
  fileSize: noiseLogs.fileSize,
  sha256: noiseLogs.sha256,
  format: noiseLogs.format,
  intervalSeconds: noiseLogs.intervalSeconds,
  runSeconds: noiseLogs.runSeconds,
  summary: noiseLogs.summary,
  status: noiseLogs.status,
  shiftResultId: noiseLogs.shiftResultId,
  createdAt: noiseLogs.createdAt,
  workerCode: workers.code,
  exposureGroupName: exposureGroups.name,
  uploadedBy: users.name,
};

/** Noise logs of the organization, newest shift first, optionally of one group or worker. */
export function listNoiseLogs(db: Db, organizationId: number, query: { groupId?: number; workerId?: number }) {
  return db
    .select(listColumns)
    .from(noiseLogs)
    .innerJoin(workers, eq(workers.id, noiseLogs.workerId))
    .innerJoin(exposureGroups, eq(exposureGroups.id, noiseLogs.exposureGroupId))
    .leftJoin(users, eq(users.id, noiseLogs.uploadedByUserId))
    .where(
      and(
        eq(noiseLogs.organizationId, organizationId),
        query.groupId ? eq(noiseLogs.exposureGroupId, query.groupId) : undefined,
        query.workerId ? eq(noiseLogs.workerId, query.workerId) : undefined,
      ),
    )
    .orderBy(desc(noiseLogs.shiftDate), desc(noiseLogs.id))
    .all();
}

/** One log with everything the review page shows; figures recomputed from the active masks. */
export function getNoiseLog(db: Tx, organizationId: number, logId: number) {
  const row = logRowOrNotFound(db, organizationId, logId);
  const { analysis, masks } = analysisOf(db, row);
  const listed = db
    .select(listColumns)
    .from(noiseLogs)
    .innerJoin(workers, eq(workers.id, noiseLogs.workerId))
    .innerJoin(exposureGroups, eq(exposureGroups.id, noiseLogs.exposureGroupId))
    .leftJoin(users, eq(users.id, noiseLogs.uploadedByUserId))
    .where(eq(noiseLogs.id, row.id))
    .get()!;
  const group = db.select().from(exposureGroups).where(eq(exposureGroups.id, row.exposureGroupId)).get()!;
  const authors = new Map(
    db
      .select({ id: users.id, name: users.name })
      .from(users)
      .all()
      .map((user) => [user.id, user.name]),
  );
  const { details } = analysis;
  return {
    ...listed,
    metadata: row.metadata,
    mapping: row.mapping,
    settings: row.settings,
    intervalCount: row.intervalCount,
    acceptedAt: row.acceptedAt,
    group: {
      id: group.id,
      name: group.name,
      noiseCriteriaSet: group.noiseCriteriaSet,
      oelUnit: group.oelUnit,
      oelValue: group.oelValue,
      dataVersion: group.dataVersion,
    },
    figures: {
      runSeconds: analysis.runSeconds,
      intervalSeconds: analysis.intervalSeconds,
      maskedSeconds: analysis.maskedSeconds,
      asLogged: analysis.asLogged,
      reviewed: analysis.reviewed,
      maxLcPeakDb: analysis.maxLcPeakDb,
      calibrationDriftDb: analysis.calibrationDriftDb,
    },
    stillStretches: analysis.stillStretches,
    knocks: analysis.knocks,
    wearCheckAvailable: details.wearCheckAvailable,
    knockCheckAvailable: details.knockCheckAvailable,
    longestStillStretchSeconds: details.longestStillStretchSeconds,
    stillStretchNotice: (analysis.stillStretches?.length ?? 0) > 0,
    calibration: details.calibration,
    actionLevel: details.actionLevel,
    peakOver140Db: details.peakOver140Db,
    exposureHours: details.exposureHours,
    exposureHoursSource: details.exposureHoursSource,
    pauseCount: details.pauseCount,
    pauseSeconds: details.pauseSeconds,
    startS: details.startS,
    endS: details.endS,
    masks: masks.map((mask, index) => ({
      id: mask.id,
      startS: mask.startS,
      endS: mask.endS,
      reason: mask.reason,
      origin: mask.origin,
      author: mask.authorUserId === null ? null : (authors.get(mask.authorUserId) ?? null),
      createdAt: mask.createdAt,
      updatedAt: mask.updatedAt,
      effect: details.maskEffects[index],
    })),
  };
}
export type NoiseLogView = ReturnType<typeof getNoiseLog>;

function lowerBound(values: Float64Array, target: number): number {
  let low = 0;
  let high = values.length;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if (values[middle] < target) low = middle + 1;
    else high = middle;
  }
  return low;
}

/**
 * Level and peak for the chart between fromS and toS. Up to `points` intervals are sent as they
 * are; longer windows are cut into buckets and each bucket sends its lowest and highest LAeq (in
 * time order) and its highest LCpeak, so spikes and dips stay visible when zoomed out.
 */
export function noiseLogChannelData(db: Tx, organizationId: number, logId: number, query: { fromS?: number; toS?: number; points: number }) {
  const row = logRowOrNotFound(db, organizationId, logId);
  const { log } = preparedOf(db, row);
  const first = query.fromS === undefined ? 0 : Math.max(0, lowerBound(log.tS, query.fromS) - 1);
  const end = query.toS === undefined ? log.length : Math.min(log.length, lowerBound(log.tS, query.toS) + 1);
  const count = Math.max(0, end - first);
  const tS: number[] = [];
  const laeqDb: number[] = [];
  const peakT: number[] = [];
  const lcPeakDb: number[] = [];
  const peak = log.lcPeakDb;
  if (count <= query.points) {
    for (let i = first; i < end; i++) {
      tS.push(log.tS[i]);
      laeqDb.push(log.laeqDb[i]);
      if (peak) {
        peakT.push(log.tS[i]);
        lcPeakDb.push(peak[i]);
      }
    }
  } else {
    const buckets = Math.floor(query.points / 2);
    const size = count / buckets;
    for (let bucket = 0; bucket < buckets; bucket++) {
      const from = first + Math.floor(bucket * size);
      const to = Math.min(end, first + Math.floor((bucket + 1) * size));
      if (to <= from) continue;
      let low = from;
      let high = from;
      let peakAt = from;
      for (let i = from; i < to; i++) {
        if (log.laeqDb[i] < log.laeqDb[low]) low = i;
        if (log.laeqDb[i] > log.laeqDb[high]) high = i;
        if (peak && peak[i] > peak[peakAt]) peakAt = i;
      }
      for (const i of low <= high ? [low, high] : [high, low]) {
        tS.push(log.tS[i]);
        laeqDb.push(log.laeqDb[i]);
      }
      if (peak) {
        peakT.push(log.tS[peakAt]);
        lcPeakDb.push(peak[peakAt]);
      }
    }
  }
  return {
    fromS: count ? log.tS[first] : 0,
    toS: count ? log.tS[end - 1] + log.intervalSeconds : 0,
    intervalSeconds: log.intervalSeconds,
    downsampled: count > query.points,
    intervals: count,
    tS,
    laeqDb,
    peak: peak ? { tS: peakT, lcPeakDb } : null,
  };
}

/** The uploaded file, unchanged, with its name and hash. */
export function noiseLogFile(db: Tx, organizationId: number, logId: number) {
  const row = logRowOrNotFound(db, organizationId, logId);
  return { fileName: row.fileName, sha256: row.sha256, bytes: row.rawFile };
}

// ---------------------------------------------------------------- masks

type MaskChange =
  | { kind: 'add'; startS: number; endS: number; reason: string }
  | { kind: 'change'; maskId: number; startS: number; endS: number; reason: string }
  | { kind: 'remove'; maskId: number; reason: string };

function checkSpan(row: NoiseLogRow, log: NoiseLog, startS: number, endS: number): void {
  const logEnd = log.tS[log.length - 1] + log.intervalSeconds;
  if (startS >= logEnd) throw fieldError('startS', `The log ends at ${logEnd} s: a mask must start before that`);
  if (endS <= log.tS[0]) throw fieldError('endS', `The log starts at ${log.tS[0]} s: a mask must end after that`);
  if (!(endS > startS)) throw fieldError('endS', 'The end must be after the start');
  void row;
}

/**
 * Adds, changes or removes one mask with a reason (audited), recomputes the reviewed figures and,
 * when the log is already in the group, updates the linked shift result (audited) and moves the
 * group's data version so decision drafts made from the old figures are out of date.
 */
export function changeNoiseMask(db: Db, clock: Clock, input: { organizationId: number; logId: number; actor: Actor; change: MaskChange }) {
  const now = clock.now();
  const stamp = now.toISOString();
  db.transaction((tx) => {
    const row = logRowOrNotFound(tx, input.organizationId, input.logId);
    const { change } = input;
    const { log } = preparedOf(tx, row);
    if (change.kind === 'add') {
      checkSpan(row, log, change.startS, change.endS);
      const mask = tx
        .insert(noiseMasks)
        .values({
          organizationId: input.organizationId,
          noiseLogId: row.id,
          startS: change.startS,
          endS: change.endS,
          reason: change.reason,
          origin: 'reviewer',
          authorUserId: input.actor?.id ?? null,
          createdAt: stamp,
          updatedAt: stamp,
        })
        .returning()
        .get();
      audit(tx, {
        organizationId: input.organizationId,
        actor: input.actor,
        entityType: 'noise_mask',
        entityId: mask.id,
        action: 'created',
        reason: change.reason,
        after: { noiseLogId: row.id, startS: mask.startS, endS: mask.endS },
        at: now,
      });
    } else {
      const mask = tx
        .select()
        .from(noiseMasks)
        .where(and(eq(noiseMasks.id, change.maskId), eq(noiseMasks.noiseLogId, row.id)))
        .get();
      if (!mask) throw new NotFound(`No mask ${change.maskId} on noise log ${row.id}`);
      if (mask.status === 'removed') throw new Conflict(`Mask ${mask.id} was removed on ${mask.removedAt}; add a new mask instead`);
      if (change.kind === 'change') {
        checkSpan(row, log, change.startS, change.endS);
        tx.update(noiseMasks).set({ startS: change.startS, endS: change.endS, updatedAt: stamp }).where(eq(noiseMasks.id, mask.id)).run();
        audit(tx, {
          organizationId: input.organizationId,
          actor: input.actor,
          entityType: 'noise_mask',
          entityId: mask.id,
          action: 'changed',
          reason: change.reason,
          before: { startS: mask.startS, endS: mask.endS },
          after: { startS: change.startS, endS: change.endS },
          at: now,
        });
      } else {
        tx.update(noiseMasks)
          .set({ status: 'removed', removedByUserId: input.actor?.id ?? null, removedAt: stamp, updatedAt: stamp })
          .where(eq(noiseMasks.id, mask.id))
          .run();
        audit(tx, {
          organizationId: input.organizationId,
          actor: input.actor,
          entityType: 'noise_mask',
          entityId: mask.id,
          action: 'removed',
          reason: change.reason,
          before: { status: 'active', startS: mask.startS, endS: mask.endS },
          after: { status: 'removed' },
          at: now,
        });
      }
    }
    tx.update(noiseLogs)
      .set({ status: row.status === 'accepted' ? 'accepted' : 'reviewed', updatedAt: stamp })
      .where(eq(noiseLogs.id, row.id))
      .run();
    if (row.status === 'accepted' && row.shiftResultId !== null)
      updateLinkedResult(tx, now, input.actor, row, 'reason' in change ? change.reason : 'mask changed');
  });
  return getNoiseLog(db, input.organizationId, input.logId);
}

// ---------------------------------------------------------------- into the group

/** Details of a shift result accepted from a noise log: the common fields plus the log's reviewed figures. */
export type NoiseResultDetails = ShiftResultDetails & {
  noise: {
    noiseLogId: number;
    criteriaSet: string;
    dosePercent: number | null;
    twaDb: number | null;
    laeqDb: number | null;
    lex8hDb: number | null;
    maskedSeconds: number;
    runSeconds: number;
  };
};

/** The shift result value for the group's unit and criteria set, from the reviewed figures. */
function resultFigures(row: NoiseLogRow, group: ExposureGroup, analysis: NoiseAnalysis) {
  const criteria = group.noiseCriteriaSet ?? 'nioshRel';
  const reviewed = analysis.reviewed;
  const set = criteria === 'iso' ? null : reviewed[criteria];
  let value: number | null;
  let words: string;
  if (group.oelUnit === 'dose-percent') {
    if (set === null)
      throw new Conflict(`"${group.name}" is judged with ISO 9612 (LAeq, LEX,8h), which has no dose: set the group's criteria set or its OEL unit to dBA`);
    value = set.dose;
    words = `reviewed dose ${value === null ? '—' : value.toPrecision(4)} % (${criteria})`;
  } else if (group.oelUnit === 'dBA') {
    value = set === null ? reviewed.iso.lex8h : set.twa;
    words = set === null ? `reviewed LEX,8h ${value?.toFixed(1)} dB(A)` : `reviewed TWA ${value?.toFixed(1)} dB(A) (${criteria})`;
  } else {
    throw new Conflict(`"${group.name}" has its OEL in ${group.oelUnit}: a noise log gives a dose in % or a level in dBA`);
  }
  if (value === null || !(value > 0)) {
    throw new Conflict(
      `The reviewed figure for "${group.name}" is ${value === null ? 'not available (every interval is masked)' : '0 (no interval reaches the threshold)'}: it cannot be stored as a shift result`,
    );
  }
  const noise = {
    noiseLogId: row.id,
    criteriaSet: criteria,
    dosePercent: set?.dose ?? null,
    twaDb: set?.twa ?? null,
    laeqDb: reviewed.iso.laeq,
    lex8hDb: reviewed.iso.lex8h,
    maskedSeconds: analysis.maskedSeconds,
    runSeconds: analysis.runSeconds,
  };
  const statement = `From noise log ${row.id} (${row.fileName}, SHA-256 ${row.sha256.slice(0, 12)}…): ${words}, with ${Math.round(analysis.maskedSeconds)} s of ${Math.round(analysis.runSeconds)} s masked; the masked time is given the mean of the unmasked time. Interval levels only approximate a dosimeter's slow-weighted integration for a 5 dB exchange rate or a threshold (docs/decisions/004).`;
  const flags: string[] = [];
  if (analysis.details.calibration.exceedsLimit)
    flags.push(`Calibration drift ${analysis.calibrationDriftDb?.toFixed(2)} dB exceeds the ${analysis.details.calibration.limitDb} dB limit`);
  if ((analysis.stillStretches?.length ?? 0) > 0) flags.push('The wear check found a still stretch: the meter may not have been worn');
  // The shared details type has no noise block; the extra key travels in the same JSON column.
  const details: NoiseResultDetails = { statement, flags, noise };
  return { value, details };
}

function updateLinkedResult(tx: Tx, now: Date, actor: Actor, row: NoiseLogRow, reason: string): void {
  const result = tx.select().from(shiftResults).where(eq(shiftResults.id, row.shiftResultId!)).get();
  if (!result || result.status !== 'valid') return;
  const group = tx.select().from(exposureGroups).where(eq(exposureGroups.id, row.exposureGroupId)).get()!;
  const { analysis } = analysisOf(tx, row);
  const figures = resultFigures(row, group, analysis);
  tx.update(shiftResults).set({ value: figures.value, details: figures.details, updatedAt: now.toISOString() }).where(eq(shiftResults.id, result.id)).run();
  audit(tx, {
    organizationId: row.organizationId,
    actor,
    entityType: 'shift_result',
    entityId: result.id,
    action: 'updated',
    reason: `Masks of noise log ${row.id} changed: ${reason}`,
    before: { value: result.value },
    after: { value: figures.value },
    at: now,
  });
  touchGroupResults(tx, group.id, now);
}

/**
 * Accepts a reviewed log as the worker's shift result in its group (dose % or dBA for the group's
 * criteria set, TWA and LEX,8h in the details), through insertShiftResult so the one-valid-result
 * rule and the group's data version hold; the log and the result point at each other.
 */
export function acceptNoiseLog(db: Db, clock: Clock, input: { organizationId: number; logId: number; actor: Actor }) {
  const now = clock.now();
  db.transaction((tx) => {
    const row = logRowOrNotFound(tx, input.organizationId, input.logId);
    if (row.status === 'accepted') throw new Conflict(`Noise log ${row.id} is already in the group as shift result ${row.shiftResultId}`);
    const group = tx.select().from(exposureGroups).where(eq(exposureGroups.id, row.exposureGroupId)).get()!;
    if (group.archived) throw new Conflict(`"${group.name}" is archived: bring it back before adding results`);
    const worker = tx.select().from(workers).where(eq(workers.id, row.workerId)).get()!;
    if (!isMemberOn(tx, worker.id, group.id, row.shiftDate)) {
      throw new Conflict(`${worker.code} is not a member of "${group.name}" on ${row.shiftDate} (${periodsInWords(tx, worker.id, group.id)})`);
    }
    const agent = tx.select().from(agents).where(eq(agents.id, group.agentId)).get()!;
    const { analysis } = analysisOf(tx, row);
    const figures = resultFigures(row, group, analysis);
    const result = insertShiftResult(tx, now, input.actor, {
      organizationId: input.organizationId,
      group,
      worker,
      agent,
      date: row.shiftDate,
      value: figures.value,
      nonDetect: false,
      detectionLimit: null,
      source: 'noise-log',
      sampleId: `noise-log-${row.id}`,
      sampledMinutes: analysis.runSeconds / 60,
      details: figures.details,
      notes: row.instrument ? `Instrument ${row.instrument}` : '',
    });
    const stamp = now.toISOString();
    tx.update(noiseLogs)
      .set({ status: 'accepted', shiftResultId: result.id, acceptedByUserId: input.actor?.id ?? null, acceptedAt: stamp, updatedAt: stamp })
      .where(eq(noiseLogs.id, row.id))
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'noise_log',
      entityId: row.id,
      action: 'accepted',
      after: { shiftResultId: result.id, value: figures.value, unit: group.oelUnit },
      at: now,
    });
  });
  return getNoiseLog(db, input.organizationId, input.logId);
}

// ---------------------------------------------------------------- mapping presets

function saveMappingPreset(tx: Tx, now: Date, input: { organizationId: number; actor: Actor; name: string; mapping: NoiseColumnMapping }) {
  const stamp = now.toISOString();
  const existing = tx
    .select()
    .from(noiseMappingPresets)
    .where(and(eq(noiseMappingPresets.organizationId, input.organizationId), eq(noiseMappingPresets.name, input.name)))
    .get();
  if (existing) {
    tx.update(noiseMappingPresets).set({ mapping: input.mapping, updatedAt: stamp }).where(eq(noiseMappingPresets.id, existing.id)).run();
    return existing.id;
  }
  const row = tx
    .insert(noiseMappingPresets)
    .values({
      organizationId: input.organizationId,
      name: input.name,
      mapping: input.mapping,
      createdByUserId: input.actor?.id ?? null,
      createdAt: stamp,
      updatedAt: stamp,
    })
    .returning({ id: noiseMappingPresets.id })
    .get();
  audit(tx, {
    organizationId: input.organizationId,
    actor: input.actor,
    entityType: 'noise_mapping_preset',
    entityId: row.id,
    action: 'created',
    after: { name: input.name },
    at: now,
  });
  return row.id;
}

/** Saves (or replaces) a named column mapping for the organization. */
export function createMappingPreset(db: Db, clock: Clock, input: { organizationId: number; actor: Actor; name: string; mapping: NoiseColumnMapping }) {
  const now = clock.now();
  const id = db.transaction((tx) => saveMappingPreset(tx, now, input));
  return db.select().from(noiseMappingPresets).where(eq(noiseMappingPresets.id, id)).get()!;
}

export function listMappingPresets(db: Db, organizationId: number) {
  return db.select().from(noiseMappingPresets).where(eq(noiseMappingPresets.organizationId, organizationId)).orderBy(asc(noiseMappingPresets.name)).all();
}
