import { queryOptions, useQuery } from '@tanstack/react-query';
import type { GroupDecisions } from '@schema/decision-records';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET /api/orgs/:orgId/exposure-groups/:groupId/decision-records: the group's records, history and whether a new draft is due. */
export function getGroupDecisions(organizationId: string, groupId: string, signal?: AbortSignal): Promise<GroupDecisions> {
  return api.get<GroupDecisions>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/decision-records`, { signal });
}

export function groupDecisionsQuery(organizationId: string, groupId: string) {
  return queryOptions({
    queryKey: [...orgKeys.decisionRecords(organizationId), 'group', groupId] as const,
    queryFn: ({ signal }) => getGroupDecisions(organizationId, groupId, signal),
  });
}

export function useGroupDecisions(organizationId: string, groupId: string) {
  return useQuery(groupDecisionsQuery(organizationId, groupId));
}
