import { and, count, desc, eq, gte, lt, type SQL } from 'drizzle-orm';
import Papa from 'papaparse';
import { auditEvents, type AuditEventListQuery, type AuditEventView, type AuditFilterOptions } from '@schema/audit';
import type { ListPage } from '@schema/list-query';
import { users } from '@schema/users';
import type { Db } from '../db/client';
import { addDays } from './dates';

/*
 * Reading the audit trail of one organization (PRODUCT.md capability 10): filters by person,
 * entity type and dates, newest first, paged on the server; and the same rows as CSV.
 * Writing stays in services/audit.ts (append-only, enforced by triggers in the database).
 */

type Filters = Pick<AuditEventListQuery, 'person' | 'entityType' | 'from' | 'to'>;

/** `from`/`to` are calendar dates in UTC, both included: `to` runs until the next midnight. */
function conditions(organizationId: number, filters: Filters): SQL {
  const parts: Array<SQL | undefined> = [
    eq(auditEvents.organizationId, organizationId),
    filters.person === undefined ? undefined : eq(auditEvents.actorUserId, filters.person),
    filters.entityType === undefined ? undefined : eq(auditEvents.entityType, filters.entityType),
    filters.from === undefined ? undefined : gte(auditEvents.at, `${filters.from}T00:00:00.000Z`),
    filters.to === undefined ? undefined : lt(auditEvents.at, `${addDays(filters.to, 1)}T00:00:00.000Z`),
  ];
  return and(...parts)!;
}

function selectEvents(db: Db, organizationId: number, filters: Filters) {
  return db
    .select({ event: auditEvents, actorId: users.id, actorName: users.name, actorEmail: users.email })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorUserId))
    .where(conditions(organizationId, filters))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .$dynamic();
}

type EventRow = Awaited<ReturnType<ReturnType<typeof selectEvents>['all']>>[number];

function toView(row: EventRow): AuditEventView {
  const { event } = row;
  return {
    id: event.id,
    at: event.at,
    actor: row.actorId === null ? null : { id: row.actorId, name: row.actorName ?? '', email: row.actorEmail ?? '' },
    entityType: event.entityType,
    entityId: event.entityId,
    action: event.action,
    reason: event.reason,
    before: event.before ?? null,
    after: event.after ?? null,
  };
}

/** One page of the organization's audit events matching the filters, newest first. */
export function listAuditEvents(db: Db, organizationId: number, query: AuditEventListQuery): ListPage<AuditEventView> {
  const total = db.select({ total: count() }).from(auditEvents).where(conditions(organizationId, query)).get()?.total ?? 0;
  const items = selectEvents(db, organizationId, query)
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize)
    .all()
    .map(toView);
  return { items, total, page: query.page, pageSize: query.pageSize, pageCount: Math.max(1, Math.ceil(total / query.pageSize)) };
}

/** The people who appear in the organization's trail and its entity types, for the filter selects. */
export function auditFilterOptions(db: Db, organizationId: number): AuditFilterOptions {
  const people = db
    .selectDistinct({ id: users.id, name: users.name, email: users.email })
    .from(auditEvents)
    .innerJoin(users, eq(users.id, auditEvents.actorUserId))
    .where(eq(auditEvents.organizationId, organizationId))
    .orderBy(users.name, users.id)
    .all();
  const entityTypes = db
    .selectDistinct({ entityType: auditEvents.entityType })
    .from(auditEvents)
    .where(eq(auditEvents.organizationId, organizationId))
    .orderBy(auditEvents.entityType)
    .all()
    .map((row) => row.entityType);
  return { people, entityTypes };
}

/**
 * A cell made safe to open in a spreadsheet: text starting with =, +, -, @, tab or carriage return
 * gets a leading single quote, so it is shown as text and never run as a formula
 * (OWASP, "CSV Injection"). Applied to every cell, since any of them may hold user input.
 */
export function csvSafeCell(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

/** The largest export in one file; a wider trail is narrowed with the filters. */
export const auditCsvRowLimit = 100_000;

export const auditCsvColumns = ['at', 'person', 'personEmail', 'entityType', 'entityId', 'action', 'reason', 'before', 'after'] as const;

/**
 * The filtered trail as CSV (RFC 4180 quoting by papaparse, CRLF line ends), newest first, at most
 * `auditCsvRowLimit` rows; `before`/`after` are JSON text in their cells.
 */
export function auditEventsCsv(db: Db, organizationId: number, filters: Filters): string {
  const rows = selectEvents(db, organizationId, filters)
    .limit(auditCsvRowLimit)
    .all()
    .map(toView)
    .map((event) =>
      [
        event.at,
        event.actor?.name ?? '',
        event.actor?.email ?? '',
        event.entityType,
        event.entityId,
        event.action,
        event.reason ?? '',
        event.before ? JSON.stringify(event.before) : '',
        event.after ? JSON.stringify(event.after) : '',
      ].map(csvSafeCell),
    );
  return Papa.unparse({ fields: [...auditCsvColumns], data: rows }, { newline: '\r\n', escapeFormulae: false });
}
