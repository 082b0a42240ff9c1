import { sql } from 'drizzle-orm';
import { blob, check, foreignKey, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { z } from 'zod';
import type { AgentKind, ExposureUnit } from './agents';
import { calendarDate, id, timestamp, timestamps } from './columns';
import { exposureGroups } from './exposure-groups';
import { organizationReference } from './organizations';
import { shiftResults } from './shift-results';
import { users } from './users';
import { workers } from './workers';

/*
 * Worker letters (docs/decisions/024-worker-letters.md): a plain-language letter to a worker whose
 * shift result is at or above the group's action level. One letter per worker per drafting, listing
 * every such result of theirs in the group that has no letter yet. The letter's words are written
 * once, when it is drafted (`content`), and never re-derived: the PDF and the e-mail are rendered
 * from that snapshot, and the PDF handed over or e-mailed is kept byte for byte with its SHA-256.
 */

export const workerLetterStatuses = ['drafted', 'sent', 'cancelled'] as const;
export type WorkerLetterStatus = (typeof workerLetterStatuses)[number];

/** How a sent letter reached the worker: e-mailed, or printed and handed over. */
export const workerLetterDeliveries = ['email', 'hand'] as const;
export type WorkerLetterDelivery = (typeof workerLetterDeliveries)[number];

/** One result as the letter states it. */
export interface WorkerLetterResult {
  shiftResultId: number;
  date: string;
  value: number;
  unit: ExposureUnit;
  /** The value with its unit in words, e.g. "86.2 dB(A)". */
  valueText: string;
  /** Compared with the action level and the limit, in words. */
  comparison: string;
  atOrAboveLimit: boolean;
}

/** A heading and its paragraphs. */
export interface WorkerLetterSection {
  heading: string;
  paragraphs: string[];
}

/** Everything the letter says, fixed when it is drafted. */
export interface WorkerLetterContent {
  subject: string;
  organizationName: string;
  /** Calendar date printed on the letter (the drafting day, UTC). */
  letterDate: string;
  recipient: { code: string; name: string | null; jobTitle: string };
  greeting: string;
  group: { id: number; name: string; agentName: string; agentKind: AgentKind };
  results: WorkerLetterResult[];
  actionLevel: { value: number; unit: ExposureUnit; text: string; basis: string };
  limit: { value: number; unit: ExposureUnit; text: string; source: string };
  /** Opens the "Your result" part, before the list of results. */
  introduction: string;
  /** After the results: what it means, what happens next, why you get this letter, questions. */
  sections: WorkerLetterSection[];
  dutyCited: string;
  cautions: string[];
  contact: { name: string; email: string };
  closing: string;
}

export const workerLetters = sqliteTable(
  'worker_letters',
  {
    id: id(),
    organizationId: organizationReference(),
    exposureGroupId: integer('exposure_group_id').notNull(),
    workerId: integer('worker_id').notNull(),
    status: text('status', { enum: workerLetterStatuses }).notNull().default('drafted'),
    /** The regulatory duty the letter serves, as printed in it. */
    dutyCited: text('duty_cited').notNull(),
    content: text('content', { mode: 'json' }).$type<WorkerLetterContent>().notNull(),
    draftedAt: timestamp('drafted_at').notNull(),
    draftedByUserId: integer('drafted_by_user_id')
      .notNull()
      .references(() => users.id),
    delivery: text('delivery', { enum: workerLetterDeliveries }),
    /** The address the e-mail went to (delivery = email). */
    recipientAddress: text('recipient_address'),
    /** When the sending was recorded (e-mail accepted by the mail server, or hand-over recorded). */
    sentAt: timestamp('sent_at'),
    sentByUserId: integer('sent_by_user_id').references(() => users.id),
    /** The day the printed letter was handed over (delivery = hand), as the hygienist records it. */
    handedOverOn: text('handed_over_on'),
    /** The PDF exactly as e-mailed or printed for hand-over, and its SHA-256 (hex). */
    sentPdf: blob('sent_pdf', { mode: 'buffer' }),
    pdfSha256: text('pdf_sha256'),
    cancelledAt: timestamp('cancelled_at'),
    cancelledByUserId: integer('cancelled_by_user_id').references(() => users.id),
    cancelReason: text('cancel_reason'),
    ...timestamps(),
  },
  (table) => [
    foreignKey({
      columns: [table.exposureGroupId, table.organizationId],
      foreignColumns: [exposureGroups.id, exposureGroups.organizationId],
    }),
    foreignKey({ columns: [table.workerId, table.organizationId], foreignColumns: [workers.id, workers.organizationId] }),
    uniqueIndex('worker_letters_id_organization_idx').on(table.id, table.organizationId),
    index('worker_letters_group_idx').on(table.exposureGroupId, table.status),
    index('worker_letters_worker_idx').on(table.workerId),
    check(
      'worker_letters_sent_is_complete',
      sql`${table.status} <> 'sent' OR (${table.sentAt} IS NOT NULL AND ${table.delivery} IS NOT NULL AND ${table.pdfSha256} IS NOT NULL AND ${table.sentPdf} IS NOT NULL)`,
    ),
    check('worker_letters_email_has_address', sql`${table.delivery} IS NULL OR ${table.delivery} <> 'email' OR ${table.recipientAddress} IS NOT NULL`),
    check('worker_letters_hand_has_date', sql`${table.delivery} IS NULL OR ${table.delivery} <> 'hand' OR ${table.handedOverOn} IS NOT NULL`),
    check('worker_letters_cancel_has_reason', sql`${table.status} <> 'cancelled' OR (${table.cancelReason} IS NOT NULL AND ${table.cancelledAt} IS NOT NULL)`),
  ],
);

/**
 * Which results a letter covers. `active` is cleared when the letter is cancelled, so the result can
 * be written up again; the partial unique index lets a result sit in at most one live letter.
 */
export const workerLetterResults = sqliteTable(
  'worker_letter_results',
  {
    id: id(),
    organizationId: organizationReference(),
    letterId: integer('letter_id').notNull(),
    shiftResultId: integer('shift_result_id').notNull(),
    active: integer('active', { mode: 'boolean' }).notNull().default(true),
  },
  (table) => [
    foreignKey({ columns: [table.letterId, table.organizationId], foreignColumns: [workerLetters.id, workerLetters.organizationId] }),
    foreignKey({ columns: [table.shiftResultId, table.organizationId], foreignColumns: [shiftResults.id, shiftResults.organizationId] }),
    index('worker_letter_results_letter_idx').on(table.letterId),
    uniqueIndex('worker_letter_results_one_live_letter_idx')
      .on(table.shiftResultId)
      .where(sql`${table.active} = 1`),
  ],
);

/** Draft letters for a group: every pending result at or above the action level, or only those listed. */
export const workerLetterDraft = z.object({
  resultIds: z.array(z.number().int().positive('Use result ids')).min(1, 'List at least one result, or leave resultIds out for all').max(1000).optional(),
  /** Replaces the duty named in the letter (the local regulation), e.g. a national rule. */
  dutyCited: z.string().trim().min(10, 'Name the duty in at least 10 characters').max(500, 'Use at most 500 characters').optional(),
});
export type WorkerLetterDraft = z.infer<typeof workerLetterDraft>;

/** Record that the printed letter was handed to the worker on a day. */
export const workerLetterHandOver = z.object({ handedOverOn: calendarDate });

/** Cancel a drafted letter (its results become pending again); the reason goes to the audit trail. */
export const workerLetterCancel = z.object({
  reason: z.string({ message: 'Give a reason' }).trim().min(3, 'Give a reason (at least 3 characters)').max(500, 'Use at most 500 characters'),
});

/** A letter as the API lists it (without the PDF bytes). */
export interface WorkerLetterView {
  id: number;
  exposureGroupId: number;
  worker: { id: number; code: string; name: string | null; email: string | null };
  status: WorkerLetterStatus;
  dutyCited: string;
  subject: string;
  results: WorkerLetterResult[];
  draftedAt: string;
  draftedBy: { id: number; name: string };
  delivery: WorkerLetterDelivery | null;
  recipientAddress: string | null;
  sentAt: string | null;
  sentBy: { id: number; name: string } | null;
  handedOverOn: string | null;
  pdfSha256: string | null;
  cancelledAt: string | null;
  cancelledBy: { id: number; name: string } | null;
  cancelReason: string | null;
}

/** A result at or above the action level that no live letter covers yet. */
export interface PendingLetterResult {
  shiftResultId: number;
  worker: { id: number; code: string; name: string | null; email: string | null };
  date: string;
  value: number;
  unit: ExposureUnit;
  atOrAboveLimit: boolean;
}

/** `GET …/exposure-groups/:groupId/worker-letters`. */
export interface GroupWorkerLetters {
  group: { id: number; name: string; agentKind: AgentKind; oelValue: number; oelUnit: ExposureUnit };
  /** Null when the group has no action level and none follows by default (the hygienist must set one). */
  actionLevel: { value: number; unit: ExposureUnit; origin: string; basis: string } | null;
  /** Why there is no action level, when there is none. */
  actionLevelMissing: string | null;
  pending: PendingLetterResult[];
  letters: WorkerLetterView[];
  /** The duty a new letter names unless the hygienist gives another. */
  defaultDuty: string;
  cautions: string[];
}
