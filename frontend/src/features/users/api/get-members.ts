import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MemberView } from '@schema/organizations';
import { api, apiPath } from '@frontend/lib/api-client';

/** One person's membership of the organization (GET /api/orgs/:orgId/members); `id` is the membership id. */
export type Member = MemberView;

export const membersKey = (organizationId: string) => ['orgs', organizationId, 'members'] as const;

/** GET /api/orgs/:orgId/members (users:manage). */
export function getMembers(organizationId: string, signal?: AbortSignal): Promise<Member[]> {
  return api.get<Member[]>(`${apiPath('/api/orgs', organizationId)}/members`, { signal });
}

export function membersQuery(organizationId: string) {
  return queryOptions({ queryKey: membersKey(organizationId), queryFn: ({ signal }) => getMembers(organizationId, signal) });
}

export function useMembers(organizationId: string) {
  return useQuery(membersQuery(organizationId));
}
