import { sql } from 'drizzle-orm';
import { check, foreignKey, index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { z } from 'zod';
import { archived, calendarDate, id, isoTimestamp, timestamps } from './columns';
import { exposureGroups } from './exposure-groups';
import { organizationReference } from './organizations';
import { users } from './users';
import { workers } from './workers';

/**
 * ISO 9612:2009 noise estimates for an exposure group (docs/decisions/022-iso-9612-strategies.md):
 * a strategy (task-based, job-based or full-day), its tasks and measurements. The figures (LEX,8h,
 * the uncertainty budget, U) are computed on every read by stats/iso9612-*.ts and never stored, so
 * an estimate always shows what its inputs give under the current engine.
 */

export const noiseStrategies = ['task-based', 'job-based', 'full-day'] as const;
export type NoiseStrategy = (typeof noiseStrategies)[number];
export const noiseStrategyLabels: Record<NoiseStrategy, string> = {
  'task-based': 'Task-based (ISO 9612 clause 9)',
  'job-based': 'Job-based (ISO 9612 clause 10)',
  'full-day': 'Full-day (ISO 9612 clause 11)',
};

/** Instrument kinds of ISO 9612:2009 Table C.5 (the same names as stats/iso9612-uncertainty.ts). */
export const noiseInstruments = ['class1-meter', 'class2-meter', 'dosimeter'] as const;
export type NoiseInstrument = (typeof noiseInstruments)[number];
export const noiseInstrumentLabels: Record<NoiseInstrument, string> = {
  'class1-meter': 'Class 1 sound level meter (u2 = 0.7 dB)',
  'class2-meter': 'Class 2 sound level meter (u2 = 1.5 dB)',
  dosimeter: 'Personal sound exposure meter / dosimeter (u2 = 1.5 dB)',
};

/** Fewest measurements per strategy (ISO 9612:2009: 3 per task, 5 samples, 3 days). */
export const noiseStrategyMinimum = { 'task-based': 3, 'job-based': 5, 'full-day': 3 } as const;

export const noiseEstimates = sqliteTable(
  'noise_estimates',
  {
    id: id(),
    organizationId: organizationReference(),
    exposureGroupId: integer('exposure_group_id').notNull(),
    title: text('title').notNull().default(''),
    strategy: text('strategy', { enum: noiseStrategies }).notNull(),
    /** Effective duration of the working day Te, hours; null for task-based (Te = Σ T_m). */
    effectiveHours: real('effective_hours'),
    instrument: text('instrument', { enum: noiseInstruments }).notNull(),
    /** Workers in the noise exposure group nG (job-based, for Table 1). */
    groupSize: integer('group_size'),
    notes: text('notes').notNull().default(''),
    archived: archived(),
    createdByUserId: integer('created_by_user_id').references(() => users.id),
    ...timestamps(),
  },
  (table) => [
    foreignKey({ columns: [table.exposureGroupId, table.organizationId], foreignColumns: [exposureGroups.id, exposureGroups.organizationId] }),
    uniqueIndex('noise_estimates_id_organization_idx').on(table.id, table.organizationId),
    index('noise_estimates_group_idx').on(table.exposureGroupId),
    check('noise_estimates_hours_range', sql`${table.effectiveHours} IS NULL OR (${table.effectiveHours} > 0 AND ${table.effectiveHours} <= 24)`),
    check('noise_estimates_group_size_positive', sql`${table.groupSize} IS NULL OR ${table.groupSize} >= 1`),
  ],
);

/** A task of a task-based estimate (T_m and optionally u1b,m). */
export const noiseEstimateTasks = sqliteTable(
  'noise_estimate_tasks',
  {
    id: id(),
    estimateId: integer('estimate_id')
      .notNull()
      .references(() => noiseEstimates.id),
    position: integer('position').notNull(),
    name: text('name').notNull(),
    hours: real('hours').notNull(),
    durationUncertaintyHours: real('duration_uncertainty_hours'),
  },
  (table) => [index('noise_estimate_tasks_estimate_idx').on(table.estimateId), check('noise_estimate_tasks_hours_positive', sql`${table.hours} > 0`)],
);

/** One measured LAeq: of a task (task-based), a sample (job-based) or a day (full-day). */
export const noiseEstimateMeasurements = sqliteTable(
  'noise_estimate_measurements',
  {
    id: id(),
    estimateId: integer('estimate_id')
      .notNull()
      .references(() => noiseEstimates.id),
    taskId: integer('task_id').references(() => noiseEstimateTasks.id),
    position: integer('position').notNull(),
    laeqDb: real('laeq_db').notNull(),
    durationMinutes: real('duration_minutes'),
    measuredOn: text('measured_on'),
    workerId: integer('worker_id').references(() => workers.id),
  },
  (table) => [
    index('noise_estimate_measurements_estimate_idx').on(table.estimateId),
    check('noise_estimate_measurements_duration_positive', sql`${table.durationMinutes} IS NULL OR ${table.durationMinutes} > 0`),
  ],
);

// ---------------------------------------------------------------- request shapes

const level = z.number({ error: 'Enter the LAeq in dB' }).finite('Enter the LAeq in dB');
const optionalNumber = (message: string) => z.number({ error: message }).finite(message).nullish();

export const noiseMeasurementInput = z.object({
  laeqDb: level,
  durationMinutes: optionalNumber('Enter the duration in minutes'),
  measuredOn: calendarDate.nullish(),
  workerId: z.number().int().positive().nullish(),
});
export type NoiseMeasurementInput = z.infer<typeof noiseMeasurementInput>;

export const noiseTaskInput = z.object({
  name: z.string().trim().max(120, 'Use at most 120 characters'),
  hours: z.number({ error: 'Enter the task duration in hours' }).finite('Enter the task duration in hours'),
  durationUncertaintyHours: optionalNumber('Enter the duration uncertainty in hours'),
  measurements: z.array(noiseMeasurementInput).max(200, 'Use at most 200 measurements per task'),
});
export type NoiseTaskInput = z.infer<typeof noiseTaskInput>;

const estimateFields = z.object({
  title: z.string().trim().max(200, 'Use at most 200 characters').default(''),
  strategy: z.enum(noiseStrategies, { error: 'Choose task-based, job-based or full-day' }),
  instrument: z.enum(noiseInstruments, { error: 'Choose the instrument class' }),
  effectiveHours: optionalNumber('Enter the effective day Te in hours'),
  groupSize: z.number({ error: 'Enter the number of workers in the group' }).int('Use a whole number of workers').nullish(),
  notes: z.string().trim().max(4000).default(''),
  tasks: z.array(noiseTaskInput).max(50, 'Use at most 50 tasks').default([]),
  measurements: z.array(noiseMeasurementInput).max(500, 'Use at most 500 measurements').default([]),
});

const rowName = (task: { name: string }, index: number) => (task.name.trim() === '' ? `Task ${index + 1}` : `Task '${task.name.trim()}'`);

/**
 * The rules every estimate obeys, with messages naming the task and row (1-based) they are about,
 * so the form and the API say the same thing: ISO 9612:2009 minimum counts (3 per task, 5 samples,
 * 3 days), durations above 0, levels 0–200 dB, Te in (0, 24] h, nG for job-based.
 */
function checkEstimate(estimate: z.infer<typeof estimateFields>, context: z.RefinementCtx): void {
  const issue = (path: (string | number)[], message: string) => context.addIssue({ code: 'custom', path, message });
  const checkRow = (row: NoiseMeasurementInput, path: (string | number)[], where: string) => {
    if (row.laeqDb < 0 || row.laeqDb > 200) issue([...path, 'laeqDb'], `${where}: use an LAeq between 0 and 200 dB`);
    if (row.durationMinutes != null && !(row.durationMinutes > 0)) issue([...path, 'durationMinutes'], `${where}: use a duration above 0 minutes`);
  };
  const sampleWord = estimate.strategy === 'full-day' ? 'Day' : 'Sample';
  if (estimate.strategy === 'task-based') {
    if (estimate.tasks.length === 0) issue(['tasks'], 'Add at least one task');
    if (estimate.measurements.length > 0) issue(['measurements'], 'A task-based estimate keeps its measurements under each task');
    const names = new Set<string>();
    let totalHours = 0;
    estimate.tasks.forEach((task, index) => {
      const name = rowName(task, index);
      if (task.name.trim() === '') issue(['tasks', index, 'name'], `${name}: enter a name`);
      else if (names.has(task.name.trim())) issue(['tasks', index, 'name'], `${name} is listed twice: give each task one row`);
      names.add(task.name.trim());
      if (!(task.hours > 0)) issue(['tasks', index, 'hours'], `${name}: use a duration above 0 hours`);
      else totalHours += task.hours;
      if (task.durationUncertaintyHours != null && task.durationUncertaintyHours < 0)
        issue(['tasks', index, 'durationUncertaintyHours'], `${name}: use a duration uncertainty of 0 hours or more`);
      if (task.measurements.length < noiseStrategyMinimum['task-based'])
        issue(
          ['tasks', index, 'measurements'],
          `${name} has ${task.measurements.length} measurement${task.measurements.length === 1 ? '' : 's'}; ISO 9612 task-based needs at least 3`,
        );
      task.measurements.forEach((row, rowIndex) => checkRow(row, ['tasks', index, 'measurements', rowIndex], `${name}, measurement ${rowIndex + 1}`));
    });
    if (totalHours > 24) issue(['tasks'], `The task durations add up to ${totalHours} hours; a day has at most 24`);
    if (estimate.effectiveHours != null && Math.abs(estimate.effectiveHours - totalHours) > 1e-6)
      issue(['effectiveHours'], `Te is the sum of the task durations (${totalHours} h) in the task-based strategy: leave it empty or make it match`);
    return;
  }
  if (estimate.tasks.length > 0) issue(['tasks'], `A ${estimate.strategy} estimate has no tasks: enter its ${sampleWord.toLowerCase()}s under measurements`);
  const minimum = noiseStrategyMinimum[estimate.strategy];
  if (estimate.measurements.length < minimum)
    issue(
      ['measurements'],
      `${estimate.measurements.length} ${sampleWord.toLowerCase()}${estimate.measurements.length === 1 ? '' : 's'} given; ISO 9612 ${estimate.strategy} needs at least ${minimum}`,
    );
  estimate.measurements.forEach((row, rowIndex) => checkRow(row, ['measurements', rowIndex], `${sampleWord} ${rowIndex + 1}`));
  if (estimate.effectiveHours == null) issue(['effectiveHours'], 'Enter the effective day Te in hours');
  else if (!(estimate.effectiveHours > 0) || estimate.effectiveHours > 24) issue(['effectiveHours'], 'Use a Te above 0 and at most 24 hours');
  if (estimate.strategy === 'job-based') {
    if (estimate.groupSize == null) issue(['groupSize'], 'Enter the number of workers in the group (nG, for ISO 9612 Table 1)');
    else if (estimate.groupSize < 1) issue(['groupSize'], 'Use at least 1 worker');
  }
}

/** Create an estimate (also the full replacement body of PUT). */
export const noiseEstimateInput = estimateFields.superRefine(checkEstimate);
export type NoiseEstimateInput = z.input<typeof noiseEstimateInput>;
export type NoiseEstimateParsed = z.output<typeof noiseEstimateInput>;

export const noiseEstimateArchive = z.object({ archived: z.boolean() });

// ---------------------------------------------------------------- what the API returns

const budgetLine = z.object({
  label: z.string(),
  standardUncertainty: z.number().nullable(),
  sensitivity: z.number().nullable(),
  contribution: z.number(),
  source: z.string(),
});

/** A value in force an estimate is compared with (stats/iso9612-verdict.ts). */
const comparison = z.object({
  kind: z.enum(['action', 'limit']),
  label: z.string(),
  valueDb: z.number(),
  source: z.string(),
  note: z.string().nullable(),
  lexPlusUAbove: z.boolean(),
  lexAbove: z.boolean(),
  sentence: z.string(),
});

/** The computed figures of an estimate, or the reason they cannot be computed. */
export const noiseEstimateFigures = z.object({
  lex8h: z.number(),
  laeqTe: z.number(),
  effectiveHours: z.number(),
  combinedUncertainty: z.number(),
  expandedUncertainty: z.number(),
  expandedUncertaintyWithoutDuration: z.number().nullable(),
  lexPlusU: z.number(),
  budget: z.array(budgetLine),
  tasks: z.array(z.object({ name: z.string(), hours: z.number(), laeqDb: z.number(), energyShare: z.number(), spreadDb: z.number() })).nullable(),
  cumulativeHours: z.number().nullable(),
  minimumCumulativeHours: z.number().nullable(),
  warnings: z.array(z.string()),
  criteria: z.object({ name: z.string(), label: z.string() }),
  comparisons: z.array(comparison),
});
export type NoiseEstimateFigures = z.infer<typeof noiseEstimateFigures>;

const measurementView = noiseMeasurementInput.extend({ id: z.number().int() });
export const noiseEstimateView = z.object({
  id: z.number().int(),
  exposureGroupId: z.number().int(),
  groupName: z.string(),
  title: z.string(),
  strategy: z.enum(noiseStrategies),
  instrument: z.enum(noiseInstruments),
  effectiveHours: z.number().nullable(),
  groupSize: z.number().int().nullable(),
  notes: z.string(),
  archived: z.boolean(),
  createdBy: z.string().nullable(),
  createdAt: isoTimestamp,
  updatedAt: isoTimestamp,
  tasks: z.array(noiseTaskInput.extend({ id: z.number().int(), measurements: z.array(measurementView) })),
  measurements: z.array(measurementView),
  figures: noiseEstimateFigures.nullable(),
  /** Why the figures could not be computed (an input the engine refused), else null. */
  figuresError: z.string().nullable(),
});
export type NoiseEstimateView = z.infer<typeof noiseEstimateView>;

/** One accepted noise-log day of a group, with the reviewed LAeq its log gave (GET …/noise-log-days). */
export interface NoiseLogDay {
  shiftResultId: number;
  noiseLogId: number | null;
  measuredOn: string;
  workerId: number;
  workerCode: string;
  /** Reviewed LAeq over the logged run, dB. */
  laeqDb: number;
  /** Logged run time, minutes. */
  durationMinutes: number | null;
}
