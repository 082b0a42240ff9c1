import { sql } from 'drizzle-orm';
import { check, foreignKey, index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createInsertSchema, createSelectSchema } from 'drizzle-zod';
import { z } from 'zod';
import type { ProtectionBands, ProtectionVerdict } from '../stats/hearing-protector-en458';
import { hearingProtectorTypes, RATING_LIMITS, type LevelAtEar } from '../stats/hearing-protector-types';
import { archived, id, timestamp, timestamps } from './columns';
import { exposureGroups } from './exposure-groups';
import { organizationReference } from './organizations';
import { users } from './users';

export { hearingProtectorTypes, hearingProtectorTypeLabels, type HearingProtectorType } from '../stats/hearing-protector-types';

/**
 * The organization's list of hearing protectors: a free-text name (what people call it on site),
 * its type (NIOSH derates by type) and its labelled ratings — NRR (US) and/or SNR with H, M, L
 * (EN ISO 4869-2). Archived, never deleted: groups may still list it.
 */
export const hearingProtectors = sqliteTable(
  'hearing_protectors',
  {
    id: id(),
    organizationId: organizationReference(),
    name: text('name').notNull(),
    type: text('type', { enum: hearingProtectorTypes }).notNull(),
    nrr: real('nrr'),
    snr: real('snr'),
    h: real('h'),
    m: real('m'),
    l: real('l'),
    notes: text('notes').notNull().default(''),
    archived: archived(),
    ...timestamps(),
  },
  (table) => [
    uniqueIndex('hearing_protectors_organization_name_idx').on(table.organizationId, table.name),
    uniqueIndex('hearing_protectors_id_organization_idx').on(table.id, table.organizationId),
    check('hearing_protectors_nrr_range', sql`${table.nrr} IS NULL OR (${table.nrr} >= 0 AND ${table.nrr} <= 45)`),
    check(
      'hearing_protectors_octave_range',
      sql`(${table.snr} IS NULL OR (${table.snr} >= 0 AND ${table.snr} <= 50)) AND (${table.h} IS NULL OR (${table.h} >= 0 AND ${table.h} <= 50)) AND (${table.m} IS NULL OR (${table.m} >= 0 AND ${table.m} <= 50)) AND (${table.l} IS NULL OR (${table.l} >= 0 AND ${table.l} <= 50))`,
    ),
  ],
);

/** Which protectors a (noise) exposure group uses. Removing one is audited. */
export const groupHearingProtectors = sqliteTable(
  'group_hearing_protectors',
  {
    id: id(),
    organizationId: organizationReference(),
    exposureGroupId: integer('exposure_group_id').notNull(),
    protectorId: integer('protector_id').notNull(),
    addedByUserId: integer('added_by_user_id').references(() => users.id),
    createdAt: timestamp('created_at').notNull(),
  },
  (table) => [
    foreignKey({ columns: [table.exposureGroupId, table.organizationId], foreignColumns: [exposureGroups.id, exposureGroups.organizationId] }),
    foreignKey({ columns: [table.protectorId, table.organizationId], foreignColumns: [hearingProtectors.id, hearingProtectors.organizationId] }),
    uniqueIndex('group_hearing_protectors_pair_idx').on(table.exposureGroupId, table.protectorId),
    index('group_hearing_protectors_protector_idx').on(table.protectorId),
  ],
);

const nrrField = z
  .number({ message: 'Enter the NRR as a number of dB' })
  .min(0, 'The NRR must be from 0 to 45 dB')
  .max(RATING_LIMITS.nrrMaxDb, 'The NRR must be from 0 to 45 dB')
  .nullable()
  .optional();
const octaveField = (name: string) =>
  z
    .number({ message: `Enter ${name} as a number of dB` })
    .min(0, `${name} must be from 0 to 50 dB`)
    .max(RATING_LIMITS.octaveMaxDb, `${name} must be from 0 to 50 dB`)
    .nullable()
    .optional();

export const hearingProtectorSelect = createSelectSchema(hearingProtectors);
const protectorFields = createInsertSchema(hearingProtectors, {
  name: (schema) => schema.trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters'),
  notes: (schema) => schema.trim().max(2000),
})
  .pick({ name: true, type: true, notes: true })
  .extend({
    type: z.enum(hearingProtectorTypes, { message: `Use one of ${hearingProtectorTypes.join(', ')}` }),
    nrr: nrrField,
    snr: octaveField('The SNR'),
    h: octaveField('H'),
    m: octaveField('M'),
    l: octaveField('L'),
  });

/** A protector needs at least one rating; H, M and L come together (the HML method needs all three). */
function checkRatings(
  protector: { nrr?: number | null; snr?: number | null; h?: number | null; m?: number | null; l?: number | null },
  context: z.RefinementCtx,
) {
  const hml = [protector.h, protector.m, protector.l];
  const given = hml.filter((value) => value != null).length;
  if (given > 0 && given < 3) {
    for (const key of ['h', 'm', 'l'] as const)
      if (protector[key] == null) context.addIssue({ code: 'custom', path: [key], message: 'Give H, M and L together (the HML method needs all three)' });
  }
}

