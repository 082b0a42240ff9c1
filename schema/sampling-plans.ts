import { sql } from 'drizzle-orm';
import { check, foreignKey, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createInsertSchema, createSelectSchema } from 'drizzle-zod';
import { z } from 'zod';
import { archived, calendarDate, id, timestamps } from './columns';
import { exposureGroups } from './exposure-groups';
import { organizationReference } from './organizations';
import { users } from './users';
import { workers } from './workers';

/** Default number of shifts a plan asks for (see `samplingGuidance`). */
export const defaultTargetCount = 6;

/** Largest seed `createRandom` takes (stats/random.ts): seeds are integers 1 … 2³² − 1. */
export const maximumSeed = 4_294_967_295;

/**
 * Why a plan asks for 6 shifts by default, with its sources, shown beside the target count.
 * `status` says how each statement was checked (REFERENCES.md marks).
 */
export const samplingGuidance = {
  defaultTargetCount,
  text:
    'Plan at least 6 valid full-shift results per exposure group: EN 689:2018 applies its statistical test from 6 results ' +
    '(3 to 5 results allow only its preliminary test). The trade usually plans 6 to 10 shifts per group; plan toward 10 ' +
    'when results vary widely (GSD above about 2.5) or lie near the OEL. Picks are drawn at random among the group’s ' +
    'workers and working days so that every worker-shift has the same chance.',
  sources: [
    { citation: 'EN 689:2018, Workplace exposure — Measurement of exposure by inhalation to chemical agents: statistical test from 6 results', status: 'read' },
    { citation: 'EN 689:2018, preliminary test with 3 to 5 results', status: 'from memory' },
    {
      citation: 'AIHA, A Strategy for Assessing and Managing Occupational Exposures (3rd ed. 2006, 4th ed. 2015): 6 to 10 samples per group',
      status: 'from memory',
    },
    {
      citation: 'Leidel, Busch & Lynch (1977), NIOSH Occupational Exposure Sampling Strategy Manual, Publ. 77-173: random choice of sampling periods',
      status: 'from memory',
    },
  ],
} as const;

/**
 * A sampling plan for one exposure group: how many shifts to measure, between which dates, drawn
 * at random from the seed. `draw` counts the draws: a redraw (new seed) or a change of the
 * parameters makes a new draw; earlier draws' picks stay in `planned_picks` (nothing is deleted).
 */
export const samplingPlans = sqliteTable(
  'sampling_plans',
  {
    id: id(),
    organizationId: organizationReference(),
    exposureGroupId: integer('exposure_group_id').notNull(),
    title: text('title').notNull().default(''),
    targetCount: integer('target_count').notNull().default(defaultTargetCount),
    startDate: text('start_date').notNull(),
    endDate: text('end_date').notNull(),
    includeWeekends: integer('include_weekends', { mode: 'boolean' }).notNull().default(false),
    /** The seed of the current draw (stats/random.ts `createRandom`). */
    seed: integer('seed').notNull(),
    draw: integer('draw').notNull().default(1),
    /** How many worker-shifts were there to draw from at the current draw. */
    availableShifts: integer('available_shifts').notNull().default(0),
    notes: text('notes').notNull().default(''),
    archived: archived(),
    createdByUserId: integer('created_by_user_id').references(() => users.id),
    ...timestamps(),
  },
  (table) => [
    foreignKey({
      columns: [table.exposureGroupId, table.organizationId],
      foreignColumns: [exposureGroups.id, exposureGroups.organizationId],
    }),
    uniqueIndex('sampling_plans_id_organization_idx').on(table.id, table.organizationId),
    index('sampling_plans_group_idx').on(table.exposureGroupId),
    check('sampling_plans_target_count_range', sql`${table.targetCount} >= 1 AND ${table.targetCount} <= 200`),
    check('sampling_plans_dates_ordered', sql`${table.endDate} >= ${table.startDate}`),
    check('sampling_plans_seed_range', sql`${table.seed} >= 1 AND ${table.seed} <= ${sql.raw(String(maximumSeed))}`),
  ],
);

