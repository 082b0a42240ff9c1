import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import { agents } from '@schema/agents';
import { exposureGroups, type ExposureGroup } from '@schema/exposure-groups';
import {
  noiseEstimateMeasurements,
  noiseEstimates,
  noiseEstimateTasks,
  type NoiseEstimateFigures,
  type NoiseEstimateParsed,
  type NoiseEstimateView,
  type NoiseLogDay,
  type NoiseMeasurementInput,
} from '@schema/noise-estimates';
import { shiftResults } from '@schema/shift-results';
import { users } from '@schema/users';
import { workers } from '@schema/workers';
import { fullDayEstimate } from '@stats/iso9612-full-day';
import { jobBasedEstimate } from '@stats/iso9612-job-based';
import { taskBasedEstimate } from '@stats/iso9612-task-based';
import type { Iso9612Result } from '@stats/iso9612-uncertainty';
import { compareWithValues, noiseValuesInForce, verdictCriteria } from '@stats/iso9612-verdict';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { audit, fieldError, ownedOrFieldError, ownedOrNotFound, type Actor, type Tx } from './changes';

/*
 * ISO 9612:2009 noise estimates of an exposure group (docs/decisions/022-iso-9612-strategies.md).
 * The inputs are stored; the figures are computed on every read by stats/iso9612-*.ts and
 * compared with the values in force for the group's criteria set (stats/iso9612-verdict.ts).
 */

type EstimateRow = typeof noiseEstimates.$inferSelect;
type TaskRow = typeof noiseEstimateTasks.$inferSelect;
type MeasurementRow = typeof noiseEstimateMeasurements.$inferSelect;

/** The group named in the URL, which must be a noise group of the organization. */
function noiseGroup(db: Tx, organizationId: number, groupId: number): ExposureGroup {
  const group = ownedOrNotFound(db, exposureGroups, organizationId, groupId, 'exposure group') as ExposureGroup;
  const agent = db.select({ kind: agents.kind }).from(agents).where(eq(agents.id, group.agentId)).get();
  if (agent?.kind !== 'noise') throw fieldError('exposureGroupId', `Exposure group "${group.name}" is not a noise group: ISO 9612 estimates are for noise`);
  return group;
}

const optional = (value: number | null | undefined) => (value === null || value === undefined ? undefined : value);

/** Runs the strategy's engine on stored rows. A RangeError (an input the standard refuses) is returned as text. */
function computeFigures(
  estimate: EstimateRow,
  tasks: readonly (TaskRow & { measurements: MeasurementRow[] })[],
  measurements: readonly MeasurementRow[],
  group: ExposureGroup,
): { figures: NoiseEstimateFigures | null; figuresError: string | null } {
  let result: Iso9612Result &
    Partial<{ tasks: unknown; expandedUncertaintyWithoutDuration: number; cumulativeHours: number | null; minimumCumulativeHours: number }>;
  const samples = measurements.map((row) => ({ laeqDb: row.laeqDb, durationMinutes: optional(row.durationMinutes) }));
  try {
    if (estimate.strategy === 'task-based') {
      result = taskBasedEstimate({
        instrument: estimate.instrument,
        tasks: tasks.map((task) => ({
          name: task.name,
          hours: task.hours,
          durationUncertaintyHours: optional(task.durationUncertaintyHours),
          measurements: task.measurements.map((row) => ({ laeqDb: row.laeqDb, durationMinutes: optional(row.durationMinutes) })),
        })),
      });
    } else if (estimate.strategy === 'job-based') {
      result = jobBasedEstimate({
        samples,
        effectiveHours: estimate.effectiveHours ?? Number.NaN,
        instrument: estimate.instrument,
        groupSize: estimate.groupSize ?? Number.NaN,
      });
    } else {
      result = fullDayEstimate({ days: samples, effectiveHours: estimate.effectiveHours ?? Number.NaN, instrument: estimate.instrument });
    }
  } catch (error) {
    if (error instanceof RangeError) return { figures: null, figuresError: error.message.replace(/^\w+: /, '') };
    throw error;
  }
  const values = noiseValuesInForce({
    noiseCriteriaSet: group.noiseCriteriaSet,
    oelValue: group.oelValue,
    oelUnit: group.oelUnit,
    oelSource: group.oelSource,
    actionLevel: group.actionLevel,
  });
  const taskFigures = estimate.strategy === 'task-based' ? (result as ReturnType<typeof taskBasedEstimate>).tasks : null;
  return {
    figuresError: null,
    figures: {
      lex8h: result.lex8h,
      laeqTe: result.laeqTe,
      effectiveHours: result.effectiveHours,
      combinedUncertainty: result.combinedUncertainty,
      expandedUncertainty: result.expandedUncertainty,
      expandedUncertaintyWithoutDuration: result.expandedUncertaintyWithoutDuration ?? null,
      lexPlusU: result.lex8h + result.expandedUncertainty,
      budget: [...result.budget],
      tasks:
        taskFigures?.map((task) => ({ name: task.name, hours: task.hours, laeqDb: task.laeqDb, energyShare: task.energyShare, spreadDb: task.spreadDb })) ??
        null,
      cumulativeHours: result.cumulativeHours ?? null,
      minimumCumulativeHours: result.minimumCumulativeHours ?? null,
      warnings: [...result.warnings],
      criteria: verdictCriteria(group.noiseCriteriaSet),
      comparisons: compareWithValues(result.lex8h, result.expandedUncertainty, values),
    },
  };
}

