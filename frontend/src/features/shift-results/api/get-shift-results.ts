import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPage } from '@schema/list-query';
import { api, apiPath } from '@frontend/lib/api-client';
import type { ShiftResultView } from '@frontend/lib/api-types';
import { orgKeys } from '@frontend/lib/query-keys';

/**
 * GET /api/orgs/:orgId/shift-results?q&sort&page&pageSize&groupId&workerId&importBatchId&status&source&nonDetect&from&to
 * (org:read). Valid and void results alike; names only for roles that may see them.
 */
export function getShiftResults(organizationId: string, query: string, signal?: AbortSignal): Promise<ListPage<ShiftResultView>> {
  return api.get<ListPage<ShiftResultView>>(`${apiPath('/api/orgs', organizationId)}/shift-results?${query}`, { signal });
}

export function shiftResultsQuery(organizationId: string, query: string) {
  return queryOptions({
    queryKey: [...orgKeys.shiftResults(organizationId), 'list', query] as const,
    queryFn: ({ signal }) => getShiftResults(organizationId, query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useShiftResults(organizationId: string, query: string) {
  return useQuery(shiftResultsQuery(organizationId, query));
}
