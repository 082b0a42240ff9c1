import { and, asc, eq } from 'drizzle-orm';
import { memberships, organizations, type MembershipView } from '@schema/organizations';
import { permissionsOf } from '@schema/permissions';
import { users, type User, type UserPublic } from '@schema/users';
import type { Db } from '../db/client';

export function findUserByEmail(db: Db, email: string): User | undefined {
  return db.select().from(users).where(eq(users.email, email.trim().toLowerCase())).get();
}

/** The user as the API shows it (no hash, no timestamps). */
export function publicUser(user: User): UserPublic {
  return { id: user.id, email: user.email, name: user.name };
}

/** The user's active memberships with organization names and the role's permissions, by organization name. */
export function membershipsOf(db: Db, userId: number): MembershipView[] {
  const rows = db
    .select({
      id: memberships.id,
      organizationId: organizations.id,
      organizationName: organizations.name,
      organizationSlug: organizations.slug,
      role: memberships.role,
    })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(and(eq(memberships.userId, userId), eq(memberships.active, true)))
    .orderBy(asc(organizations.name))
    .all();
  return rows.map((row) => ({ ...row, permissions: [...permissionsOf(row.role)] }));
}

/** What sign-in, invitation acceptance and `/api/me` answer with. */
export function sessionView(db: Db, user: User) {
  return { user: publicUser(user), memberships: membershipsOf(db, user.id) };
}

/** Signs the user out everywhere: removes every stored session that carries their id. */
export function endSessionsOf(db: Db, userId: number): void {
  db.$client.prepare(`delete from sessions where json_extract(sess, '$.userId') = ?`).run(userId);
}
