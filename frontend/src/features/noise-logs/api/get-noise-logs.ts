import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';
import type { NoiseLogListItem } from './types';

/** Query keys of the noise-log pages. */
export const noiseKeys = {
  all: (organizationId: string) => [...orgKeys.all(organizationId), 'noise-logs'] as const,
  list: (organizationId: string, query: string) => [...noiseKeys.all(organizationId), 'list', query] as const,
  detail: (organizationId: string, logId: string) => [...noiseKeys.all(organizationId), 'detail', logId] as const,
  settings: (organizationId: string) => [...orgKeys.all(organizationId), 'noise-settings'] as const,
};

/** GET /api/orgs/:orgId/noise-logs?groupId&workerId (org:read). */
export function getNoiseLogs(organizationId: string, query: string, signal?: AbortSignal) {
  return api.get<{ items: NoiseLogListItem[] }>(`${apiPath('/api/orgs', organizationId)}/noise-logs?${query}`, { signal });
}

export function noiseLogsQuery(organizationId: string, query: string) {
  return queryOptions({ queryKey: noiseKeys.list(organizationId, query), queryFn: ({ signal }) => getNoiseLogs(organizationId, query, signal) });
}

export function useNoiseLogs(organizationId: string, query: string) {
  return useQuery(noiseLogsQuery(organizationId, query));
}
