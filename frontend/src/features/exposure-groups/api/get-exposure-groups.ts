import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPage } from '@schema/list-query';
import { api, apiPath } from '@frontend/lib/api-client';
import type { ExposureGroupView } from '@frontend/lib/api-types';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET /api/orgs/:orgId/exposure-groups?q&sort&page&pageSize&archived&siteId&agentId (org:read). */
export function getExposureGroups(organizationId: string, query: string, signal?: AbortSignal): Promise<ListPage<ExposureGroupView>> {
  return api.get<ListPage<ExposureGroupView>>(`${apiPath('/api/orgs', organizationId)}/exposure-groups?${query}`, { signal });
}

export function exposureGroupsQuery(organizationId: string, query: string) {
  return queryOptions({
    queryKey: [...orgKeys.exposureGroups(organizationId), 'list', query] as const,
    queryFn: ({ signal }) => getExposureGroups(organizationId, query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useExposureGroups(organizationId: string, query: string) {
  return useQuery(exposureGroupsQuery(organizationId, query));
}

/** Every group in use, by name, for pick lists (membership forms, the lab import). */
export function useExposureGroupChoices(organizationId: string) {
  return useExposureGroups(organizationId, 'archived=false&sort=name&pageSize=200');
}