const measurementOut = (row: MeasurementRow) => ({
  id: row.id,
  laeqDb: row.laeqDb,
  durationMinutes: row.durationMinutes,
  measuredOn: row.measuredOn,
  workerId: row.workerId,
});

/** Builds the views of several estimates with three queries. */
function viewsOf(db: Tx, rows: EstimateRow[]): NoiseEstimateView[] {
  if (rows.length === 0) return [];
  const ids = rows.map((row) => row.id);
  const taskRows = db.select().from(noiseEstimateTasks).where(inArray(noiseEstimateTasks.estimateId, ids)).orderBy(asc(noiseEstimateTasks.position)).all();
  const measurementRows = db
    .select()
    .from(noiseEstimateMeasurements)
    .where(inArray(noiseEstimateMeasurements.estimateId, ids))
    .orderBy(asc(noiseEstimateMeasurements.position))
    .all();
  const groupIds = [...new Set(rows.map((row) => row.exposureGroupId))];
  const groups = new Map(
    db
      .select()
      .from(exposureGroups)
      .where(inArray(exposureGroups.id, groupIds))
      .all()
      .map((group) => [group.id, group as ExposureGroup]),
  );
  const creatorIds = [...new Set(rows.map((row) => row.createdByUserId).filter((id): id is number => id !== null))];
  const creators = new Map(
    creatorIds.length === 0
      ? []
      : db
          .select({ id: users.id, name: users.name })
          .from(users)
          .where(inArray(users.id, creatorIds))
          .all()
          .map((user) => [user.id, user.name]),
  );
  return rows.map((row) => {
    const tasks = taskRows
      .filter((task) => task.estimateId === row.id)
      .map((task) => ({ ...task, measurements: measurementRows.filter((measurement) => measurement.taskId === task.id) }));
    const loose = measurementRows.filter((measurement) => measurement.estimateId === row.id && measurement.taskId === null);
    const group = groups.get(row.exposureGroupId)!;
    const { figures, figuresError } = computeFigures(row, tasks, loose, group);
    return {
      id: row.id,
      exposureGroupId: row.exposureGroupId,
      groupName: group.name,
      title: row.title,
      strategy: row.strategy,
      instrument: row.instrument,
      effectiveHours: row.effectiveHours,
      groupSize: row.groupSize,
      notes: row.notes,
      archived: row.archived,
      createdBy: row.createdByUserId === null ? null : (creators.get(row.createdByUserId) ?? null),
      createdAt: row.createdAt,
      updatedAt: row.updatedAt,
      tasks: tasks.map((task) => ({
        id: task.id,
        name: task.name,
        hours: task.hours,
        durationUncertaintyHours: task.durationUncertaintyHours,
        measurements: task.measurements.map(measurementOut),
      })),
      measurements: loose.map(measurementOut),
      figures,
      figuresError,
    };
  });
}

/** A group's estimates with their figures, newest first; archived ones only when asked. */
export function listGroupEstimates(db: Db, organizationId: number, groupId: number, includeArchived: boolean): NoiseEstimateView[] {
  noiseGroup(db, organizationId, groupId);
  const rows = db
    .select()
    .from(noiseEstimates)
    .where(
      and(
        eq(noiseEstimates.organizationId, organizationId),
        eq(noiseEstimates.exposureGroupId, groupId),
        includeArchived ? undefined : eq(noiseEstimates.archived, false),
      ),
    )
    .orderBy(desc(noiseEstimates.createdAt), desc(noiseEstimates.id))
    .all();
  return viewsOf(db, rows);
}

