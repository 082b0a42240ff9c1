import { integer, text } from 'drizzle-orm/sqlite-core';
import { z } from 'zod';

// Column builders shared by every table, so ids and timestamps look the same everywhere.
// Timestamps are ISO 8601 strings in UTC (`Date#toISOString()`): they sort as text, read
// plainly in the database and cross JSON unchanged (docs/decisions/006-database-and-migrations.md).

/** Integer primary key (SQLite rowid alias). */
export const id = () => integer('id').primaryKey({ autoIncrement: true });

/** A moment in time, written by the server's clock as `2025-01-31T08:00:00.000Z`. */
export const timestamp = (name: string) => text(name);

/** `created_at` and `updated_at`, both required; the services set them from the injected clock. */
export const timestamps = () => ({
  createdAt: timestamp('created_at').notNull(),
  updatedAt: timestamp('updated_at').notNull(),
});

/** Archived rows stay in the database (nothing is deleted silently) and drop out of pick lists. */
export const archived = () => integer('archived', { mode: 'boolean' }).notNull().default(false);

/** A calendar date `YYYY-MM-DD` (no time zone), for things like group membership from/to. */
export const calendarDate = z.iso.date('Use a date written YYYY-MM-DD');

/** An ISO 8601 timestamp as it crosses JSON. */
export const isoTimestamp = z.iso.datetime({ offset: true });

/** Positive integer id from a URL parameter (`/orgs/12` → 12). */
export const idParam = z.coerce.number().int('Use a whole number').positive('Use a positive id');
