import { sql } from 'drizzle-orm';
import { blob, check, foreignKey, index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { z } from 'zod';
import { calendarDate, id, timestamp, timestamps } from './columns';
import { exposureGroups } from './exposure-groups';
import { organizationReference } from './organizations';
import { shiftResults } from './shift-results';
import { users } from './users';
import { workers } from './workers';

/**
 * Noise logs (issue 5; PRODUCT.md "Noise log format, version 1"). The file is kept byte for byte
 * with its SHA-256 so every figure traces back to what was uploaded; the parsed channels are kept
 * as one Float64Array blob each (docs/decisions/004), so the review page recomputes the figures
 * without parsing the file again. Nothing here is ever deleted.
 */

/** Largest noise log file accepted, bytes (50 MB; the same default as stats/noise-log.ts). */
export const noiseLogMaximumBytes = 50 * 1024 * 1024;

export const noiseLogStatuses = ['uploaded', 'reviewed', 'accepted'] as const;
export type NoiseLogStatus = (typeof noiseLogStatuses)[number];

/** Channels stored per log (Float64Array bytes; `moving` as Uint8Array bytes). */
export const noiseChannelNames = ['tS', 'laeqDb', 'lcPeakDb', 'axMg', 'ayMg', 'azMg', 'apeakMg', 'moving'] as const;
export type NoiseChannelName = (typeof noiseChannelNames)[number];

/** Metadata as stored (the parsed `# key: value` lines, or what the column mapping supplied). */
export interface NoiseLogStoredMetadata {
  version: 1;
  intervalSeconds: number;
  instrument: string | null;
  worker: string | null;
  start: string | null;
  shiftHours: number | null;
  calibrationReferenceDb: number | null;
  calibrationBeforeDb: number | null;
  calibrationAfterDb: number | null;
  other: Record<string, string>;
}

/** As-logged figures kept on the row for lists (the CLI document's `asLogged` and a few more). */
export interface NoiseLogSummary {
  asLogged: Record<string, unknown>;
  maxLcPeakDb: number | null;
  calibrationDriftDb: number | null;
  stillStretchCount: number | null;
  longestStillStretchSeconds: number | null;
  knockCount: number | null;
}

export const noiseLogs = sqliteTable(
  'noise_logs',
  {
    id: id(),
    organizationId: organizationReference(),
    exposureGroupId: integer('exposure_group_id').notNull(),
    workerId: integer('worker_id').notNull(),
    instrument: text('instrument').notNull().default(''),
    shiftDate: text('shift_date').notNull(),
    uploadedByUserId: integer('uploaded_by_user_id').references(() => users.id),
    fileName: text('file_name').notNull(),
    fileSize: integer('file_size').notNull(),
    /** The uploaded file, unchanged. */
    rawFile: blob('raw_file', { mode: 'buffer' }).notNull(),
    /** Hex SHA-256 of `raw_file`. */
    sha256: text('sha256').notNull(),
    /** `v1` (our format) or `mapped` (any CSV through a column mapping). */
    format: text('format', { enum: ['v1', 'mapped'] }).notNull(),
    /** The column mapping used for a `mapped` file. */
    mapping: text('mapping', { mode: 'json' }).$type<NoiseColumnMapping | null>(),
    metadata: text('metadata', { mode: 'json' }).$type<NoiseLogStoredMetadata>().notNull(),
    /** Organization noise settings in force at upload (the wear check and proposed masks used them). */
    settings: text('settings', { mode: 'json' }).$type<Record<string, number>>().notNull(),
    intervalSeconds: real('interval_seconds').notNull(),
    intervalCount: integer('interval_count').notNull(),
    runSeconds: real('run_seconds').notNull(),
    summary: text('summary', { mode: 'json' }).$type<NoiseLogSummary>().notNull(),
    status: text('status', { enum: noiseLogStatuses }).notNull().default('uploaded'),
    /** The shift result made from this log when it was accepted into the group. */
    shiftResultId: integer('shift_result_id'),
    acceptedByUserId: integer('accepted_by_user_id').references(() => users.id),
    acceptedAt: timestamp('accepted_at'),
    ...timestamps(),
  },
  (table) => [
    foreignKey({ columns: [table.exposureGroupId, table.organizationId], foreignColumns: [exposureGroups.id, exposureGroups.organizationId] }),
    foreignKey({ columns: [table.workerId, table.organizationId], foreignColumns: [workers.id, workers.organizationId] }),
    foreignKey({ columns: [table.shiftResultId, table.organizationId], foreignColumns: [shiftResults.id, shiftResults.organizationId] }),
    uniqueIndex('noise_logs_id_organization_idx').on(table.id, table.organizationId),
    index('noise_logs_group_idx').on(table.exposureGroupId, table.shiftDate),
    index('noise_logs_worker_idx').on(table.workerId, table.shiftDate),
    check('noise_logs_interval_range', sql`${table.intervalSeconds} >= 0.125 AND ${table.intervalSeconds} <= 60`),
  ],
);

/** One derived channel of a log, as typed-array bytes (little-endian, as the platform writes them). */
export const noiseLogChannels = sqliteTable(
  'noise_log_channels',
  {
    id: id(),
    noiseLogId: integer('noise_log_id')
      .notNull()
      .references(() => noiseLogs.id),
    channel: text('channel', { enum: noiseChannelNames }).notNull(),
    data: blob('data', { mode: 'buffer' }).notNull(),
  },
  (table) => [uniqueIndex('noise_log_channels_log_channel_idx').on(table.noiseLogId, table.channel)],
);

export const noiseMaskOrigins = ['proposed', 'reviewer'] as const;
export type NoiseMaskOrigin = (typeof noiseMaskOrigins)[number];
export const noiseMaskStatuses = ['active', 'removed'] as const;

/**
 * Masked spans of a log. Proposed ones come from the wear check (knocks); reviewers add their own.
 * A mask is never deleted: removing it sets `status` to `removed` with who and when.
 */
export const noiseMasks = sqliteTable(
  'noise_masks',
  {
    id: id(),
    organizationId: organizationReference(),
    noiseLogId: integer('noise_log_id').notNull(),
    startS: real('start_s').notNull(),
    endS: real('end_s').notNull(),
    reason: text('reason').notNull(),
    origin: text('origin', { enum: noiseMaskOrigins }).notNull(),
    status: text('status', { enum: noiseMaskStatuses }).notNull().default('active'),
    authorUserId: integer('author_user_id').references(() => users.id),
    removedByUserId: integer('removed_by_user_id').references(() => users.id),
    removedAt: timestamp('removed_at'),
    ...timestamps(),
  },
  (table) => [
    foreignKey({ columns: [table.noiseLogId, table.organizationId], foreignColumns: [noiseLogs.id, noiseLogs.organizationId] }),
    index('noise_masks_log_idx').on(table.noiseLogId),
    check('noise_masks_span', sql`${table.endS} > ${table.startS}`),
  ],
);

/** Units the time column of a mapped CSV may be in. */
export const noiseTimeUnits = ['s', 'ms', 'min'] as const;
/** Units the acceleration columns of a mapped CSV may be in. */
export const noiseAccelerationUnits = ['mg', 'g'] as const;

const mappedColumn = z.string().trim().min(1, 'Pick a column').max(200).nullable().optional();

/** Which column of a CSV holds which channel, with units and the interval. */
export const noiseColumnMapping = z.object({
  time: z.string({ message: 'Pick the time column' }).trim().min(1, 'Pick the time column').max(200),
  timeUnit: z.enum(noiseTimeUnits, { message: 'Use s, ms or min' }),
  level: z.string({ message: 'Pick the A-weighted level column' }).trim().min(1, 'Pick the A-weighted level column').max(200),
  peak: mappedColumn,
  accelerationX: mappedColumn,
  accelerationY: mappedColumn,
  accelerationZ: mappedColumn,
  accelerationPeak: mappedColumn,
  accelerationUnit: z.enum(noiseAccelerationUnits, { message: 'Use mg or g' }).default('mg'),
  moving: mappedColumn,
  intervalSeconds: z.number({ message: 'Give the interval in seconds' }).min(0.125, 'The interval is 0.125–60 s').max(60, 'The interval is 0.125–60 s'),
});
export type NoiseColumnMapping = z.infer<typeof noiseColumnMapping>;

/** Named column-mapping presets per organization. */
export const noiseMappingPresets = sqliteTable(
  'noise_mapping_presets',
  {
    id: id(),
    organizationId: organizationReference(),
    name: text('name').notNull(),
    mapping: text('mapping', { mode: 'json' }).$type<NoiseColumnMapping>().notNull(),
    createdByUserId: integer('created_by_user_id').references(() => users.id),
    ...timestamps(),
  },
  (table) => [uniqueIndex('noise_mapping_presets_name_idx').on(table.organizationId, table.name)],
);

/** Form fields sent with the file (multipart text fields arrive as strings). */
export const noiseLogUploadFields = z.object({
  exposureGroupId: z.coerce.number({ message: 'Pick the exposure group' }).int().positive('Pick the exposure group'),
  workerId: z.coerce.number({ message: 'Pick the worker' }).int().positive('Pick the worker'),
  instrument: z.string().trim().max(200).optional().default(''),
  shiftDate: calendarDate,
  /** JSON of a {@link noiseColumnMapping} for a CSV that is not our format. */
  mapping: z.string().optional(),
  /** Save the mapping as a preset under this name. */
  presetName: z.string().trim().max(100).optional(),
});

const reason = z.string({ message: 'Give a reason' }).trim().min(3, 'Give a reason (at least 3 characters)').max(500, 'Use at most 500 characters');

/** A new mask, or a change of its span. */
export const noiseMaskCreate = z
  .object({ startS: z.number({ message: 'Give the start in seconds' }).min(0), endS: z.number({ message: 'Give the end in seconds' }).min(0), reason })
  .refine((mask) => mask.endS > mask.startS, { path: ['endS'], message: 'The end must be after the start' });
export const noiseMaskUpdate = z
  .object({ startS: z.number().min(0), endS: z.number().min(0), reason })
  .refine((mask) => mask.endS > mask.startS, { path: ['endS'], message: 'The end must be after the start' });
export const noiseMaskRemove = z.object({ reason });

export const noiseChannelQuery = z.object({
  fromS: z.coerce.number().min(0).optional(),
  toS: z.coerce.number().min(0).optional(),
  /** Most points per channel in the answer (min/max per bucket above it). */
  points: z.coerce.number().int().min(100).max(20_000).default(4000),
});

export const noiseLogListQuery = z.object({
  groupId: z.coerce.number().int().positive().optional(),
  workerId: z.coerce.number().int().positive().optional(),
});

/** Organization noise settings as the settings page edits them (PRODUCT.md defaults). */
export const noiseSettingsUpdate = z.object({
  stillMinutes: z.number().positive('Above 0').max(480),
  motionChangeMg: z.number().positive('Above 0').max(10_000),
  knockMg: z.number().positive('Above 0').max(100_000),
  maskBeforeS: z.number().min(0).max(3600),
  maskAfterS: z.number().min(0).max(3600),
  driftLimitDb: z.number().positive('Above 0').max(20),
});
export type NoiseSettingsValues = z.infer<typeof noiseSettingsUpdate>;

export type NoiseLogRow = typeof noiseLogs.$inferSelect;
export type NoiseMask = typeof noiseMasks.$inferSelect;
export type NoiseMappingPreset = typeof noiseMappingPresets.$inferSelect;
