import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';
import type { ExposureGroupView } from '@frontend/lib/api-types';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET /api/orgs/:orgId/exposure-groups/:groupId — the group with counts and its effective OEL. */
export function getExposureGroup(organizationId: string, groupId: string, signal?: AbortSignal): Promise<ExposureGroupView> {
  return api.get<ExposureGroupView>(apiPath('/api/orgs', organizationId, 'exposure-groups', groupId), { signal });
}

export function exposureGroupQuery(organizationId: string, groupId: string) {
  return queryOptions({
    queryKey: [...orgKeys.exposureGroups(organizationId), 'one', groupId] as const,
    queryFn: ({ signal }) => getExposureGroup(organizationId, groupId, signal),
  });
}

export function useExposureGroup(organizationId: string, groupId: string) {
  return useQuery(exposureGroupQuery(organizationId, groupId));
}