/** One worker-shift picked by a plan's draw. */
export const plannedPicks = sqliteTable(
  'planned_picks',
  {
    id: id(),
    organizationId: organizationReference(),
    samplingPlanId: integer('sampling_plan_id').notNull(),
    draw: integer('draw').notNull(),
    workerId: integer('worker_id').notNull(),
    date: text('date').notNull(),
    /** Order in which the draw picked it (1 = first). */
    position: integer('position').notNull(),
  },
  (table) => [
    foreignKey({
      columns: [table.samplingPlanId, table.organizationId],
      foreignColumns: [samplingPlans.id, samplingPlans.organizationId],
    }),
    foreignKey({ columns: [table.workerId, table.organizationId], foreignColumns: [workers.id, workers.organizationId] }),
    uniqueIndex('planned_picks_plan_draw_worker_date_idx').on(table.samplingPlanId, table.draw, table.workerId, table.date),
  ],
);

const maximumPlanDays = 730;

/** Whole days from `startDate` to `endDate` (UTC calendar dates). */
function daysBetween(startDate: string, endDate: string): number {
  return Math.round((Date.parse(`${endDate}T00:00:00Z`) - Date.parse(`${startDate}T00:00:00Z`)) / 86_400_000);
}

export const samplingPlanSelect = createSelectSchema(samplingPlans);
const samplingPlanFields = createInsertSchema(samplingPlans, {
  title: (schema) => schema.trim().max(120, 'Use at most 120 characters'),
  targetCount: (schema) => schema.int('Use a whole number').min(1, 'Plan at least 1 shift').max(200, 'Plan at most 200 shifts'),
  startDate: calendarDate,
  endDate: calendarDate,
  seed: (schema) => schema.int('Use a whole number').min(1, 'Use a seed from 1').max(maximumSeed, `Use a seed up to ${maximumSeed}`),
  notes: (schema) => schema.trim().max(4000),
}).pick({ title: true, targetCount: true, startDate: true, endDate: true, includeWeekends: true, seed: true, notes: true });

/** A real calendar date (2025-02-30 is not; the field's own check reports it). */
const isRealDate = (text: string) => calendarDate.safeParse(text).success && new Date(`${text}T00:00:00Z`).toISOString().startsWith(text);

const datesInOrder = <Shape extends { startDate?: string; endDate?: string }>(plan: Shape, context: z.RefinementCtx) => {
  if (plan.startDate === undefined || plan.endDate === undefined || !isRealDate(plan.startDate) || !isRealDate(plan.endDate)) return;
  const days = daysBetween(plan.startDate, plan.endDate);
  if (days < 0) context.addIssue({ code: 'custom', path: ['endDate'], message: 'The end date is before the start date' });
  else if (days > maximumPlanDays) context.addIssue({ code: 'custom', path: ['endDate'], message: `A plan spans at most ${maximumPlanDays} days` });
};

/** Create a plan; without a seed the server makes one. */
export const samplingPlanCreate = samplingPlanFields.partial({ seed: true }).superRefine(datesInOrder);
/** Edit a plan. Changing the target, dates or weekends redraws with the same seed; title and notes do not. */
export const samplingPlanUpdate = samplingPlanFields.omit({ seed: true }).partial().extend({ archived: z.boolean().optional() }).superRefine(datesInOrder);
/** Redraw with a new seed (made by the server unless given); `reason` goes to the audit trail. */
export const samplingPlanRedraw = z.object({
  seed: samplingPlanFields.shape.seed.optional(),
  reason: z.string().trim().max(500, 'Use at most 500 characters').optional(),
});

export type SamplingPlan = z.infer<typeof samplingPlanSelect>;
export type SamplingPlanCreate = z.infer<typeof samplingPlanCreate>;
export type SamplingPlanUpdate = z.infer<typeof samplingPlanUpdate>;
export type SamplingPlanRedraw = z.infer<typeof samplingPlanRedraw>;
export type PlannedPick = typeof plannedPicks.$inferSelect;
