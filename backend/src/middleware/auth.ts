import { and, eq, sql } from 'drizzle-orm';
import type { RequestHandler } from 'express';
import { z } from 'zod';
import { idParam } from '@schema/columns';
import { memberships, organizations, type Membership, type Organization } from '@schema/organizations';
import { can, type Permission } from '@schema/permissions';
import { users, type User } from '@schema/users';
import type { Db } from '../db/client';
import { Forbidden, NotFound, Unauthorized } from '../errors';
import { membershipsOf } from '../services/users';
import { parseParams } from '../validation';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** Set by `requireUser`. */
      user?: User;
      /** Set by `requireMembership`: the signed-in user's active membership of `:orgId`… */
      membership?: Membership;
      /** …and that organization. */
      organization?: Organization;
    }
  }
}

/** 401 unless a signed-in user is in the session; puts the user in `res.locals.user`. */
export function requireUser(db: Db): RequestHandler {
  // Prepared once per route: these lookups run on every request, and building the query each time
  // was a measurable share of a cached read's cost (tests/bench/api.bench.ts).
  const userById = db
    .select()
    .from(users)
    .where(eq(users.id, sql.placeholder('userId')))
    .prepare();
  return (req, res, next) => {
    const userId = req.session?.userId;
    const user = userId === undefined ? undefined : userById.get({ userId });
    if (!user) return next(new Unauthorized());
    res.locals.user = user;
    next();
  };
}

const organizationParams = z.object({ orgId: idParam });

/**
 * Loads the signed-in user's active membership of the organization in `:orgId`. An organization
 * the user does not belong to (or has been deactivated in) answers 404, exactly like one that
 * does not exist, so ids of other organizations are never confirmed. Needs `requireUser` first.
 */
export function requireMembership(db: Db): RequestHandler {
  const activeMembership = db
    .select({ membership: memberships, organization: organizations })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(and(eq(memberships.organizationId, sql.placeholder('orgId')), eq(memberships.userId, sql.placeholder('userId')), eq(memberships.active, true)))
    .prepare();
  return (req, res, next) => {
    const { orgId } = parseParams(organizationParams, { orgId: req.params.orgId });
    const user = res.locals.user;
    if (!user) return next(new Unauthorized());
    const row = activeMembership.get({ orgId, userId: user.id });
    if (!row) return next(new NotFound(`No organization ${orgId} among yours`));
    res.locals.membership = row.membership;
    res.locals.organization = row.organization;
    next();
  };
}

/** 403 unless the role in `res.locals.membership` holds `permission` (schema/permissions.ts). */
export function requirePermission(permission: Permission): RequestHandler {
  return (_req, res, next) => {
    const membership = res.locals.membership;
    if (!membership) return next(new NotFound('Organization not found'));
    if (!can(membership.role, permission)) {
      return next(new Forbidden(`Your role (${membership.role}) does not allow this (needs ${permission})`));
    }
    next();
  };
}

/** 403 unless at least one of the user's active memberships holds `permission` (e.g. the outbox). */
export function requirePermissionInAnyOrganization(db: Db, permission: Permission): RequestHandler {
  return (_req, res, next) => {
    const user = res.locals.user;
    if (!user) return next(new Unauthorized());
    const allowed = membershipsOf(db, user.id).some((membership) => can(membership.role, permission));
    if (!allowed) return next(new Forbidden(`None of your roles allows this (needs ${permission})`));
    next();
  };
}
