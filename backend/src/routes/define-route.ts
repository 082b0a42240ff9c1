import type { Request, RequestHandler, Response, Router } from 'express';
import type { Membership, Organization } from '@schema/organizations';
import { permissions, type Permission } from '@schema/permissions';
import type { User } from '@schema/users';
import type { AppDeps } from '../deps';
import { requireMembership, requirePermission, requirePermissionInAnyOrganization, requireUser } from '../middleware/auth';
import type { LimiterName } from '../middleware/rate-limit';
import { requireOwnedIds } from './owned-collections';

/**
 * The route inventory. Every API route is declared with one of `publicRoute`, `userRoute` or
 * `orgRoute` and listed in routes/index.ts; `mountRoutes` is the only place routes reach Express.
 * Organization routes (`/orgs/:orgId/…`) must name a permission — the type requires it, and
 * `mountRoutes` refuses any route under /orgs that is not an `orgRoute` — so a test can walk the
 * list and try every route as every role.
 */
export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteContext {
  req: Request;
  res: Response;
  deps: AppDeps;
}
export interface UserContext extends RouteContext {
  user: User;
}
export interface OrganizationContext extends UserContext {
  organization: Organization;
  membership: Membership;
}

interface RouteBase {
  method: HttpMethod;
  /** Path under /api, Express 5 syntax (`/orgs/:orgId/members/:membershipId`). */
  path: string;
  /** One line for the inventory: what the route does. */
  summary: string;
  /** Rate limiters to pass first (middleware/rate-limit.ts). */
  rateLimits?: readonly LimiterName[];
  /** Mount the route only when this holds (e.g. the outbox, only while the capture runs). */
  enabledWhen?: (deps: AppDeps) => boolean;
}

export interface PublicRoute extends RouteBase {
  access: 'public';
  handler: (context: RouteContext) => unknown;
}
export interface UserRoute extends RouteBase {
  access: 'user';
  /** Optionally require a permission held in at least one of the user's organizations. */
  permissionInAnyOrganization?: Permission;
  handler: (context: UserContext) => unknown;
}
export interface OrganizationRoute extends RouteBase {
  access: 'organization';
  permission: Permission;
  handler: (context: OrganizationContext) => unknown;
}
export type RouteDefinition = PublicRoute | UserRoute | OrganizationRoute;

const organizationPrefix = '/orgs/:orgId';

/** A route anyone may call (sign-in, health, invitation links). */
export const publicRoute = (route: Omit<PublicRoute, 'access'>): PublicRoute => ({ ...route, access: 'public' });

/** A route for any signed-in user, outside any one organization (`/me`, the outbox). */
export const userRoute = (route: Omit<UserRoute, 'access'>): UserRoute => ({ ...route, access: 'user' });

/**
 * A route inside one organization: membership of `:orgId` (else 404), then `permission` (else 403),
 * then each id in the path must not belong to another organization (else 404, routes/owned-collections.ts).
 */
export const orgRoute = (route: Omit<OrganizationRoute, 'access'>): OrganizationRoute => ({
  ...route,
  access: 'organization',
});

/** Throws when a definition breaks the inventory's rules (checked at start, so a bad route never ships). */
export function checkRouteDefinitions(routes: readonly RouteDefinition[]): void {
  const seen = new Set<string>();
  for (const route of routes) {
    const name = `${route.method.toUpperCase()} ${route.path}`;
    if (!route.path.startsWith('/')) throw new Error(`Route ${name}: the path must start with /`);
    if (seen.has(name)) throw new Error(`Route ${name} is declared twice`);
    seen.add(name);
    const underOrganization = route.path === '/orgs' || route.path.startsWith('/orgs/');
    if (route.access === 'organization') {
      if (route.path !== organizationPrefix && !route.path.startsWith(`${organizationPrefix}/`))
        throw new Error(`Route ${name}: organization routes live under ${organizationPrefix}`);
      if (!permissions.includes(route.permission)) throw new Error(`Route ${name}: unknown permission "${String(route.permission)}"`);
    } else if (underOrganization) {
      throw new Error(`Route ${name}: a route under /orgs must be declared with orgRoute and a permission`);
    }
  }
}

/** The middleware chain that guards a route, in order. */
function guardsFor(route: RouteDefinition, deps: AppDeps): RequestHandler[] {
  switch (route.access) {
    case 'public':
      return [];
    case 'user':
      return route.permissionInAnyOrganization
        ? [requireUser(deps.db), requirePermissionInAnyOrganization(deps.db, route.permissionInAnyOrganization)]
        : [requireUser(deps.db)];
    case 'organization': {
      const owned = requireOwnedIds(deps.db, route.path);
      return [requireUser(deps.db), requireMembership(deps.db), requirePermission(route.permission), ...(owned ? [owned] : [])];
    }
  }
}

function handlerFor(route: RouteDefinition, deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const base: RouteContext = { req, res, deps };
    switch (route.access) {
      case 'public':
        await route.handler(base);
        return;
      case 'user':
        await route.handler({ ...base, user: res.locals.user! });
        return;
      case 'organization':
        await route.handler({
          ...base,
          user: res.locals.user!,
          organization: res.locals.organization!,
          membership: res.locals.membership!,
        });
        return;
    }
  };
}

/** Checks the inventory and registers every enabled route on `router` with its guards. */
export function mountRoutes(router: Router, routes: readonly RouteDefinition[], deps: AppDeps, limiters: Record<LimiterName, RequestHandler>): void {
  checkRouteDefinitions(routes);
  for (const route of routes) {
    if (route.enabledWhen && !route.enabledWhen(deps)) continue;
    const limits = (route.rateLimits ?? []).map((name) => limiters[name]);
    router[route.method](route.path, ...limits, ...guardsFor(route, deps), handlerFor(route, deps));
  }
}