/** One estimate with its figures, or 404. */
export function getNoiseEstimate(db: Tx, organizationId: number, estimateId: number): NoiseEstimateView {
  const row = ownedOrNotFound(db, noiseEstimates, organizationId, estimateId, 'noise estimate');
  return viewsOf(db, [row])[0];
}

/** Checks that each named worker belongs to the organization (400 naming the row). */
function checkWorkers(db: Tx, organizationId: number, input: NoiseEstimateParsed): void {
  const check = (row: NoiseMeasurementInput, field: string) => {
    if (row.workerId != null) ownedOrFieldError(db, workers, organizationId, row.workerId, 'worker', field);
  };
  input.tasks.forEach((task, index) => task.measurements.forEach((row, rowIndex) => check(row, `tasks.${index}.measurements.${rowIndex}.workerId`)));
  input.measurements.forEach((row, rowIndex) => check(row, `measurements.${rowIndex}.workerId`));
}

/** Writes the tasks and measurements of an estimate (inside the caller's transaction). */
function insertChildren(tx: Tx, estimateId: number, input: NoiseEstimateParsed): void {
  const measurementValues = (row: NoiseMeasurementInput, position: number, taskId: number | null) => ({
    estimateId,
    taskId,
    position,
    laeqDb: row.laeqDb,
    durationMinutes: row.durationMinutes ?? null,
    measuredOn: row.measuredOn ?? null,
    workerId: row.workerId ?? null,
  });
  input.tasks.forEach((task, index) => {
    const { id: taskId } = tx
      .insert(noiseEstimateTasks)
      .values({ estimateId, position: index + 1, name: task.name.trim(), hours: task.hours, durationUncertaintyHours: task.durationUncertaintyHours ?? null })
      .returning({ id: noiseEstimateTasks.id })
      .get();
    task.measurements.forEach((row, rowIndex) =>
      tx
        .insert(noiseEstimateMeasurements)
        .values(measurementValues(row, rowIndex + 1, taskId))
        .run(),
    );
  });
  input.measurements.forEach((row, rowIndex) =>
    tx
      .insert(noiseEstimateMeasurements)
      .values(measurementValues(row, rowIndex + 1, null))
      .run(),
  );
}

/** The estimate's inputs as stored, for the audit trail. */
function auditInputs(input: NoiseEstimateParsed) {
  return {
    title: input.title,
    strategy: input.strategy,
    instrument: input.instrument,
    effectiveHours: input.strategy === 'task-based' ? null : (input.effectiveHours ?? null),
    groupSize: input.strategy === 'job-based' ? (input.groupSize ?? null) : null,
    notes: input.notes,
    tasks: input.tasks,
    measurements: input.measurements,
  };
}

function snapshotOf(view: NoiseEstimateView) {
  return {
    title: view.title,
    strategy: view.strategy,
    instrument: view.instrument,
    effectiveHours: view.effectiveHours,
    groupSize: view.groupSize,
    notes: view.notes,
    tasks: view.tasks.map(({ id: _id, measurements, ...task }) => ({ ...task, measurements: measurements.map(({ id: _row, ...row }) => row) })),
    measurements: view.measurements.map(({ id: _row, ...row }) => row),
  };
}

/** The estimate row's own columns from its inputs (tasks and measurements are rows of their own). */
function estimateColumns(fields: ReturnType<typeof auditInputs>) {
  const { title, strategy, instrument, effectiveHours, groupSize, notes } = fields;
  return { title, strategy, instrument, effectiveHours, groupSize, notes };
}

/** Creates an estimate with its tasks and measurements in one transaction (audited). */
export function createNoiseEstimate(
  db: Db,
  clock: Clock,
  input: { organizationId: number; groupId: number; actor: Actor; estimate: NoiseEstimateParsed },
): NoiseEstimateView {
  const now = clock.now();
  return db.transaction((tx) => {
    noiseGroup(tx, input.organizationId, input.groupId);
    checkWorkers(tx, input.organizationId, input.estimate);
    const fields = auditInputs(input.estimate);
    const { id: estimateId } = tx
      .insert(noiseEstimates)
      .values({
        organizationId: input.organizationId,
        exposureGroupId: input.groupId,
        ...estimateColumns(fields),
        createdByUserId: input.actor?.id ?? null,
        createdAt: now.toISOString(),
        updatedAt: now.toISOString(),
      })
      .returning({ id: noiseEstimates.id })
      .get();
    insertChildren(tx, estimateId, input.estimate);
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'noise_estimate',
      entityId: estimateId,
      action: 'created',
      after: fields,
      at: now,
    });
    return getNoiseEstimate(tx, input.organizationId, estimateId);
  });
}

