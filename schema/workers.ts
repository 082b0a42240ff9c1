import { sql } from 'drizzle-orm';
import { check, foreignKey, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createInsertSchema, createSelectSchema } from 'drizzle-zod';
import { z } from 'zod';
import { archived, calendarDate, id, timestamp, timestamps } from './columns';
import { exposureGroups } from './exposure-groups';
import { organizationReference } from './organizations';

/**
 * A person whose exposure is measured. The code (e.g. RT-001) is what results and noise logs
 * refer to; the name is optional and hidden from consultants (permission `workerNames:read`).
 */
export const workers = sqliteTable(
  'workers',
  {
    id: id(),
    organizationId: organizationReference(),
    code: text('code').notNull(),
    name: text('name'),
    jobTitle: text('job_title').notNull().default(''),
    /**
     * Where letters to the worker are e-mailed (worker letters, docs/decisions/024); optional. Personal
     * data like the name: sent only to roles holding `workerNames:read`, never written to the audit trail.
     */
    email: text('email'),
    archived: archived(),
    ...timestamps(),
  },
  (table) => [
    uniqueIndex('workers_organization_code_idx').on(table.organizationId, table.code),
    uniqueIndex('workers_id_organization_idx').on(table.id, table.organizationId),
  ],
);

/**
 * A worker's membership of an exposure group over time: from `from_date` to `to_date`
 * (both inclusive, calendar dates; `to_date` null = still a member).
 */
export const groupMemberships = sqliteTable(
  'group_memberships',
  {
    id: id(),
    organizationId: organizationReference(),
    workerId: integer('worker_id').notNull(),
    exposureGroupId: integer('exposure_group_id').notNull(),
    fromDate: text('from_date').notNull(),
    toDate: text('to_date'),
    createdAt: timestamp('created_at').notNull(),
    updatedAt: timestamp('updated_at').notNull(),
  },
  (table) => [
    foreignKey({ columns: [table.workerId, table.organizationId], foreignColumns: [workers.id, workers.organizationId] }),
    foreignKey({
      columns: [table.exposureGroupId, table.organizationId],
      foreignColumns: [exposureGroups.id, exposureGroups.organizationId],
    }),
    index('group_memberships_group_idx').on(table.exposureGroupId, table.fromDate),
    index('group_memberships_worker_idx').on(table.workerId),
    check('group_memberships_dates_ordered', sql`${table.toDate} IS NULL OR ${table.toDate} >= ${table.fromDate}`),
  ],
);

const workerCode = (schema: z.ZodString) =>
  schema
    .trim()
    .min(1, 'Enter a worker code')
    .max(40, 'Use at most 40 characters')
    .regex(/^[A-Za-z0-9][A-Za-z0-9._-]*$/, 'Use letters, digits, dots, hyphens and underscores');

export const workerSelect = createSelectSchema(workers);
export const workerCreate = createInsertSchema(workers, {
  code: workerCode,
  name: (schema) => schema.trim().max(120),
  jobTitle: (schema) => schema.trim().max(120),
})
  .pick({ code: true, name: true, jobTitle: true })
  .extend({
    // Blank clears the address; otherwise it must look like one.
    email: z
      .string()
      .trim()
      .max(254, 'Use at most 254 characters')
      .pipe(z.union([z.literal(''), z.email('Enter an e-mail address such as name@example.com')]))
      .nullable()
      .optional(),
  });
export const workerUpdate = workerCreate.partial().extend({ archived: workerSelect.shape.archived.optional() });

export const groupMembershipSelect = createSelectSchema(groupMemberships);
export const groupMembershipCreate = createInsertSchema(groupMemberships, {
  fromDate: calendarDate,
  toDate: calendarDate.nullable().optional(),
})
  .pick({ workerId: true, exposureGroupId: true, fromDate: true, toDate: true })
  .refine((row) => row.toDate == null || row.toDate >= row.fromDate, {
    path: ['toDate'],
    message: 'The end date is before the start date',
  });

/** Change a membership's dates (end it with `toDate`, or correct a date typed wrongly). */
export const groupMembershipUpdate = z
  .object({ fromDate: calendarDate, toDate: calendarDate.nullable() })
  .partial()
  .refine((row) => row.fromDate !== undefined || row.toDate !== undefined, 'Give fromDate or toDate')
  .refine((row) => row.toDate == null || row.fromDate == null || row.toDate >= row.fromDate, {
    path: ['toDate'],
    message: 'The end date is before the start date',
  });
/** End an open membership on `toDate` (inclusive: the last day in the group). */
export const groupMembershipEnd = z.object({ toDate: calendarDate });

export type Worker = z.infer<typeof workerSelect>;
export type WorkerCreate = z.infer<typeof workerCreate>;
export type WorkerUpdate = z.infer<typeof workerUpdate>;
export type GroupMembership = z.infer<typeof groupMembershipSelect>;
export type GroupMembershipCreate = z.infer<typeof groupMembershipCreate>;
export type GroupMembershipUpdate = z.infer<typeof groupMembershipUpdate>;
