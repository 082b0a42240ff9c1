import { and, asc, count, eq, gte, lte, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import { agents, exposureUnitLabels, type Agent, type ExposureUnit } from '@schema/agents';
import { auditEvents } from '@schema/audit';
import { exposureGroups, type ExposureGroup } from '@schema/exposure-groups';
import type { ListPage } from '@schema/list-query';
import {
  shiftResults,
  type ResultSource,
  type ShiftResult,
  type ShiftResultCreate,
  type ShiftResultDetails,
  type ShiftResultListQuery,
} from '@schema/shift-results';
import { users } from '@schema/users';
import { workers, type Worker } from '@schema/workers';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict, NotFound } from '../errors';
import { audit, fieldError, ownedOrNotFound, type Actor, type Tx } from './changes';
import { latestPossibleDate } from './dates';
import { exposureGroupFromBody, touchGroupResults } from './exposure-groups';
import { orderBy, pageOf, pageWindow, searchCondition } from './list';
import { sampleMinutes } from './sample-times';
import { conversionBetween } from './units';
import { isMemberOn, periodsInWords, workerFromBody, workerReference, type NameAccess, type WorkerReference } from './workers';

/** A shift result as the API sends it: names of its group and agent, the worker by code (name if allowed), who made and voided it. */
export type ShiftResultView = Omit<ShiftResult, 'organizationId'> & {
  worker: WorkerReference;
  exposureGroupName: string;
  agentName: string;
  createdBy: { id: number; name: string } | null;
  voidedBy: { id: number; name: string } | null;
};

const creator = alias(users, 'creator');
const voider = alias(users, 'voider');

function selectResultViews(db: Tx) {
  return db
    .select({
      result: shiftResults,
      worker: workers,
      exposureGroupName: exposureGroups.name,
      agentName: agents.name,
      creatorId: creator.id,
      creatorName: creator.name,
      voiderId: voider.id,
      voiderName: voider.name,
    })
    .from(shiftResults)
    .innerJoin(workers, eq(workers.id, shiftResults.workerId))
    .innerJoin(exposureGroups, eq(exposureGroups.id, shiftResults.exposureGroupId))
    .innerJoin(agents, eq(agents.id, shiftResults.agentId))
    .leftJoin(creator, eq(creator.id, shiftResults.createdByUserId))
    .leftJoin(voider, eq(voider.id, shiftResults.voidedByUserId));
}
type ResultRow = {
  result: ShiftResult;
  worker: Worker;
  exposureGroupName: string;
  agentName: string;
  creatorId: number | null;
  creatorName: string | null;
  voiderId: number | null;
  voiderName: string | null;
};

function toResultView(row: ResultRow, access: NameAccess): ShiftResultView {
  const { organizationId: _organizationId, ...result } = row.result;
  return {
    ...result,
    worker: workerReference(row.worker, access),
    exposureGroupName: row.exposureGroupName,
    agentName: row.agentName,
    createdBy: row.creatorId === null ? null : { id: row.creatorId, name: row.creatorName ?? '' },
    voidedBy: row.voiderId === null ? null : { id: row.voiderId, name: row.voiderName ?? '' },
  };
}

