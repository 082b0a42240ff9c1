import { sql } from 'drizzle-orm';
import { check, foreignKey, index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createInsertSchema, createSelectSchema } from 'drizzle-zod';
import { z } from 'zod';
import { averagingTimes, exposureUnits } from './agents';
import { agents, oelEntries } from './agents';
import { archived, id, timestamp, timestamps } from './columns';
import { organizationReference } from './organizations';
import { sites } from './sites';

/** Noise criteria sets (PRODUCT.md "Dose per criteria set"); `iso` means LAeq and LEX,8h. */
export const noiseCriteriaSets = ['oshaPel', 'oshaHc', 'nioshRel', 'iso'] as const;
export type NoiseCriteriaSet = (typeof noiseCriteriaSets)[number];

/**
 * How a group's 8-hour OEL is adjusted for a shift longer than 8 h: not at all, or by the
 * Brief & Scala reduction factor (stats/extended-shift.ts). Only for chemical 8-hour TWA limits.
 */
export const extendedShiftAdjustments = ['none', 'brief-scala'] as const;
export type ExtendedShiftAdjustment = (typeof extendedShiftAdjustments)[number];

/**
 * An exposure group: workers at one site whose tasks, processes and controls give them a similar
 * exposure to one agent, judged against one OEL. The OEL is copied onto the group (value, unit,
 * source, averaging time) with a link to the list entry it came from, so a later edit of the
 * organization's OEL list never silently changes what a group is judged against.
 */
export const exposureGroups = sqliteTable(
  'exposure_groups',
  {
    id: id(),
    organizationId: organizationReference(),
    siteId: integer('site_id').notNull(),
    name: text('name').notNull(),
    processArea: text('process_area').notNull().default(''),
    jobTitles: text('job_titles', { mode: 'json' })
      .$type<string[]>()
      .notNull()
      .default(sql`'[]'`),
    tasks: text('tasks').notNull().default(''),
    agentId: integer('agent_id').notNull(),
    oelEntryId: integer('oel_entry_id'),
    oelValue: real('oel_value').notNull(),
    oelUnit: text('oel_unit', { enum: exposureUnits }).notNull(),
    oelSource: text('oel_source').notNull(),
    oelAveragingTime: text('oel_averaging_time', { enum: averagingTimes }).notNull(),
    /** Action level in the OEL's unit (for noise, the hearing conservation trigger). */
    actionLevel: real('action_level'),
    shiftHours: real('shift_hours').notNull().default(8),
    /** For noise groups: the criteria set the group is judged with. */
    noiseCriteriaSet: text('noise_criteria_set', { enum: noiseCriteriaSets }),
    exposureProfile: text('exposure_profile').notNull().default(''),
    extendedShiftAdjustment: text('extended_shift_adjustment', { enum: extendedShiftAdjustments }).notNull().default('none'),
    /**
     * Goes up by one with every change to the group's shift results (entered, imported, voided,
     * restored), with the time in `results_changed_at`: a decision record stores the version it was
     * made from and is out of date when the group's version has moved on.
     */
    dataVersion: integer('data_version').notNull().default(0),
    resultsChangedAt: timestamp('results_changed_at'),
    archived: archived(),
    ...timestamps(),
  },
  (table) => [
    foreignKey({ columns: [table.siteId, table.organizationId], foreignColumns: [sites.id, sites.organizationId] }),
    foreignKey({ columns: [table.agentId, table.organizationId], foreignColumns: [agents.id, agents.organizationId] }),
    foreignKey({
      columns: [table.oelEntryId, table.organizationId],
      foreignColumns: [oelEntries.id, oelEntries.organizationId],
    }),
    uniqueIndex('exposure_groups_site_name_idx').on(table.siteId, table.name),
    uniqueIndex('exposure_groups_id_organization_idx').on(table.id, table.organizationId),
    index('exposure_groups_organization_idx').on(table.organizationId),
    check('exposure_groups_oel_positive', sql`${table.oelValue} > 0`),
    check('exposure_groups_action_level_positive', sql`${table.actionLevel} IS NULL OR ${table.actionLevel} > 0`),
    check('exposure_groups_shift_hours_range', sql`${table.shiftHours} > 0 AND ${table.shiftHours} <= 24`),
  ],
);

export const exposureGroupSelect = createSelectSchema(exposureGroups, {
  jobTitles: z.array(z.string()),
});
const oelFields = { oelValue: true, oelUnit: true, oelSource: true, oelAveragingTime: true } as const;

/** Every field a client may set on a group (the OEL fields required, as in the table). */
const exposureGroupFields = createInsertSchema(exposureGroups, {
  name: (schema) => schema.trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters'),
  processArea: (schema) => schema.trim().max(200),
  jobTitles: z.array(z.string().trim().min(1, 'A job title cannot be blank').max(120)).max(50, 'Use at most 50 job titles').optional(),
  tasks: (schema) => schema.trim().max(4000),
  oelValue: (schema) => schema.positive('Use an OEL above 0'),
  oelSource: (schema) => schema.trim().min(1, 'Name the source of the limit').max(200),
  actionLevel: (schema) => schema.positive('Use an action level above 0'),
  shiftHours: (schema) => schema.positive('Use a shift longer than 0 hours').max(24, 'A shift is at most 24 hours'),
  exposureProfile: (schema) => schema.trim().max(4000),
}).omit({
  id: true,
  organizationId: true,
  archived: true,
  dataVersion: true,
  resultsChangedAt: true,
  createdAt: true,
  updatedAt: true,
});

/**
 * Create a group. The OEL is either picked from the organization's list (`oelEntryId`: value,
 * unit, source and averaging time are copied from the entry) or typed in (all four fields).
 */
export const exposureGroupCreate = exposureGroupFields.partial(oelFields).superRefine((group, context) => {
  if (group.oelEntryId != null) return;
  for (const field of Object.keys(oelFields) as Array<keyof typeof oelFields>) {
    if (group[field] == null)
      context.addIssue({ code: 'custom', path: [field], message: 'Give the OEL value, unit, source and averaging time, or pick an entry from the OEL list' });
  }
});
/** Edit a group; `oelEntryId` copies that entry's OEL onto the group. */
export const exposureGroupUpdate = exposureGroupFields.partial().extend({ archived: z.boolean().optional() });

export type ExposureGroup = z.infer<typeof exposureGroupSelect>;
export type ExposureGroupCreate = z.infer<typeof exposureGroupCreate>;
export type ExposureGroupUpdate = z.infer<typeof exposureGroupUpdate>;
