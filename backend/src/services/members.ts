import { and, asc, count, eq, ne } from 'drizzle-orm';
import type { MembershipUpdate } from '@schema/auth';
import { memberships, type MemberView } from '@schema/organizations';
import { users, type User } from '@schema/users';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict, NotFound } from '../errors';
import { recordAudit } from './audit';

const memberColumns = {
  id: memberships.id,
  userId: memberships.userId,
  email: users.email,
  name: users.name,
  role: memberships.role,
  active: memberships.active,
  createdAt: memberships.createdAt,
};

/** Everyone with a membership in the organization (active or not), by name. */
export function listMembers(db: Db, organizationId: number): MemberView[] {
  return db
    .select(memberColumns)
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.organizationId, organizationId))
    .orderBy(asc(users.name), asc(memberships.id))
    .all();
}

function findMember(db: Pick<Db, 'select'>, organizationId: number, membershipId: number): MemberView | undefined {
  return db
    .select(memberColumns)
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.id, membershipId), eq(memberships.organizationId, organizationId)))
    .get();
}

/**
 * Changes a member's role or active flag. An organization always keeps at least one active
 * admin: demoting or deactivating the last one is refused (409), whoever asks.
 */
export function updateMember(
  db: Db,
  clock: Clock,
  input: { organizationId: number; membershipId: number; actor: User; changes: MembershipUpdate },
): MemberView {
  const now = clock.now();
  return db.transaction((tx) => {
    const current = findMember(tx, input.organizationId, input.membershipId);
    if (!current) throw new NotFound(`No member ${input.membershipId} in this organization`);
    const role = input.changes.role ?? current.role;
    const active = input.changes.active ?? current.active;
    if (role === current.role && active === current.active) return current;
    const losesAdmin = current.role === 'admin' && current.active && (role !== 'admin' || !active);
    if (losesAdmin) {
      const others = tx
        .select({ total: count() })
        .from(memberships)
        .where(
          and(
            eq(memberships.organizationId, input.organizationId),
            eq(memberships.role, 'admin'),
            eq(memberships.active, true),
            ne(memberships.id, current.id),
          ),
        )
        .get();
      if (!others || others.total === 0) {
        throw new Conflict(`${current.name} is the last active admin of this organization: make someone else admin first`);
      }
    }
    tx.update(memberships).set({ role, active, updatedAt: now.toISOString() }).where(eq(memberships.id, current.id)).run();
    recordAudit(tx, {
      organizationId: input.organizationId,
      actorUserId: input.actor.id,
      entityType: 'membership',
      entityId: String(current.id),
      action: active === current.active ? 'role_changed' : active ? 'reactivated' : 'deactivated',
      before: { userId: current.userId, role: current.role, active: current.active },
      after: { userId: current.userId, role, active },
      at: now,
    });
    return { ...current, role, active };
  });
}
