import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { z } from 'zod';
import { id, timestamp } from './columns';
import { organizationReference, organizations } from './organizations';
import { users } from './users';

/*
 * E-mail notifications (PRODUCT.md capability 9, domain model "notification (type, recipient, sent)").
 * Each person chooses per organization which kinds they receive (`notification_preferences`, every
 * kind on unless a row says otherwise); every message sent — or tried — is one `notifications` row
 * whose unique `dedupe_key` stops a retry or the daily job from sending it twice
 * (docs/decisions/021-notifications.md).
 */

export const notificationTypes = ['decisionApproved', 'decisionReturned', 'categoryChanged', 'stillStretch', 'reviewDue'] as const;
export type NotificationType = (typeof notificationTypes)[number];

/** What each kind is, in words, for the settings page (and the docs). */
export const notificationTypeInfo: Record<NotificationType, { label: string; description: string }> = {
  decisionApproved: {
    label: 'Decision record approved',
    description: 'To the person who drafted it and to the organization’s managers.',
  },
  decisionReturned: {
    label: 'Draft returned for changes',
    description: 'To the person who drafted it, with the reviewer’s reason.',
  },
  categoryChanged: {
    label: 'Exposure category changed',
    description: 'When a newly approved record puts a group in another category than its previous approved record: to managers and hygienists.',
  },
  stillStretch: {
    label: 'Noise log with a still stretch',
    description: 'To the person who uploaded a noise log whose meter was still at least the organization’s still-stretch setting.',
  },
  reviewDue: {
    label: 'Review date within 30 days',
    description:
      'Once per approved record whose review date is 30 days away or less (several in one e-mail when they fall due together): to managers and hygienists.',
  },
};

export const notificationPreferences = sqliteTable(
  'notification_preferences',
  {
    id: id(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    organizationId: organizationReference(),
    type: text('type', { enum: notificationTypes }).notNull(),
    enabled: integer('enabled', { mode: 'boolean' }).notNull(),
    updatedAt: timestamp('updated_at').notNull(),
  },
  (table) => [uniqueIndex('notification_preferences_user_organization_type_idx').on(table.userId, table.organizationId, table.type)],
);

export const notifications = sqliteTable(
  'notifications',
  {
    id: id(),
    organizationId: integer('organization_id')
      .notNull()
      .references(() => organizations.id),
    type: text('type', { enum: notificationTypes }).notNull(),
    recipientUserId: integer('recipient_user_id')
      .notNull()
      .references(() => users.id),
    recipientEmail: text('recipient_email').notNull(),
    subject: text('subject').notNull(),
    /** What the message is about (`decision_record`, `noise_log`) and its id, as in the audit trail. */
    entityType: text('entity_type').notNull(),
    entityId: text('entity_id').notNull(),
    /** One message per key, ever: type, entity (and review date for reminders) and recipient. */
    dedupeKey: text('dedupe_key').notNull().unique(),
    createdAt: timestamp('created_at').notNull(),
    /** Set when the mail server accepted the message; null while unsent or after a failure. */
    sentAt: timestamp('sent_at'),
    /** The last sending error, kept so a failure is visible and can be retried. */
    error: text('error'),
  },
  (table) => [index('notifications_organization_created_idx').on(table.organizationId, table.createdAt)],
);

export type NotificationRow = typeof notifications.$inferSelect;

/** GET /api/me/notification-preferences: one entry per active membership. */
export interface NotificationPreferencesView {
  types: Array<{ type: NotificationType; label: string; description: string }>;
  organizations: Array<{ organizationId: number; organizationName: string; role: string; preferences: Record<NotificationType, boolean> }>;
}

/** PUT /api/me/notification-preferences: the settings to change (others stay as they are). */
export const notificationPreferencesUpdate = z.object({
  organizations: z
    .array(
      z.object({
        organizationId: z.number().int('Use a whole number').positive('Use an organization id'),
        preferences: z.partialRecord(z.enum(notificationTypes, { message: `Use one of ${notificationTypes.join(', ')}` }), z.boolean('Use true or false')),
      }),
    )
    .min(1, 'Send at least one organization')
    .max(100, 'Use at most 100 organizations'),
});
export type NotificationPreferencesUpdate = z.infer<typeof notificationPreferencesUpdate>;
