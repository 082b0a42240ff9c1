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
