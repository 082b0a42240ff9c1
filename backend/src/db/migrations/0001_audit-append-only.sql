-- The audit trail is append-only (PRODUCT.md "Audit trail"): SQLite itself refuses to change or
-- remove an audit event, whoever asks. Written by hand (drizzle-kit generate --custom).
CREATE TRIGGER `audit_events_no_update` BEFORE UPDATE ON `audit_events`
BEGIN
  SELECT RAISE(ABORT, 'audit_events is append-only: an audit event cannot be changed');
END;
--> statement-breakpoint
CREATE TRIGGER `audit_events_no_delete` BEFORE DELETE ON `audit_events`
BEGIN
  SELECT RAISE(ABORT, 'audit_events is append-only: an audit event cannot be deleted');
END;
