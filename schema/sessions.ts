import { sqliteTable, text } from 'drizzle-orm/sqlite-core';

/**
 * Sign-in sessions, read and written only by better-sqlite3-session-store (express-session).
 * The shape copies that package's own `CREATE TABLE IF NOT EXISTS sessions (…)`, so the
 * migration creates it and the store finds it ready. Do not query it from the app.
 */
export const sessions = sqliteTable('sessions', {
  sid: text('sid').primaryKey(),
  /** The session as JSON (user id, CSRF token, cookie settings). */
  sess: text('sess').notNull(),
  /** ISO 8601 expiry; the store deletes expired rows every 15 minutes. */
  expire: text('expire').notNull(),
});
