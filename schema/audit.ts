import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { createSelectSchema } from 'drizzle-zod';
import { z } from 'zod';
import { id, timestamp } from './columns';
import { organizations } from './organizations';
import { users } from './users';

/**
 * The audit trail: who changed what, when and why. Append-only — a migration adds triggers that
 * make SQLite refuse UPDATE and DELETE on this table (backend/src/db/migrations, "audit append-only").
 * Foreign keys have no ON DELETE action on purpose: a cascade would try to change audit rows.
 */
export const auditEvents = sqliteTable(
  'audit_events',
  {
    id: id(),
    /** Null for events outside any organization (e.g. a password reset). */
    organizationId: integer('organization_id').references(() => organizations.id),
    /** Null when no one was signed in (e.g. an invitation accepted, a reset link used). */
    actorUserId: integer('actor_user_id').references(() => users.id),
    entityType: text('entity_type').notNull(),
    entityId: text('entity_id').notNull(),
    action: text('action').notNull(),
    reason: text('reason'),
    before: text('before', { mode: 'json' }).$type<Record<string, unknown> | null>(),
    after: text('after', { mode: 'json' }).$type<Record<string, unknown> | null>(),
    at: timestamp('at').notNull(),
  },
  (table) => [
    index('audit_events_organization_at_idx').on(table.organizationId, table.at),
    index('audit_events_entity_idx').on(table.entityType, table.entityId),
  ],
);

const jsonObject = z.record(z.string(), z.unknown()).nullable();
export const auditEventSelect = createSelectSchema(auditEvents, { before: jsonObject, after: jsonObject });
export type AuditEvent = z.infer<typeof auditEventSelect>;
/** What a service passes to `recordAudit`; the time comes from the clock. */
export type AuditEventInput = Omit<typeof auditEvents.$inferInsert, 'id' | 'at'>;

/** GET /orgs/:orgId/audit-events (and .csv): filters by person, entity type and dates (inclusive, UTC), newest first. */
export const auditEventListQuery = z
  .object({
    person: z.coerce.number().int('Use a whole number').positive('Use a person’s user id').optional(),
    entityType: z.string().trim().min(1, 'Name an entity type').max(60, 'Use at most 60 characters').optional(),
    from: z.iso.date('Use a date written YYYY-MM-DD').optional(),
    to: z.iso.date('Use a date written YYYY-MM-DD').optional(),
    page: z.coerce.number().int('Use a whole number').min(1, 'Pages start at 1').default(1),
    pageSize: z.coerce.number().int('Use a whole number').min(1, 'Use at least 1').max(200, 'Use at most 200').default(50),
  })
  .refine((query) => !query.from || !query.to || query.from <= query.to, { message: 'The "from" date must not be after the "to" date', path: ['from'] });
export type AuditEventListQuery = z.infer<typeof auditEventListQuery>;

/** One audit event as the audit-trail page shows it: the event with who did it. */
export interface AuditEventView {
  id: number;
  at: string;
  actor: { id: number; name: string; email: string } | null;
  entityType: string;
  entityId: string;
  action: string;
  reason: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

/** The choices for the audit-trail filters: people who appear in the organization's trail and its entity types. */
export interface AuditFilterOptions {
  people: Array<{ id: number; name: string; email: string }>;
  entityTypes: string[];
}
