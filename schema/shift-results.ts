import { sql } from 'drizzle-orm';
import { check, foreignKey, index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createInsertSchema, createSelectSchema } from 'drizzle-zod';
import { z } from 'zod';
import { agents, exposureUnits, type ExposureUnit } from './agents';
import { calendarDate, id, timestamp, timestamps } from './columns';
import { exposureGroups } from './exposure-groups';
import { importBatches } from './lab-imports';
import { listQueryBase, queryFlag, queryId, sortParameter } from './list-query';
import { organizationReference } from './organizations';
import { users } from './users';
import { workers } from './workers';

/** Where a shift result came from. */
export const resultSources = ['entered', 'lab-import', 'noise-log', 'mixture'] as const;
export type ResultSource = (typeof resultSources)[number];

export const resultStatuses = ['valid', 'void'] as const;
export type ResultStatus = (typeof resultStatuses)[number];

/** One sample period that went into a shift result (lab imports; kept for traceability). */
export interface ShiftResultPart {
  /** Row of the lab file (header = row 1). */
  row: number | null;
  sampleId: string | null;
  startTime: string | null;
  endTime: string | null;
  minutes: number | null;
  /** As the lab reported it; for a non-detect, the detection limit. */
  reportedValue: number;
  reportedUnit: ExposureUnit;
  nonDetect: boolean;
  /** In the result's unit (the group's OEL unit). */
  value: number;
}

/** How the stored value was reached, in numbers and in words. */
export interface ShiftResultDetails {
  /** Plain-words statement of the calculation and its assumptions (shown with the result). */
  statement: string;
  parts?: ShiftResultPart[];
  combination?: {
    /** `single`: one sample taken as the shift result without a duration. */
    assumption: 'single' | 'zero' | 'sampled-average';
    formula: string;
    sampledMinutes: number | null;
    /** T in Σ(Cᵢ·tᵢ)/T. */
    averagingMinutes: number | null;
    shiftMinutes: number | null;
    /** Non-detect parts counted at 0 and at their detection limit. */
    lowerBound: number;
    upperBound: number;
    nonDetectParts: number;
  };
  conversion?: {
    from: ExposureUnit;
    to: ExposureUnit;
    molecularWeight: number | null;
    molarVolumeLitres: number | null;
    source: string;
  };
  /** For a mixture index (source `mixture`): the formula, its source and each component used. */
  mixture?: {
    mixtureId: number;
    formula: string;
    source: string;
    components: Array<{
      agentId: number;
      agentName: string;
      resultId: number;
      exposureGroupId: number;
      value: number;
      unit: ExposureUnit;
      nonDetect: boolean;
      oelValue: number;
      ratio: number;
    }>;
    /** Non-detect components at 0 (lower) and at their detection limit (upper = the stored value). */
    lowerBound: number;
    upperBound: number;
  };
  /** Things a reviewer should look at (e.g. a bound used in place of a value). */
  flags: string[];
}

/**
 * Shift results: one row per worker, group, agent and date — the one table every statistic reads.
 * `value` is in `unit` (the group's OEL unit at the time); for a non-detect it equals the detection
 * limit (the true value lies below it). Results are never deleted: a wrong one is voided with a
 * reason (and can be restored). Only one valid result may exist per worker-shift (partial unique
 * index), so a statistic never counts a shift twice.
 */
export const shiftResults = sqliteTable(
  'shift_results',
  {
    id: id(),
    organizationId: organizationReference(),
    exposureGroupId: integer('exposure_group_id').notNull(),
    workerId: integer('worker_id').notNull(),
    agentId: integer('agent_id').notNull(),
    date: text('date').notNull(),
    value: real('value').notNull(),
    unit: text('unit', { enum: exposureUnits }).notNull(),
    nonDetect: integer('non_detect', { mode: 'boolean' }).notNull().default(false),
    detectionLimit: real('detection_limit'),
    source: text('source', { enum: resultSources }).notNull(),
    sampleId: text('sample_id'),
    lab: text('lab'),
    /** `HH:MM` or `YYYY-MM-DDTHH:MM` (a sample that crosses midnight). */
    startTime: text('start_time'),
    endTime: text('end_time'),
    sampledMinutes: real('sampled_minutes'),
    /** What was entered or reported before conversion to `unit` (one sample; null when combined). */
    reportedValue: real('reported_value'),
    reportedUnit: text('reported_unit', { enum: exposureUnits }),
    details: text('details', { mode: 'json' }).$type<ShiftResultDetails | null>(),
    importBatchId: integer('import_batch_id'),
    notes: text('notes').notNull().default(''),
    status: text('status', { enum: resultStatuses }).notNull().default('valid'),
    voidReason: text('void_reason'),
    voidedByUserId: integer('voided_by_user_id').references(() => users.id),
    voidedAt: timestamp('voided_at'),
    /** Null only for demo data. */
    createdByUserId: integer('created_by_user_id').references(() => users.id),
    ...timestamps(),
  },
  (table) => [
    foreignKey({
      columns: [table.exposureGroupId, table.organizationId],
      foreignColumns: [exposureGroups.id, exposureGroups.organizationId],
    }),
    foreignKey({ columns: [table.workerId, table.organizationId], foreignColumns: [workers.id, workers.organizationId] }),
    foreignKey({ columns: [table.agentId, table.organizationId], foreignColumns: [agents.id, agents.organizationId] }),
    foreignKey({
      columns: [table.importBatchId, table.organizationId],
      foreignColumns: [importBatches.id, importBatches.organizationId],
    }),
    uniqueIndex('shift_results_id_organization_idx').on(table.id, table.organizationId),
    uniqueIndex('shift_results_one_valid_per_shift_idx')
      .on(table.exposureGroupId, table.workerId, table.agentId, table.date)
      .where(sql`${table.status} = 'valid'`),
    index('shift_results_group_date_idx').on(table.exposureGroupId, table.date),
    index('shift_results_worker_idx').on(table.workerId, table.date),
    index('shift_results_batch_idx').on(table.importBatchId),
    check('shift_results_value_positive', sql`${table.value} > 0`),
    check(
      'shift_results_non_detect_has_limit',
      sql`${table.nonDetect} = 0 OR (${table.detectionLimit} IS NOT NULL AND ${table.detectionLimit} > 0 AND ${table.value} = ${table.detectionLimit})`,
    ),
    check('shift_results_void_has_reason', sql`${table.status} = 'valid' OR (${table.voidReason} IS NOT NULL AND ${table.voidedAt} IS NOT NULL)`),
  ],
);

