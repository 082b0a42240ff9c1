import { sql } from 'drizzle-orm';
import { check, foreignKey, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { z } from 'zod';
import type { ExposureCategory, Judgement } from '@stats/types';
import { priorNames, type AssessmentSettings, type EngineVersion, type GroupAssessmentResponse, type PriorName } from './assessment';
import { calendarDate, id, timestamp, timestamps } from './columns';
import { exposureGroups } from './exposure-groups';
import { listQueryBase, queryFlag, queryId, sortParameter } from './list-query';
import { organizationReference } from './organizations';
import { users } from './users';

/*
 * Decision records (PRODUCT.md capability 6): a hygienist drafts, an analyst who did not draft approves
 * or returns it. Approval freezes the exact results used (with their SHA-256), the method, engine and
 * software versions, the settings and every figure. An approved record never changes: the service
 * answers 409, and SQLite triggers (migration "decision-records-immutable") refuse an UPDATE of its
 * frozen columns and any DELETE. The only change an approved record takes is `status` → superseded
 * when a newer record for the group is approved.
 */

export const decisionStatuses = ['draft', 'returned', 'approved', 'superseded'] as const;
export type DecisionStatus = (typeof decisionStatuses)[number];
export const judgements = ['acceptable', 'uncertain', 'unacceptable'] as const;

/** One result left out of the figures (what-if), with the hygienist's reason. */
export const decisionExclusion = z.object({
  resultId: z.number().int().positive('Use a result id'),
  reason: z.string().trim().min(1, 'Say why this result is left out').max(500, 'Use at most 500 characters'),
});
export type DecisionExclusion = z.infer<typeof decisionExclusion>;

/** One result as frozen in an approved record. */
export interface FrozenResult {
  id: number;
  workerCode: string;
  date: string;
  value: number;
  nonDetect: boolean;
}

/** What approval freezes about the data: the results used and the ones left out, with the limit judged against. */
export interface FrozenInputs {
  results: FrozenResult[];
  excluded: Array<FrozenResult & { reason: string }>;
  oel: number;
  oelUnit: string;
  oelSource: string;
  actionLevel: number | null;
}

/** The figures an approved record keeps: the assessment answer as computed at approval (minus timing). */
export type FrozenFigures = Omit<GroupAssessmentResponse, 'computation'>;

export const decisionRecords = sqliteTable(
  'decision_records',
  {
    id: id(),
    organizationId: organizationReference(),
    exposureGroupId: integer('exposure_group_id').notNull(),
    status: text('status', { enum: decisionStatuses }).notNull().default('draft'),
    category: integer('category').$type<ExposureCategory>().notNull(),
    judgement: text('judgement', { enum: judgements }).$type<Judgement>().notNull(),
    rationale: text('rationale').notNull(),
    actions: text('actions').notNull().default(''),
    reviewDate: text('review_date').notNull(),
    /** How the review date was proposed, in words (EN 689 interval, organization setting, or set by hand). */
    reviewDateSource: text('review_date_source').notNull(),
    prior: text('prior', { enum: priorNames }).$type<PriorName>().notNull().default('reference'),
    exclusions: text('exclusions', { mode: 'json' })
      .$type<DecisionExclusion[]>()
      .notNull()
      .default(sql`'[]'`),
    // Frozen at approval (null before).
    frozenInputs: text('frozen_inputs', { mode: 'json' }).$type<FrozenInputs>(),
    dataHash: text('data_hash'),
    method: text('method'),
    engineVersion: text('engine_version', { mode: 'json' }).$type<EngineVersion>(),
    settings: text('settings', { mode: 'json' }).$type<AssessmentSettings>(),
    figures: text('figures', { mode: 'json' }).$type<FrozenFigures>(),
    draftedByUserId: integer('drafted_by_user_id')
      .notNull()
      .references(() => users.id),
    submittedAt: timestamp('submitted_at').notNull(),
    approvedByUserId: integer('approved_by_user_id').references(() => users.id),
    approvedAt: timestamp('approved_at'),
    returnedByUserId: integer('returned_by_user_id').references(() => users.id),
    returnedAt: timestamp('returned_at'),
    returnComment: text('return_comment'),
    dataVersionAtDraft: integer('data_version_at_draft').notNull(),
    dataVersionAtApproval: integer('data_version_at_approval'),
    supersededAt: timestamp('superseded_at'),
    ...timestamps(),
  },
  (table) => [
    foreignKey({ columns: [table.exposureGroupId, table.organizationId], foreignColumns: [exposureGroups.id, exposureGroups.organizationId] }),
    uniqueIndex('decision_records_id_organization_idx').on(table.id, table.organizationId),
    index('decision_records_group_idx').on(table.exposureGroupId, table.status),
    index('decision_records_organization_idx').on(table.organizationId, table.status),
    // The dashboard's recent decisions (newest first, LIMIT 10) walk this instead of sorting every record of the organization.
    index('decision_records_organization_updated_idx').on(table.organizationId, table.updatedAt, table.id),
    check('decision_records_category_range', sql`${table.category} BETWEEN 0 AND 4`),
  ],
);

/** A manager's acknowledgement of an approved record: once per manager per record. */
export const decisionAcknowledgements = sqliteTable(
  'decision_acknowledgements',
  {
    id: id(),
    organizationId: organizationReference(),
    decisionRecordId: integer('decision_record_id').notNull(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    at: timestamp('at').notNull(),
  },
  (table) => [
    foreignKey({ columns: [table.decisionRecordId, table.organizationId], foreignColumns: [decisionRecords.id, decisionRecords.organizationId] }),
    uniqueIndex('decision_acknowledgements_record_user_idx').on(table.decisionRecordId, table.userId),
  ],
);

/** Comments on a decision record (any role with comment:write). */
export const decisionComments = sqliteTable(
  'decision_comments',
  {
    id: id(),
    organizationId: organizationReference(),
    decisionRecordId: integer('decision_record_id').notNull(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    body: text('body').notNull(),
    createdAt: timestamp('created_at').notNull(),
  },
  (table) => [
    foreignKey({ columns: [table.decisionRecordId, table.organizationId], foreignColumns: [decisionRecords.id, decisionRecords.organizationId] }),
    index('decision_comments_record_idx').on(table.decisionRecordId),
  ],
);

const rationaleText = z.string().trim().min(1, 'Write the rationale').max(20_000, 'Use at most 20,000 characters');
const actionsText = z.string().trim().max(20_000, 'Use at most 20,000 characters');

/** POST …/exposure-groups/:groupId/decision-records — category, judgement and review date default from the assessment. */
export const decisionDraftCreate = z.object({
  category: z.number().int().min(0, 'Use a category from 0 to 4').max(4, 'Use a category from 0 to 4').optional(),
  judgement: z.enum(judgements, { message: `Use one of ${judgements.join(', ')}` }).optional(),
  rationale: rationaleText,
  actions: actionsText.default(''),
  reviewDate: calendarDate.optional(),
  exclusions: z.array(decisionExclusion).max(500, 'Leave out at most 500 results').default([]),
  prior: z.enum(priorNames).default('reference'),
});
export type DecisionDraftCreate = z.input<typeof decisionDraftCreate>;

/** PATCH …/decision-records/:recordId — the drafter edits a draft or a returned draft. */
export const decisionDraftUpdate = z.object({
  category: z.number().int().min(0, 'Use a category from 0 to 4').max(4, 'Use a category from 0 to 4').optional(),
  judgement: z.enum(judgements, { message: `Use one of ${judgements.join(', ')}` }).optional(),
  rationale: rationaleText.optional(),
  actions: actionsText.optional(),
  reviewDate: calendarDate.optional(),
  exclusions: z.array(decisionExclusion).max(500, 'Leave out at most 500 results').optional(),
});
export type DecisionDraftUpdate = z.input<typeof decisionDraftUpdate>;

export const decisionReturn = z.object({
  comment: z.string().trim().min(1, 'Say what must change before approval').max(4000, 'Use at most 4,000 characters'),
});
export const decisionCommentCreate = z.object({
  body: z.string().trim().min(1, 'Write a comment').max(4000, 'Use at most 4,000 characters'),
});

export type DecisionRecordRow = typeof decisionRecords.$inferSelect;

/** A person named on a record. */
export interface DecisionPerson {
  id: number;
  name: string;
}

/** A record in lists (history, dashboard). */
export interface DecisionRecordSummary {
  id: number;
  exposureGroupId: number;
  exposureGroupName: string;
  status: DecisionStatus;
  category: ExposureCategory;
  judgement: Judgement;
  reviewDate: string;
  drafter: DecisionPerson;
  approver: DecisionPerson | null;
  submittedAt: string;
  approvedAt: string | null;
  returnedAt: string | null;
  /** Approved and the group's results changed since (dataVersion moved past the frozen one). */
  outOfDate: boolean;
  /** Draft or returned, and the group's results changed since it was drafted. */
  dataChangedSinceDraft: boolean;
  acknowledgements: number;
}

/** A record in the organization's register (GET /orgs/:orgId/decision-records): the summary plus its group's site. */
export interface DecisionRecordListItem extends DecisionRecordSummary {
  siteId: number;
  siteName: string;
}

export const decisionRecordSortFields = [
  'reviewDate',
  'approvedAt',
  'submittedAt',
  'updatedAt',
  'exposureGroupName',
  'siteName',
  'category',
  'status',
] as const;

/**
 * GET /orgs/:orgId/decision-records — the register of every record of an organization.
 * `q` searches the exposure group name and the site name. `outOfDate=true`: approved records whose
 * group's results changed since. `reviewBy=YYYY-MM-DD`: approved records due for review on or before
 * that date. Category comes as text ("0"…"4"): a coerced number would read an empty value as 0.
 */
export const decisionRecordListQuery = listQueryBase.extend({
  sort: sortParameter(decisionRecordSortFields, '-updatedAt'),
  status: z.enum(decisionStatuses, { message: `Use one of ${decisionStatuses.join(', ')}` }).optional(),
  category: z
    .enum(['0', '1', '2', '3', '4'], { message: 'Use a category from 0 to 4' })
    .transform((value) => Number(value) as ExposureCategory)
    .optional(),
  judgement: z.enum(judgements, { message: `Use one of ${judgements.join(', ')}` }).optional(),
  siteId: queryId.optional(),
  outOfDate: queryFlag.optional(),
  reviewBy: calendarDate.optional(),
});
export type DecisionRecordListQuery = z.infer<typeof decisionRecordListQuery>;

/** The full record (GET …/decision-records/:recordId). */
export interface DecisionRecordView extends DecisionRecordSummary {
  rationale: string;
  actions: string;
  reviewDateSource: string;
  prior: PriorName;
  exclusions: DecisionExclusion[];
  frozenInputs: FrozenInputs | null;
  dataHash: string | null;
  method: string | null;
  engineVersion: EngineVersion | null;
  settings: AssessmentSettings | null;
  figures: FrozenFigures | null;
  returnedBy: DecisionPerson | null;
  returnComment: string | null;
  dataVersionAtDraft: number;
  dataVersionAtApproval: number | null;
  groupDataVersion: number;
  supersededAt: string | null;
  acknowledgedBy: Array<DecisionPerson & { at: string }>;
  comments: Array<{ id: number; author: DecisionPerson; body: string; createdAt: string }>;
  cautions: string[];
}

/** One difference between consecutive approved records. */
export interface DecisionChange {
  field: string;
  label: string;
  before: string | number | null;
  after: string | number | null;
}

/** The group's decisions (GET …/exposure-groups/:groupId/decision-records). */
export interface GroupDecisions {
  group: { id: number; name: string; dataVersion: number };
  records: DecisionRecordSummary[];
  /** Between each approved record and the one approved before it, newest first. */
  history: Array<{ fromId: number; toId: number; changes: DecisionChange[] }>;
  /** The current approved record is out of date (or there is none) and no draft is open: offer a new draft. */
  offerNewDraft: boolean;
  offerReason: string | null;
}

/** What a new draft would start from (GET …/decision-records/proposal). */
export interface DecisionProposal {
  category: ExposureCategory;
  judgement: Judgement;
  reviewDate: string;
  reviewDateSource: string;
  reviewIntervalMonths: number;
  n: number;
  p95: number;
  utl95_95: number;
  exceedanceFraction: number;
  gm: number;
  oel: number;
  oelUnit: string;
  dataVersion: number;
  dataHash: string;
  excludedIds: number[];
}
