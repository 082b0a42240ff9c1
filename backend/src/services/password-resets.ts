import { and, eq, gt, isNull } from 'drizzle-orm';
import { passwordResets, users, type User } from '@schema/users';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { BadRequest } from '../errors';
import { recordAudit } from './audit';
import { hashPassword } from './passwords';
import { createLinkToken, hashToken } from './tokens';
import { endSessionsOf, findUserByEmail } from './users';

/** A reset link works for 1 hour. */
export const passwordResetLifetimeMs = 3_600_000;

const invalidLink = () =>
  new BadRequest('This reset link is invalid, expired or already used: ask for a new one', {
    token: 'The reset link is invalid, expired or already used',
  });

/**
 * Starts a reset for the account with this e-mail, if there is one: stores the token's hash and
 * returns the plain token for the e-mail. Undefined when no account has the address (the route
 * answers the same either way, so the answer does not reveal who has an account).
 */
export function requestPasswordReset(db: Db, clock: Clock, email: string): { user: User; token: string; expiresAt: Date } | undefined {
  const user = findUserByEmail(db, email);
  if (!user) return undefined;
  const now = clock.now();
  const expiresAt = new Date(now.getTime() + passwordResetLifetimeMs);
  const { token, hash } = createLinkToken();
  db.transaction((tx) => {
    const reset = tx
      .insert(passwordResets)
      .values({ userId: user.id, tokenHash: hash, createdAt: now.toISOString(), expiresAt: expiresAt.toISOString() })
      .returning()
      .get();
    recordAudit(tx, {
      organizationId: null,
      actorUserId: null,
      entityType: 'user',
      entityId: String(user.id),
      action: 'password_reset_requested',
      before: null,
      after: { passwordResetId: reset.id, expiresAt: reset.expiresAt },
      at: now,
    });
  });
  return { user, token, expiresAt };
}

/**
 * Sets a new password from a reset link. The link works once and only within its hour; using it
 * also signs the account out of every session (whoever had the old password loses access).
 */
export async function resetPassword(db: Db, clock: Clock, token: string, password: string): Promise<void> {
  const hash = hashToken(token);
  const openReset = () => and(eq(passwordResets.tokenHash, hash), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, clock.now().toISOString()));
  const reset = db.select().from(passwordResets).where(openReset()).get();
  if (!reset) throw invalidLink();
  const passwordHash = await hashPassword(password);
  const now = clock.now();
  db.transaction((tx) => {
    const claimed = tx.update(passwordResets).set({ usedAt: now.toISOString() }).where(openReset()).run();
    if (claimed.changes !== 1) throw invalidLink();
    tx.update(users).set({ passwordHash, updatedAt: now.toISOString() }).where(eq(users.id, reset.userId)).run();
    recordAudit(tx, {
      organizationId: null,
      actorUserId: reset.userId,
      entityType: 'user',
      entityId: String(reset.userId),
      action: 'password_reset_used',
      before: null,
      after: { passwordResetId: reset.id },
      at: now,
    });
  });
  endSessionsOf(db, reset.userId);
}
