import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationView } from '@schema/organizations';
import { api, apiPath } from '@frontend/lib/api-client';

/** An invitation as admins see it (GET /api/orgs/:orgId/invitations): status pending | accepted | expired. */
export type Invitation = InvitationView;

export const invitationsKey = (organizationId: string) => ['orgs', organizationId, 'invitations'] as const;

/** GET /api/orgs/:orgId/invitations (users:manage). */
export function getInvitations(organizationId: string, signal?: AbortSignal): Promise<Invitation[]> {
  return api.get<Invitation[]>(`${apiPath('/api/orgs', organizationId)}/invitations`, { signal });
}

export function invitationsQuery(organizationId: string) {
  return queryOptions({
    queryKey: invitationsKey(organizationId),
    queryFn: ({ signal }) => getInvitations(organizationId, signal),
  });
}

export function useInvitations(organizationId: string) {
  return useQuery(invitationsQuery(organizationId));
}
