import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import type { InvitationCreate, InvitationAccept } from '@schema/auth';
import { invitations, memberships, organizations, type Invitation, type InvitationView, type Organization } from '@schema/organizations';
import { users, type User } from '@schema/users';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { BadRequest, Conflict, NotFound } from '../errors';
import { recordAudit } from './audit';
import { hashPassword, verifyPassword } from './passwords';
import { createLinkToken, hashToken } from './tokens';
import { findUserByEmail } from './users';

/** An invitation link works for 7 days. */
export const invitationLifetimeMs = 7 * 24 * 3_600_000;

const gone = () => new NotFound('This invitation link is unknown, expired, revoked or already used');

/**
 * Creates an invitation and returns it with the plain token for the e-mail (only its hash is
 * stored). A newer invitation to the same address replaces any pending one (they are revoked).
 */
export function createInvitation(
  db: Db,
  clock: Clock,
  input: InvitationCreate & { organization: Organization; invitedBy: User },
): { invitation: Invitation; token: string } {
  const { organization, invitedBy, email, role } = input;
  const existing = findUserByEmail(db, email);
  if (existing) {
    const member = db
      .select()
      .from(memberships)
      .where(and(eq(memberships.organizationId, organization.id), eq(memberships.userId, existing.id)))
      .get();
    if (member?.active) throw new Conflict(`${email} is already a member of ${organization.name}`);
  }
  const now = clock.now();
  const { token, hash } = createLinkToken();
  const invitation = db.transaction((tx) => {
    const pending = tx
      .select()
      .from(invitations)
      .where(and(eq(invitations.organizationId, organization.id), eq(invitations.email, email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
      .all();
    for (const old of pending) {
      tx.update(invitations).set({ revokedAt: now.toISOString() }).where(eq(invitations.id, old.id)).run();
      recordAudit(tx, {
        organizationId: organization.id,
        actorUserId: invitedBy.id,
        entityType: 'invitation',
        entityId: String(old.id),
        action: 'revoked',
        reason: 'Replaced by a new invitation to the same address',
        before: { email: old.email, role: old.role },
        after: null,
        at: now,
      });
    }
    const created = tx
      .insert(invitations)
      .values({
        organizationId: organization.id,
        email,
        role,
        tokenHash: hash,
        invitedByUserId: invitedBy.id,
        createdAt: now.toISOString(),
        expiresAt: new Date(now.getTime() + invitationLifetimeMs).toISOString(),
      })
      .returning()
      .get();
    recordAudit(tx, {
      organizationId: organization.id,
      actorUserId: invitedBy.id,
      entityType: 'invitation',
      entityId: String(created.id),
      action: 'created',
      before: null,
      after: { email, role, expiresAt: created.expiresAt },
      at: now,
    });
    return created;
  });
  return { invitation, token };
}

function statusOf(invitation: Invitation, now: Date): InvitationView['status'] {
  if (invitation.acceptedAt) return 'accepted';
  return invitation.expiresAt <= now.toISOString() ? 'expired' : 'pending';
}

/** The organization's invitations, newest first, without revoked ones. */
export function listInvitations(db: Db, clock: Clock, organizationId: number): InvitationView[] {
  const now = clock.now();
  return db
    .select({ invitation: invitations, invitedBy: users.name })
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.invitedByUserId))
    .where(and(eq(invitations.organizationId, organizationId), isNull(invitations.revokedAt)))
    .orderBy(desc(invitations.createdAt), desc(invitations.id))
    .all()
    .map(({ invitation, invitedBy }) => viewOf(invitation, invitedBy, now));
}

/** An invitation as the list shows it. */
export function viewOf(invitation: Invitation, invitedBy: string, now: Date): InvitationView {
  return {
    id: invitation.id,
    email: invitation.email,
    role: invitation.role,
    invitedBy,
    createdAt: invitation.createdAt,
    expiresAt: invitation.expiresAt,
    acceptedAt: invitation.acceptedAt,
    status: statusOf(invitation, now),
  };
}

/** Revokes a pending invitation of this organization. 404 for unknown/other organization's/revoked; 409 if accepted. */
export function revokeInvitation(db: Db, clock: Clock, input: { organizationId: number; invitationId: number; actor: User }): void {
  const now = clock.now();
  db.transaction((tx) => {
    const invitation = tx
      .select()
      .from(invitations)
      .where(and(eq(invitations.id, input.invitationId), eq(invitations.organizationId, input.organizationId), isNull(invitations.revokedAt)))
      .get();
    if (!invitation) throw new NotFound(`No invitation ${input.invitationId} in this organization`);
    if (invitation.acceptedAt) throw new Conflict('This invitation has already been accepted; change the membership instead');
    tx.update(invitations).set({ revokedAt: now.toISOString() }).where(eq(invitations.id, invitation.id)).run();
    recordAudit(tx, {
      organizationId: input.organizationId,
      actorUserId: input.actor.id,
      entityType: 'invitation',
      entityId: String(invitation.id),
      action: 'revoked',
      before: { email: invitation.email, role: invitation.role },
      after: null,
      at: now,
    });
  });
}

/** The open invitation a link token belongs to (not accepted, not revoked, not expired), with its organization. */
export function findOpenInvitation(db: Db, clock: Clock, token: string): { invitation: Invitation; organization: Organization } | undefined {
  return db
    .select({ invitation: invitations, organization: organizations })
    .from(invitations)
    .innerJoin(organizations, eq(organizations.id, invitations.organizationId))
    .where(
      and(
        eq(invitations.tokenHash, hashToken(token)),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
        gt(invitations.expiresAt, clock.now().toISOString()),
      ),
    )
    .get();
}

/**
 * Accepts an invitation: creates the user (or, when the e-mail already has an account, checks
 * its password) and adds or reactivates the membership with the invited role. The link then
 * stops working. Returns the user, for the caller to sign in.
 */
export async function acceptInvitation(db: Db, clock: Clock, token: string, input: InvitationAccept): Promise<User> {
  const open = findOpenInvitation(db, clock, token);
  if (!open) throw gone();
  const { invitation } = open;
  const existing = findUserByEmail(db, invitation.email);
  if (existing && !(await verifyPassword(existing.passwordHash, input.password))) {
    throw new BadRequest('An account with this e-mail address already exists: enter its password to join', {
      password: 'Enter the password of your existing Bellwether account',
    });
  }
  const passwordHash = existing ? undefined : await hashPassword(input.password);
  const now = clock.now();
  const stamp = now.toISOString();
  return db.transaction((tx) => {
    // Claim the link atomically: a second acceptance racing this one changes nothing and fails.
    const claimed = tx
      .update(invitations)
      .set({ acceptedAt: stamp })
      .where(and(eq(invitations.id, invitation.id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
      .run();
    if (claimed.changes !== 1) throw gone();
    const user =
      existing ??
      tx.insert(users).values({ email: invitation.email, name: input.name, passwordHash: passwordHash!, createdAt: stamp, updatedAt: stamp }).returning().get();
    tx.update(invitations).set({ acceptedByUserId: user.id }).where(eq(invitations.id, invitation.id)).run();
    const member = tx
      .select()
      .from(memberships)
      .where(and(eq(memberships.organizationId, invitation.organizationId), eq(memberships.userId, user.id)))
      .get();
    if (member?.active) throw new Conflict('You are already a member of this organization');
    const membership = member
      ? tx.update(memberships).set({ role: invitation.role, active: true, updatedAt: stamp }).where(eq(memberships.id, member.id)).returning().get()
      : tx
          .insert(memberships)
          .values({ organizationId: invitation.organizationId, userId: user.id, role: invitation.role, createdAt: stamp, updatedAt: stamp })
          .returning()
          .get();
    recordAudit(tx, {
      organizationId: invitation.organizationId,
      actorUserId: user.id,
      entityType: 'invitation',
      entityId: String(invitation.id),
      action: 'accepted',
      before: null,
      after: { email: invitation.email, role: invitation.role, newAccount: !existing },
      at: now,
    });
    recordAudit(tx, {
      organizationId: invitation.organizationId,
      actorUserId: user.id,
      entityType: 'membership',
      entityId: String(membership.id),
      action: member ? 'reactivated' : 'created',
      before: member ? { role: member.role, active: member.active } : null,
      after: { role: membership.role, active: membership.active },
      at: now,
    });
    return user;
  });
}
