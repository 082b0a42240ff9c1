import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPage } from '@schema/list-query';
import type { Site } from '@schema/sites';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** A site as the list sends it, with the number of its exposure groups in use. */
export type SiteView = Omit<Site, 'organizationId'> & { exposureGroupCount: number };

/** GET /api/orgs/:orgId/sites?q&sort&page&pageSize&archived (org:read). */
export function getSites(organizationId: string, query: string, signal?: AbortSignal): Promise<ListPage<SiteView>> {
  return api.get<ListPage<SiteView>>(`${apiPath('/api/orgs', organizationId)}/sites?${query}`, { signal });
}

export function sitesQuery(organizationId: string, query: string) {
  return queryOptions({
    queryKey: [...orgKeys.sites(organizationId), 'list', query] as const,
    queryFn: ({ signal }) => getSites(organizationId, query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useSites(organizationId: string, query: string) {
  return useQuery(sitesQuery(organizationId, query));
}

/** Every site in use, by name: for pick lists (an organization has a handful). */
export function useSiteChoices(organizationId: string) {
  return useSites(organizationId, 'archived=false&sort=name&pageSize=200');
}