/** Replaces an estimate's inputs (tasks and measurements included) in one transaction; the audit keeps before and after. */
export function replaceNoiseEstimate(
  db: Db,
  clock: Clock,
  input: { organizationId: number; estimateId: number; actor: Actor; estimate: NoiseEstimateParsed },
): NoiseEstimateView {
  const now = clock.now();
  return db.transaction((tx) => {
    const before = getNoiseEstimate(tx, input.organizationId, input.estimateId);
    checkWorkers(tx, input.organizationId, input.estimate);
    const fields = auditInputs(input.estimate);
    tx.update(noiseEstimates)
      .set({ ...estimateColumns(fields), updatedAt: now.toISOString() })
      .where(eq(noiseEstimates.id, input.estimateId))
      .run();
    // The rows are the estimate's own inputs; the audit event keeps the previous ones in full.
    tx.delete(noiseEstimateMeasurements).where(eq(noiseEstimateMeasurements.estimateId, input.estimateId)).run();
    tx.delete(noiseEstimateTasks).where(eq(noiseEstimateTasks.estimateId, input.estimateId)).run();
    insertChildren(tx, input.estimateId, input.estimate);
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'noise_estimate',
      entityId: input.estimateId,
      action: 'updated',
      before: snapshotOf(before),
      after: fields,
      at: now,
    });
    return getNoiseEstimate(tx, input.organizationId, input.estimateId);
  });
}

/** Archives or restores an estimate (audited); nothing is deleted. */
export function setNoiseEstimateArchived(
  db: Db,
  clock: Clock,
  input: { organizationId: number; estimateId: number; actor: Actor; archived: boolean },
): NoiseEstimateView {
  const now = clock.now();
  return db.transaction((tx) => {
    const row = ownedOrNotFound(tx, noiseEstimates, input.organizationId, input.estimateId, 'noise estimate');
    if (row.archived !== input.archived) {
      tx.update(noiseEstimates).set({ archived: input.archived, updatedAt: now.toISOString() }).where(eq(noiseEstimates.id, row.id)).run();
      audit(tx, {
        organizationId: input.organizationId,
        actor: input.actor,
        entityType: 'noise_estimate',
        entityId: row.id,
        action: input.archived ? 'archived' : 'restored',
        before: { archived: row.archived },
        after: { archived: input.archived },
        at: now,
      });
    }
    return getNoiseEstimate(tx, input.organizationId, input.estimateId);
  });
}

/** One accepted noise-log day of the group, offered as a full-day measurement. */

/**
 * The group's valid shift results that came from accepted noise logs, with the reviewed LAeq each
 * log gave (stored with the result), oldest first — the days a full-day estimate can start from.
 */
export function listNoiseLogDays(db: Db, organizationId: number, groupId: number): NoiseLogDay[] {
  noiseGroup(db, organizationId, groupId);
  const rows = db
    .select({
      id: shiftResults.id,
      date: shiftResults.date,
      workerId: shiftResults.workerId,
      workerCode: workers.code,
      sampledMinutes: shiftResults.sampledMinutes,
      details: shiftResults.details,
    })
    .from(shiftResults)
    .innerJoin(workers, eq(workers.id, shiftResults.workerId))
    .where(
      and(
        eq(shiftResults.organizationId, organizationId),
        eq(shiftResults.exposureGroupId, groupId),
        eq(shiftResults.source, 'noise-log'),
        eq(shiftResults.status, 'valid'),
      ),
    )
    .orderBy(asc(shiftResults.date), asc(shiftResults.id))
    .all();
  return rows.flatMap((row) => {
    const noise = (row.details as { noise?: { laeqDb?: number | null; noiseLogId?: number } } | null)?.noise;
    if (typeof noise?.laeqDb !== 'number' || !Number.isFinite(noise.laeqDb)) return [];
    return [
      {
        shiftResultId: row.id,
        noiseLogId: noise.noiseLogId ?? null,
        measuredOn: row.date,
        workerId: row.workerId,
        workerCode: row.workerCode,
        laeqDb: noise.laeqDb,
        durationMinutes: row.sampledMinutes,
      },
    ];
  });
}
