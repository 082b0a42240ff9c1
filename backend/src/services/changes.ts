import { and, eq, ne } from 'drizzle-orm';
import type { AnySQLiteColumn, AnySQLiteTable } from 'drizzle-orm/sqlite-core';
import type { User } from '@schema/users';
import type { Db } from '../db/client';
import { BadRequest, NotFound } from '../errors';
import { recordAudit } from './audit';

/** A database or a transaction inside it. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0] | Db;

/** Who makes a change (null for the demo seed). */
export type Actor = Pick<User, 'id'> | null;

/** 'archived' / 'unarchived' when the archived flag is what changed, else undefined. */
export function archiveAction(after: Record<string, unknown>): 'archived' | 'unarchived' | undefined {
  if (after.archived === true) return 'archived';
  if (after.archived === false) return 'unarchived';
  return undefined;
}

/** An organization's editable list: rows with an integer `id` and an `updatedAt` stamp. */
type EditableTable = AnySQLiteTable & { id: AnySQLiteColumn; updatedAt: AnySQLiteColumn };

/**
 * Saves an edit of one row and its audit event, in the caller's transaction: the row gets `set`
 * (default: `after`, the changed fields) and a new `updatedAt`; the event is 'archived' or
 * 'unarchived' when the archived flag changed, else 'updated', with `before`/`after` as given (a
 * service may redact them, e.g. a worker's name becomes "name recorded").
 */
export function saveAuditedChange(
  tx: Tx,
  table: EditableTable,
  change: {
    organizationId: number;
    actor: Actor;
    entityType: string;
    entityId: number;
    reason?: string | null;
    before: Record<string, unknown>;
    after: Record<string, unknown>;
    set?: Record<string, unknown>;
    at: Date;
  },
): void {
  // The fields come from the table's own zod schema in each service; drizzle cannot type a set for any table.
  tx.update(table)
    .set({ ...(change.set ?? change.after), updatedAt: change.at.toISOString() } as never)
    .where(eq(table.id, change.entityId))
    .run();
  audit(tx, {
    organizationId: change.organizationId,
    actor: change.actor,
    entityType: change.entityType,
    entityId: change.entityId,
    action: archiveAction(change.after) ?? 'updated',
    reason: change.reason,
    before: change.before,
    after: change.after,
    at: change.at,
  });
}

/**
 * The fields of `changes` whose value differs from `current`, as `{ before, after }` for the
 * audit trail; arrays and objects are compared by their JSON.
 */
export function changedFields<Row extends object>(current: Row, changes: Partial<Row>): { before: Record<string, unknown>; after: Record<string, unknown> } {
  const before: Record<string, unknown> = {};
  const after: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(changes)) {
    if (value === undefined) continue;
    const old = (current as Record<string, unknown>)[key];
    if (JSON.stringify(old) !== JSON.stringify(value)) {
      before[key] = old;
      after[key] = value;
    }
  }
  return { before, after };
}

/** Writes one audit event for an organization-owned entity (same transaction as the change). */
export function audit(
  tx: Tx,
  event: {
    organizationId: number;
    actor: Actor;
    entityType: string;
    entityId: number;
    action: string;
    at: Date;
    reason?: string | null;
    before?: Record<string, unknown> | null;
    after?: Record<string, unknown> | null;
  },
): void {
  recordAudit(tx, {
    organizationId: event.organizationId,
    actorUserId: event.actor?.id ?? null,
    entityType: event.entityType,
    entityId: String(event.entityId),
    action: event.action,
    reason: event.reason ?? null,
    before: event.before ?? null,
    after: event.after ?? null,
    at: event.at,
  });
}

/**
 * A 400 about one field of the request body, in the same shape as the zod parsers' errors
 * (`fields` maps the field path to its message; the message names the field).
 */
export function fieldError(field: string, message: string, part: 'body' | 'query' = 'body'): BadRequest {
  return new BadRequest(`Check the request ${part}: ${field}: ${message}`, { [field]: message });
}

/** A 400 about several fields at once. */
export function fieldErrors(fields: Record<string, string>): BadRequest {
  return new BadRequest(
    `Check the request body: ${Object.entries(fields)
      .map(([key, message]) => `${key}: ${message}`)
      .join('; ')}`,
    fields,
  );
}

/** A table owned by an organization: an `id` and an `organization_id`. */
type OwnedTable = AnySQLiteTable & { id: AnySQLiteColumn; organizationId: AnySQLiteColumn };

/** The row `id` of `table` if it belongs to the organization, else undefined. */
function ownedRow<Table extends OwnedTable>(db: Tx, table: Table, organizationId: number, id: number): Table['$inferSelect'] | undefined {
  const query = db.select().from(table as AnySQLiteTable);
  return query.where(and(eq(table.id, id), eq(table.organizationId, organizationId))).get() as Table['$inferSelect'] | undefined;
}

/**
 * The organization's row named in a URL, or 404 — the same answer for another organization's id
 * as for one that does not exist, so ids of other organizations are never confirmed.
 * `label` reads in the message: "No site 12 in this organization".
 */
export function ownedOrNotFound<Table extends OwnedTable>(db: Tx, table: Table, organizationId: number, id: number, label: string): Table['$inferSelect'] {
  const row = ownedRow(db, table, organizationId, id);
  if (!row) throw new NotFound(`No ${label} ${id} in this organization`);
  return row;
}

/** The organization's row named in a request body, or a 400 naming the field. */
export function ownedOrFieldError<Table extends OwnedTable>(
  db: Tx,
  table: Table,
  organizationId: number,
  id: number,
  label: string,
  field: string,
): Table['$inferSelect'] {
  const row = ownedRow(db, table, organizationId, id);
  if (!row) throw fieldError(field, `No ${label} ${id} in this organization`);
  return row;
}

/** Id of another row of the organization with this exact name (names are unique per organization), if any. */
export function sameNameRow(
  db: Tx,
  table: OwnedTable & { name: AnySQLiteColumn },
  organizationId: number,
  name: string,
  exceptId?: number,
): number | undefined {
  const query = db.select({ id: table.id }).from(table as AnySQLiteTable);
  const row = query
    .where(and(eq(table.organizationId, organizationId), eq(table.name, name), exceptId === undefined ? undefined : ne(table.id, exceptId)))
    .get() as { id: number } | undefined;
  return row?.id;
}