/** Shift results of the organization, filtered, sorted and paged. */
export function listShiftResults(db: Db, organizationId: number, query: ShiftResultListQuery, access: NameAccess): ListPage<ShiftResultView> {
  const where = and(
    eq(shiftResults.organizationId, organizationId),
    query.groupId ? eq(shiftResults.exposureGroupId, query.groupId) : undefined,
    query.workerId ? eq(shiftResults.workerId, query.workerId) : undefined,
    query.importBatchId ? eq(shiftResults.importBatchId, query.importBatchId) : undefined,
    query.status ? eq(shiftResults.status, query.status) : undefined,
    query.source ? eq(shiftResults.source, query.source) : undefined,
    query.nonDetect === undefined ? undefined : eq(shiftResults.nonDetect, query.nonDetect),
    query.from ? gte(shiftResults.date, query.from) : undefined,
    query.to ? lte(shiftResults.date, query.to) : undefined,
    searchCondition(
      query.q,
      access.canSeeNames
        ? [workers.code, workers.name, shiftResults.sampleId, shiftResults.lab, shiftResults.notes]
        : [workers.code, shiftResults.sampleId, shiftResults.lab, shiftResults.notes],
    ),
  );
  const total = db.select({ total: count() }).from(shiftResults).innerJoin(workers, eq(workers.id, shiftResults.workerId)).where(where).get()?.total ?? 0;
  const { limit, offset } = pageWindow(query.page, query.pageSize);
  const items = selectResultViews(db)
    .where(where)
    .orderBy(
      ...orderBy(
        query.sort,
        {
          date: shiftResults.date,
          workerCode: workers.code,
          value: shiftResults.value,
          createdAt: shiftResults.createdAt,
          status: shiftResults.status,
          source: shiftResults.source,
        },
        shiftResults.id,
      ),
    )
    .limit(limit)
    .offset(offset)
    .all()
    .map((row) => toResultView(row, access));
  return pageOf(items, total, query.page, query.pageSize);
}

/** Every result of a group (valid and void), by date then worker code — for the group page. */
export function resultsOfGroup(db: Tx, groupId: number, access: NameAccess): ShiftResultView[] {
  return selectResultViews(db)
    .where(eq(shiftResults.exposureGroupId, groupId))
    .orderBy(asc(shiftResults.date), asc(workers.code), asc(shiftResults.id))
    .all()
    .map((row) => toResultView(row, access));
}

export function getShiftResult(db: Tx, organizationId: number, resultId: number, access: NameAccess): ShiftResultView {
  const row = selectResultViews(db)
    .where(and(eq(shiftResults.id, resultId), eq(shiftResults.organizationId, organizationId)))
    .get();
  if (!row) throw new NotFound(`No shift result ${resultId} in this organization`);
  return toResultView(row, access);
}

/** Every result an import batch stored, in the order they were stored (one query, not one per result). */
export function getShiftResultsOfImport(db: Tx, organizationId: number, importBatchId: number, access: NameAccess): ShiftResultView[] {
  return selectResultViews(db)
    .where(and(eq(shiftResults.importBatchId, importBatchId), eq(shiftResults.organizationId, organizationId)))
    .orderBy(shiftResults.id)
    .all()
    .map((row) => toResultView(row, access));
}

/** The valid result already recorded for this worker-shift in the group, if any. */
export function validResultFor(db: Tx, key: { exposureGroupId: number; workerId: number; agentId: number; date: string }, exceptId?: number) {
  const row = db
    .select({ id: shiftResults.id, sampleId: shiftResults.sampleId, details: shiftResults.details })
    .from(shiftResults)
    .where(
      and(
        eq(shiftResults.exposureGroupId, key.exposureGroupId),
        eq(shiftResults.workerId, key.workerId),
        eq(shiftResults.agentId, key.agentId),
        eq(shiftResults.date, key.date),
        eq(shiftResults.status, 'valid'),
      ),
    )
    .get();
  return row && row.id !== exceptId ? row : undefined;
}

/** What a service hands over to store one result (already checked and converted). */
export interface NewShiftResult {
  organizationId: number;
  group: ExposureGroup;
  worker: Worker;
  agent: Agent;
  date: string;
  value: number;
  nonDetect: boolean;
  detectionLimit: number | null;
  source: ResultSource;
  sampleId?: string | null;
  lab?: string | null;
  startTime?: string | null;
  endTime?: string | null;
  sampledMinutes?: number | null;
  reportedValue?: number | null;
  reportedUnit?: ExposureUnit | null;
  details: ShiftResultDetails;
  importBatchId?: number | null;
  notes?: string;
}

const placeholder = (name: string) => sql.placeholder(name);

/**
 * The three statements that store a result (the check for a valid result on the same shift, the
 * insert, its audit event), prepared once for a transaction. A bulk writer (lab import, mixture
 * recompute) makes one writer for all its rows: building each query again per row was about half of a
 * 3,000-row lab commit's time (CPU profile, tests/bench notes in docs/benchmarks.md).
 */