const clockTime = z
  .string()
  .trim()
  .regex(/^(\d{4}-\d{2}-\d{2}T)?([01]\d|2[0-3]):[0-5]\d(:[0-5]\d)?$/, 'Use a time written HH:MM, or YYYY-MM-DDTHH:MM for a sample that crosses midnight');

export const shiftResultSelect = createSelectSchema(shiftResults);

/**
 * Enter one shift result by hand. The agent is the group's; `unit` defaults to the group's OEL
 * unit (another unit is converted, e.g. ppm → mg/m³ from the molecular weight). A non-detect gives
 * its detection limit and no value (or a value equal to the limit).
 */
export const shiftResultCreate = createInsertSchema(shiftResults, {
  date: calendarDate,
  value: (schema) => schema.positive('Use a value above 0'),
  detectionLimit: (schema) => schema.positive('Use a detection limit above 0'),
  sampleId: (schema) => schema.trim().max(100),
  lab: (schema) => schema.trim().max(200),
  startTime: clockTime.nullable().optional(),
  endTime: clockTime.nullable().optional(),
  sampledMinutes: (schema) => schema.positive('Use minutes above 0').max(1440, 'A shift is at most 1440 minutes'),
  notes: (schema) => schema.trim().max(2000),
})
  .pick({
    exposureGroupId: true,
    workerId: true,
    date: true,
    unit: true,
    nonDetect: true,
    detectionLimit: true,
    sampleId: true,
    lab: true,
    startTime: true,
    endTime: true,
    sampledMinutes: true,
    notes: true,
  })
  .extend({
    value: z.number({ message: 'Enter the value as a number' }).positive('Use a value above 0').nullable().optional(),
    unit: z.enum(exposureUnits, { message: `Use one of ${exposureUnits.join(', ')}` }).optional(),
  })
  .superRefine((result, context) => {
    if (result.nonDetect) {
      if (result.detectionLimit == null)
        context.addIssue({ code: 'custom', path: ['detectionLimit'], message: 'A non-detect needs its detection limit (above 0)' });
      else if (result.value != null && result.value !== result.detectionLimit)
        context.addIssue({
          code: 'custom',
          path: ['value'],
          message: 'For a non-detect leave the value empty: the result is "below the detection limit"',
        });
    } else if (result.value == null) {
      context.addIssue({ code: 'custom', path: ['value'], message: 'Enter the value (above 0), or mark the result as a non-detect' });
    }
  });

/** Void or restore a result: the reason is required and goes to the audit trail. */
export const shiftResultStatusChange = z.object({
  reason: z.string({ message: 'Give a reason' }).trim().min(3, 'Give a reason (at least 3 characters)').max(500, 'Use at most 500 characters'),
});

export const shiftResultListQuery = listQueryBase.extend({
  sort: sortParameter(['date', 'workerCode', 'value', 'createdAt', 'status', 'source'], '-date'),
  groupId: queryId.optional(),
  workerId: queryId.optional(),
  importBatchId: queryId.optional(),
  status: z.enum(resultStatuses, { message: 'Use valid or void' }).optional(),
  source: z.enum(resultSources, { message: `Use one of ${resultSources.join(', ')}` }).optional(),
  nonDetect: queryFlag.optional(),
  from: calendarDate.optional(),
  to: calendarDate.optional(),
});

export type ShiftResult = z.infer<typeof shiftResultSelect>;
export type ShiftResultCreate = z.infer<typeof shiftResultCreate>;
export type ShiftResultListQuery = z.infer<typeof shiftResultListQuery>;
