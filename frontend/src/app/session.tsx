import { createContext, use } from 'react';
import { data, redirect, type LoaderFunctionArgs } from 'react-router';
import { can, type Permission } from '@schema/permissions';
import { meQuery, sameId, type Me, type Membership } from '@frontend/features/auth/api/get-me';
import { readRememberedOrganization } from '@frontend/lib/current-organization';
import { signInPath } from '@frontend/lib/safe-next';
import { queryClient } from './query-client';

/** The signed-in person, provided by the session layout to every page under it. */
export const SessionContext = createContext<Me | null>(null);

/** The signed-in person; only for pages under the session layout. */
export function useSession(): Me {
  const me = use(SessionContext);
  if (!me) throw new Error('useSession is used outside the session layout');
  return me;
}

/** Loader helper: the person (from cache or /api/me), or a redirect to sign-in and back here. */
export async function requireSession(request: Request): Promise<Me> {
  const me = await queryClient.ensureQueryData(meQuery());
  if (!me) {
    const url = new URL(request.url);
    throw redirect(signInPath(url.pathname + url.search));
  }
  return me;
}

/**
 * Loader helper for /orgs/:orgId/…: the membership there. Someone who is not a member gets
 * the same 404 the server gives, so the page does not reveal which organizations exist.
 */
export async function requireMembership({ request, params }: LoaderFunctionArgs): Promise<Membership> {
  const me = await requireSession(request);
  const membership = me.memberships.find((m) => sameId(m.organizationId, params.orgId));
  if (!membership) throw data('No organization with this address is open to you.', { status: 404 });
  return membership;
}

/** Loader helper: the membership, or 403 when its role lacks the permission (the server checks again). */
export async function requirePermission(args: LoaderFunctionArgs, permission: Permission): Promise<Membership> {
  const membership = await requireMembership(args);
  if (!can(membership.role, permission)) throw data('Your role in this organization does not include this page.', { status: 403 });
  return membership;
}

/** The organization to open when the URL names none: the remembered one if still a member, else the first. */
export function defaultMembership(me: Me): Membership | undefined {
  const remembered = readRememberedOrganization();
  return me.memberships.find((m) => sameId(m.organizationId, remembered)) ?? me.memberships[0];
}

/** Whether any of the person's memberships grants the permission (e.g. the outbox). */
export function canAnywhere(me: Me, permission: Permission): boolean {
  return me.memberships.some((m) => can(m.role, permission));
}
