import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { createSelectSchema } from 'drizzle-zod';
import type { z } from 'zod';
import { id, timestamp, timestamps } from './columns';

/**
 * People who can sign in. One user may belong to several organizations (see `memberships`).
 * E-mail addresses are stored trimmed and lower-cased (schema/auth.ts `email`), so the unique
 * index is effectively case-insensitive.
 */
export const users = sqliteTable('users', {
  id: id(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  /** argon2id PHC string (`$argon2id$v=19$m=…`); never leaves the server. */
  passwordHash: text('password_hash').notNull(),
  ...timestamps(),
});

/**
 * Password-reset links. Only the SHA-256 hash of the token is kept, so a copy of the database
 * cannot be used to reset anyone's password. Single use (`used_at`), expiring (`expires_at`).
 */
export const passwordResets = sqliteTable(
  'password_resets',
  {
    id: id(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    tokenHash: text('token_hash').notNull().unique(),
    createdAt: timestamp('created_at').notNull(),
    expiresAt: timestamp('expires_at').notNull(),
    usedAt: timestamp('used_at'),
  },
  (table) => [index('password_resets_user_idx').on(table.userId)],
);

const userRow = createSelectSchema(users);
/** A user as the API shows it: no password hash, no timestamps. */
export const userPublic = userRow.pick({ id: true, email: true, name: true });
export type UserPublic = z.infer<typeof userPublic>;
export type User = typeof users.$inferSelect;
export type PasswordReset = typeof passwordResets.$inferSelect;