/** Add a protector: at least one of NRR, SNR or H/M/L. */
export const hearingProtectorCreate = protectorFields.superRefine((protector, context) => {
  checkRatings(protector, context);
  if (protector.nrr == null && protector.snr == null && protector.h == null)
    context.addIssue({ code: 'custom', path: ['nrr'], message: 'Give at least one rating: the NRR, the SNR, or H, M and L' });
});
/** Edit a protector; the service checks the merged row has a rating. */
export const hearingProtectorUpdate = protectorFields
  .partial()
  .extend({ archived: z.boolean().optional() })
  .superRefine((protector, context) => checkRatings(protector, context));

/** Put a protector on a group's "in use" list. */
export const groupProtectorAdd = z.object({ protectorId: z.number({ message: 'Choose a protector' }).int().positive('Choose a protector') });

/**
 * What level the adequacy is worked from: the group's 95th percentile estimate (`p95`, from its
 * valid shift results; dose converted to a TWA by the group's criteria set) or a level typed in
 * (`typed`: LA required, LC optional). When LC is unknown the EN 458 methods use LC = LA + the
 * assumed difference (default 2 dB; at 2 dB the HML estimate is simply M).
 */
export const protectorAdequacyQuery = z
  .object({
    level: z.enum(['p95', 'typed'], { message: 'Use p95 or typed' }).default('p95'),
    la: z.coerce.number({ message: 'Enter LA as a number of dB' }).min(40, 'LA must be from 40 to 150 dB').max(150, 'LA must be from 40 to 150 dB').optional(),
    lc: z.coerce.number({ message: 'Enter LC as a number of dB' }).min(40, 'LC must be from 40 to 150 dB').max(150, 'LC must be from 40 to 150 dB').optional(),
    assumedCMinusA: z.coerce
      .number({ message: 'Enter the assumed LC − LA as a number of dB' })
      .min(-5, 'Use −5 to 20 dB')
      .max(20, 'Use −5 to 20 dB')
      .default(2),
  })
  .superRefine((query, context) => {
    if (query.level === 'typed' && query.la === undefined) context.addIssue({ code: 'custom', path: ['la'], message: 'Enter the A-weighted level LA (dB)' });
  });

/** Organization settings for the protector verdicts (see schema/organizations.ts for sources). */
export const protectorSettingsUpdate = z
  .object({
    protectorActionLevelDb: z.number({ message: 'Enter a number of dB(A)' }).min(60, 'Use 60 to 100 dB(A)').max(100, 'Use 60 to 100 dB(A)'),
    protectorAcceptableMarginDb: z.number({ message: 'Enter a number of dB' }).positive('Above 0').max(30),
    protectorGoodMarginDb: z.number({ message: 'Enter a number of dB' }).positive('Above 0').max(30),
    protectorOverProtectionMarginDb: z.number({ message: 'Enter a number of dB' }).positive('Above 0').max(40),
  })
  .superRefine((values, context) => {
    if (!(values.protectorGoodMarginDb > values.protectorAcceptableMarginDb))
      context.addIssue({ code: 'custom', path: ['protectorGoodMarginDb'], message: 'The "good" margin must be larger than the "acceptable" margin' });
    if (!(values.protectorOverProtectionMarginDb > values.protectorGoodMarginDb))
      context.addIssue({
        code: 'custom',
        path: ['protectorOverProtectionMarginDb'],
        message: 'The over-protection margin must be larger than the "good" margin',
      });
  });

export type HearingProtector = z.infer<typeof hearingProtectorSelect>;
export type HearingProtectorCreate = z.infer<typeof hearingProtectorCreate>;
export type HearingProtectorUpdate = z.infer<typeof hearingProtectorUpdate>;
export type ProtectorAdequacyQuery = z.infer<typeof protectorAdequacyQuery>;
export type ProtectorSettingsValues = z.infer<typeof protectorSettingsUpdate>;

// ---------------------------------------------------------------- over the wire (backend/src/services/hearing-protectors.ts)

/** A protector as the API lists it: its rating warnings and how many groups use it. */
export type HearingProtectorView = Omit<HearingProtector, 'organizationId'> & { warnings: string[]; groupCount: number };

/** One method's answer for one protector: an estimate with its verdict, or why the method does not apply. */
export type ProtectorEstimate = (LevelAtEar & { verdict: ProtectionVerdict; unavailable: null }) | { method: string; source: string; unavailable: string };

/** GET …/exposure-groups/:groupId/protector-adequacy: the level used, the bands, and each protector's (and pair's) estimates. */
export interface ProtectorAdequacy {
  group: { id: number; name: string; oelUnit: string; noiseCriteriaSet: string | null; actionLevel: number | null };
  level: { source: 'p95' | 'typed'; laDb: number; lcDb: number | null; assumedCMinusADb: number; statement: string };
  bands: ProtectionBands & { statement: string; source: string };
  protectors: Array<{ protector: HearingProtectorView; estimates: ProtectorEstimate[] }>;
  /** Each earplug × earmuff pair in use, as if worn together (dual protection). */
  combinations: Array<{ plug: HearingProtectorView; muff: HearingProtectorView; estimates: ProtectorEstimate[] }>;
  cautions: string[];
}