export function shiftResultWriter(tx: Tx) {
  return {
    existing: tx
      .select({ id: shiftResults.id })
      .from(shiftResults)
      .where(
        and(
          eq(shiftResults.exposureGroupId, placeholder('exposureGroupId')),
          eq(shiftResults.workerId, placeholder('workerId')),
          eq(shiftResults.agentId, placeholder('agentId')),
          eq(shiftResults.date, placeholder('date')),
          eq(shiftResults.status, 'valid'),
        ),
      )
      .prepare(),
    insert: tx
      .insert(shiftResults)
      .values({
        organizationId: placeholder('organizationId'),
        exposureGroupId: placeholder('exposureGroupId'),
        workerId: placeholder('workerId'),
        agentId: placeholder('agentId'),
        date: placeholder('date'),
        value: placeholder('value'),
        unit: placeholder('unit'),
        nonDetect: placeholder('nonDetect'),
        detectionLimit: placeholder('detectionLimit'),
        source: placeholder('source'),
        sampleId: placeholder('sampleId'),
        lab: placeholder('lab'),
        startTime: placeholder('startTime'),
        endTime: placeholder('endTime'),
        sampledMinutes: placeholder('sampledMinutes'),
        reportedValue: placeholder('reportedValue'),
        reportedUnit: placeholder('reportedUnit'),
        details: placeholder('details'),
        importBatchId: placeholder('importBatchId'),
        notes: placeholder('notes'),
        createdByUserId: placeholder('createdByUserId'),
        createdAt: placeholder('createdAt'),
        updatedAt: placeholder('updatedAt'),
      })
      .returning()
      .prepare(),
    audit: tx
      .insert(auditEvents)
      .values({
        organizationId: placeholder('organizationId'),
        actorUserId: placeholder('actorUserId'),
        entityType: 'shift_result',
        entityId: placeholder('entityId'),
        action: 'created',
        after: placeholder('after'),
        at: placeholder('at'),
      })
      .prepare(),
  };
}
export type ShiftResultWriter = ReturnType<typeof shiftResultWriter>;

/**
 * Stores one result in the group's OEL unit, writes its audit event and moves the group's data
 * version — all inside the caller's transaction. Any other writer of shift results (noise logs,
 * mixtures) goes through here too, so the one-valid-result-per-shift rule and the data version
 * hold for every source. A bulk caller passes one `writer` for all its rows and `touchGroup: false`.
 */
export function insertShiftResult(
  tx: Tx,
  now: Date,
  actor: Actor,
  input: NewShiftResult,
  options: { touchGroup?: boolean; writer?: ShiftResultWriter } = {},
): ShiftResult {
  const writer = options.writer ?? shiftResultWriter(tx);
  const existing = writer.existing.get({ exposureGroupId: input.group.id, workerId: input.worker.id, agentId: input.agent.id, date: input.date });
  if (existing) {
    throw new Conflict(
      `${input.worker.code} already has a valid result in "${input.group.name}" on ${input.date} (result ${existing.id}): void it first to record another`,
      { resultId: existing.id },
    );
  }
  const stamp = now.toISOString();
  const row = writer.insert.get({
    organizationId: input.organizationId,
    exposureGroupId: input.group.id,
    workerId: input.worker.id,
    agentId: input.agent.id,
    date: input.date,
    value: input.nonDetect ? input.detectionLimit! : input.value,
    unit: input.group.oelUnit,
    nonDetect: input.nonDetect,
    detectionLimit: input.detectionLimit,
    source: input.source,
    sampleId: input.sampleId || null,
    lab: input.lab || null,
    startTime: input.startTime || null,
    endTime: input.endTime || null,
    sampledMinutes: input.sampledMinutes ?? null,
    reportedValue: input.reportedValue ?? null,
    reportedUnit: input.reportedUnit ?? null,
    details: input.details,
    importBatchId: input.importBatchId ?? null,
    notes: input.notes ?? '',
    createdByUserId: actor?.id ?? null,
    createdAt: stamp,
    updatedAt: stamp,
  })!;
  writer.audit.run({
    organizationId: input.organizationId,
    actorUserId: actor?.id ?? null,
    entityId: String(row.id),
    after: {
      exposureGroupId: row.exposureGroupId,
      workerId: row.workerId,
      date: row.date,
      value: row.value,
      unit: row.unit,
      nonDetect: row.nonDetect,
      source: row.source,
      importBatchId: row.importBatchId,
    },
    at: stamp,
  });
  // A bulk insert (lab import) moves each group's data version once, after its rows, in the same transaction.
  if (options.touchGroup ?? true) touchGroupResults(tx, input.group.id, now);
  return row;
}

