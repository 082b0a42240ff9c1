import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createSelectSchema } from 'drizzle-zod';
import { z } from 'zod';
import { exposureUnits } from './agents';
import { id, timestamp, timestamps } from './columns';
import { listQueryBase } from './list-query';
import { organizationReference } from './organizations';
import { users } from './users';

/** Largest lab file accepted (bytes). */
export const labImportMaximumBytes = 5 * 1024 * 1024;
/** Most data rows in one lab file. */
export const labImportMaximumRows = 20_000;

export const importBatchStatuses = ['uploaded', 'committed'] as const;
export type ImportBatchStatus = (typeof importBatchStatuses)[number];

/**
 * One uploaded lab file. The raw text and its SHA-256 are kept, so every imported shift result can
 * be traced back to the exact bytes it came from. `uploaded` until committed; a failed commit stores
 * nothing and leaves it `uploaded`, ready for a corrected mapping.
 */
export const importBatches = sqliteTable(
  'import_batches',
  {
    id: id(),
    organizationId: organizationReference(),
    fileName: text('file_name').notNull(),
    fileSize: integer('file_size').notNull(),
    /** Hex SHA-256 of the file's bytes as uploaded. */
    sha256: text('sha256').notNull(),
    /** The file as text (UTF-8, byte-order mark removed). */
    content: text('content').notNull(),
    delimiter: text('delimiter').notNull(),
    rowCount: integer('row_count').notNull(),
    status: text('status', { enum: importBatchStatuses }).notNull().default('uploaded'),
    /** The mapping and options of the commit (null until committed). */
    mapping: text('mapping', { mode: 'json' }).$type<LabImportCommit | null>(),
    resultCount: integer('result_count').notNull().default(0),
    uploadedByUserId: integer('uploaded_by_user_id').references(() => users.id),
    committedByUserId: integer('committed_by_user_id').references(() => users.id),
    committedAt: timestamp('committed_at'),
    ...timestamps(),
  },
  (table) => [
    uniqueIndex('import_batches_id_organization_idx').on(table.id, table.organizationId),
    index('import_batches_organization_idx').on(table.organizationId, table.createdAt),
  ],
);

/** The fields a lab file's columns can be mapped to. */
export const labImportFields = [
  'workerCode',
  'date',
  'group',
  'agent',
  'value',
  'unit',
  'detectionLimit',
  'sampleId',
  'lab',
  'startTime',
  'endTime',
  'minutes',
] as const;
export type LabImportField = (typeof labImportFields)[number];

const columnName = z.string({ message: 'Map a column of the file to this field' }).trim().min(1, 'Map a column of the file to this field').max(200);
const optionalColumn = columnName.nullable().optional();

/** Column of the file (by its header) for each field; required: worker code, date and value. */
export const labImportMapping = z.object({
  workerCode: columnName,
  date: columnName,
  value: columnName,
  group: optionalColumn,
  agent: optionalColumn,
  unit: optionalColumn,
  detectionLimit: optionalColumn,
  sampleId: optionalColumn,
  lab: optionalColumn,
  startTime: optionalColumn,
  endTime: optionalColumn,
  minutes: optionalColumn,
});
export type LabImportMapping = z.infer<typeof labImportMapping>;

export const dateFormats = ['YYYY-MM-DD', 'DD/MM/YYYY', 'MM/DD/YYYY'] as const;
export type DateFormat = (typeof dateFormats)[number];

/**
 * What to assume for the part of the shift no sample covered, when samples are combined into a
 * shift TWA (stats/shift-twa.ts): `zero` — no exposure, divide by the shift length;
 * `sampled-average` — the same as the average of the sampled periods, divide by the sampled time.
 */
export const unsampledTimeAssumptions = ['zero', 'sampled-average'] as const;
export type UnsampledTimeAssumption = (typeof unsampledTimeAssumptions)[number];

/** The commit (and check) request: the mapping plus what the file does not say. */
export const labImportCommit = z.object({
  mapping: labImportMapping,
  defaults: z
    .object({
      /** The group for every row when the file has no group column. */
      exposureGroupId: z.number().int('Use a whole number').positive('Use a positive id').optional(),
      /** The unit of every value when the file has no unit column. */
      unit: z.enum(exposureUnits, { message: `Use one of ${exposureUnits.join(', ')}` }).optional(),
    })
    .default({}),
  dateFormat: z.enum(dateFormats, { message: `Use one of ${dateFormats.join(', ')}` }).default('YYYY-MM-DD'),
  /** Required as soon as a shift's samples carry durations (several samples, or one shorter than the shift). */
  unsampledTime: z.enum(unsampledTimeAssumptions, { message: 'Use zero or sampled-average' }).optional(),
  /** Shift length for every row, hours; default: each group's shift hours. */
  shiftHours: z.number().positive('Use a shift longer than 0 hours').max(24, 'A shift is at most 24 hours').optional(),
});
export type LabImportCommit = z.infer<typeof labImportCommit>;

/** One problem in a lab file: where (row as a spreadsheet numbers it, header = 1; column header) and what. */
export interface LabImportProblem {
  row: number | null;
  column: string | null;
  message: string;
}

/** What the upload and preview endpoints return. */
export interface LabImportPreview {
  delimiter: string;
  columns: Array<{ name: string; examples: string[] }>;
  suggestedMapping: Partial<Record<LabImportField, string | null>>;
  /** The first rows, keyed by column name, with their row numbers. */
  rows: Array<{ row: number; values: Record<string, string> }>;
  rowCount: number;
}

/** Lab imports, newest first; `q` searches the file name and SHA-256. */
export const importBatchListQuery = listQueryBase.extend({
  status: z.enum(importBatchStatuses, { message: 'Use uploaded or committed' }).optional(),
});
export type ImportBatchListQuery = z.infer<typeof importBatchListQuery>;

export const importBatchSelect = createSelectSchema(importBatches);
export type ImportBatch = typeof importBatches.$inferSelect;
/** A batch as lists show it: everything but the file's text. */
export type ImportBatchSummary = Omit<ImportBatch, 'content'>;
