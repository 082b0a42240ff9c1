import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPage } from '@schema/list-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';
import type { ImportBatchSummary } from './types';

/** GET /api/orgs/:orgId/lab-imports?q&page&pageSize&status — newest first (org:read). */
export function getLabImports(organizationId: string, query: string, signal?: AbortSignal): Promise<ListPage<ImportBatchSummary>> {
  return api.get<ListPage<ImportBatchSummary>>(`${apiPath('/api/orgs', organizationId)}/lab-imports?${query}`, { signal });
}

export function labImportsQuery(organizationId: string, query: string) {
  return queryOptions({
    queryKey: [...orgKeys.labImports(organizationId), 'list', query] as const,
    queryFn: ({ signal }) => getLabImports(organizationId, query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useLabImports(organizationId: string, query: string) {
  return useQuery(labImportsQuery(organizationId, query));
}