/** The agent row of a group. */
export function agentOfGroup(db: Tx, group: ExposureGroup): Agent {
  return db.select().from(agents).where(eq(agents.id, group.agentId)).get()!;
}

/**
 * Manual entry of one shift result. Checks, each answered with a 400 naming the field: the group
 * and worker belong to the organization; the date is not in the future; the worker is a member
 * of the group on that date; a value above 0 or a non-detect with its detection limit; times that
 * make a period; a unit that converts to the group's OEL unit. The value is taken as the shift
 * result as entered (no shift-TWA calculation), converted to the group's unit when needed.
 */
export function createShiftResult(
  db: Db,
  clock: Clock,
  input: { organizationId: number; actor: Actor; result: ShiftResultCreate },
  access: NameAccess,
): ShiftResultView {
  const now = clock.now();
  const entry = input.result;
  const id = db.transaction((tx) => {
    const group = exposureGroupFromBody(tx, input.organizationId, entry.exposureGroupId);
    if (group.archived) throw fieldError('exposureGroupId', `Exposure group "${group.name}" is archived: bring it back before adding results`);
    const worker = workerFromBody(tx, input.organizationId, entry.workerId);
    if (entry.date > latestPossibleDate(clock)) throw fieldError('date', `${entry.date} is in the future`);
    if (!isMemberOn(tx, worker.id, group.id, entry.date))
      throw fieldError('workerId', `${worker.code} is not a member of "${group.name}" on ${entry.date} (${periodsInWords(tx, worker.id, group.id)})`);
    const agent = agentOfGroup(tx, group);
    const unit = entry.unit ?? group.oelUnit;
    const conversion = conversionBetween(unit, group.oelUnit, agent);
    if (!conversion.ok) throw fieldError('unit', conversion.message);
    let minutes = entry.sampledMinutes ?? null;
    if (entry.startTime && entry.endTime) {
      const period = sampleMinutes(entry.startTime, entry.endTime, entry.date);
      if (!period.ok) throw fieldError(period.field, period.message);
      // One minute of slack: times are written to the minute.
      if (minutes !== null && Math.abs(minutes - period.minutes) > 1)
        throw fieldError('sampledMinutes', `${minutes} min does not match the start and end times (${period.minutes} min)`);
      minutes = period.minutes;
    } else if (entry.startTime || entry.endTime) {
      throw fieldError(entry.startTime ? 'endTime' : 'startTime', 'Give both the start and the end time, or neither');
    }
    const reported = entry.nonDetect ? entry.detectionLimit! : entry.value!;
    const converted = conversion.convert(reported);
    const flags: string[] = [];
    const words = entry.nonDetect
      ? `Entered by hand as a non-detect below ${reported} ${exposureUnitLabels[unit]}`
      : `Entered by hand as the shift result, ${reported} ${exposureUnitLabels[unit]}`;
    const statement =
      conversion.details === undefined
        ? `${words}.`
        : `${words}, converted to ${round(converted)} ${exposureUnitLabels[group.oelUnit]} (${conversion.details.source}${conversion.details.molecularWeight ? `, MW ${conversion.details.molecularWeight} g/mol` : ''}).`;
    const row = insertShiftResult(tx, now, input.actor, {
      organizationId: input.organizationId,
      group,
      worker,
      agent,
      date: entry.date,
      value: converted,
      nonDetect: entry.nonDetect ?? false,
      detectionLimit: entry.nonDetect ? converted : null,
      source: 'entered',
      sampleId: entry.sampleId,
      lab: entry.lab,
      startTime: entry.startTime,
      endTime: entry.endTime,
      sampledMinutes: minutes,
      reportedValue: conversion.details === undefined ? null : reported,
      reportedUnit: conversion.details === undefined ? null : unit,
      details: { statement, conversion: conversion.details, flags },
      notes: entry.notes ?? '',
    });
    return row.id;
  });
  return getShiftResult(db, input.organizationId, id, access);
}

