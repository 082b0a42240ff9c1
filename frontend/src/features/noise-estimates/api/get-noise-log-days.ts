import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NoiseLogDay } from '@schema/noise-estimates';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET /api/orgs/:orgId/exposure-groups/:groupId/noise-log-days — accepted noise-log days with their reviewed LAeq. */
export function getNoiseLogDays(organizationId: string, groupId: number, signal?: AbortSignal): Promise<NoiseLogDay[]> {
  return api.get<NoiseLogDay[]>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/noise-log-days`, { signal });
}

export function useNoiseLogDays(organizationId: string, groupId: number, enabled: boolean) {
  return useQuery(
    queryOptions({
      queryKey: [...orgKeys.noiseEstimates(organizationId), 'noise-log-days', groupId] as const,
      queryFn: ({ signal }) => getNoiseLogDays(organizationId, groupId, signal),
      enabled,
    }),
  );
}
