import { auditEvents, type AuditEventInput } from '@schema/audit';
import type { Db } from '../db/client';

/** Anything that can write: the database or a transaction inside it. */
type Writer = Pick<Db, 'insert'>;

/**
 * Appends one event to the audit trail. Call it inside the same transaction as the change it
 * describes, so the change and its record are written together or not at all.
 * `before`/`after` hold only the fields that matter (never password hashes or tokens).
 */
export function recordAudit(db: Writer, event: AuditEventInput & { at: Date }): void {
  db.insert(auditEvents)
    .values({ ...event, at: event.at.toISOString() })
    .run();
}