function round(value: number): number {
  return Number(value.toPrecision(6));
}

function findResult(db: Tx, organizationId: number, resultId: number): ShiftResult {
  return ownedOrNotFound(db, shiftResults, organizationId, resultId, 'shift result');
}

/** Voids a valid result with a reason (audited with it); the row stays, marked void. */
export function voidShiftResult(
  db: Db,
  clock: Clock,
  input: { organizationId: number; resultId: number; actor: Actor; reason: string },
  access: NameAccess,
): ShiftResultView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = findResult(tx, input.organizationId, input.resultId);
    if (current.status === 'void') throw new Conflict(`Result ${current.id} is already void (${current.voidReason})`);
    const stamp = now.toISOString();
    tx.update(shiftResults)
      .set({ status: 'void', voidReason: input.reason, voidedByUserId: input.actor?.id ?? null, voidedAt: stamp, updatedAt: stamp })
      .where(eq(shiftResults.id, current.id))
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'shift_result',
      entityId: current.id,
      action: 'voided',
      reason: input.reason,
      before: { status: 'valid' },
      after: { status: 'void' },
      at: now,
    });
    touchGroupResults(tx, current.exposureGroupId, now);
  });
  return getShiftResult(db, input.organizationId, input.resultId, access);
}

/**
 * Restores a void result with a reason. Refused (409) when another valid result now holds that
 * worker-shift, or when the worker is no longer a member of the group on that date.
 */
export function restoreShiftResult(
  db: Db,
  clock: Clock,
  input: { organizationId: number; resultId: number; actor: Actor; reason: string },
  access: NameAccess,
): ShiftResultView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = findResult(tx, input.organizationId, input.resultId);
    if (current.status === 'valid') throw new Conflict(`Result ${current.id} is not void`);
    const other = validResultFor(tx, current, current.id);
    if (other)
      throw new Conflict(`Result ${other.id} is now the valid result for this worker and date: void it first to restore result ${current.id}`, {
        resultId: other.id,
      });
    if (!isMemberOn(tx, current.workerId, current.exposureGroupId, current.date)) {
      throw new Conflict(
        `The worker is no longer a member of the group on ${current.date} (${periodsInWords(tx, current.workerId, current.exposureGroupId)}): change the membership first`,
      );
    }
    const stamp = now.toISOString();
    tx.update(shiftResults)
      .set({ status: 'valid', voidReason: null, voidedByUserId: null, voidedAt: null, updatedAt: stamp })
      .where(eq(shiftResults.id, current.id))
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'shift_result',
      entityId: current.id,
      action: 'restored',
      reason: input.reason,
      before: { status: 'void', voidReason: current.voidReason, voidedByUserId: current.voidedByUserId, voidedAt: current.voidedAt },
      after: { status: 'valid' },
      at: now,
    });
    touchGroupResults(tx, current.exposureGroupId, now);
  });
  return getShiftResult(db, input.organizationId, input.resultId, access);
}

/** Counts of a group's results for the group page. */
export function resultCounts(results: readonly Pick<ShiftResult, 'status' | 'nonDetect'>[]) {
  const valid = results.filter((result) => result.status === 'valid');
  return {
    total: results.length,
    valid: valid.length,
    void: results.length - valid.length,
    /** Valid non-detects. */
    nonDetect: valid.filter((result) => result.nonDetect).length,
    detected: valid.filter((result) => !result.nonDetect).length,
  };
}
