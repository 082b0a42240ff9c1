import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NoiseEstimateView } from '@schema/noise-estimates';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET /api/orgs/:orgId/exposure-groups/:groupId/noise-estimates — the group's ISO 9612 estimates with their figures. */
export function getNoiseEstimates(organizationId: string, groupId: string, signal?: AbortSignal): Promise<NoiseEstimateView[]> {
  return api.get<NoiseEstimateView[]>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/noise-estimates`, { signal });
}

export function noiseEstimatesQuery(organizationId: string, groupId: string) {
  return queryOptions({
    queryKey: [...orgKeys.noiseEstimates(organizationId), 'group', groupId] as const,
    queryFn: ({ signal }) => getNoiseEstimates(organizationId, groupId, signal),
  });
}

export function useNoiseEstimates(organizationId: string, groupId: string) {
  return useQuery(noiseEstimatesQuery(organizationId, groupId));
}
