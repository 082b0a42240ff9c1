import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';

export interface OrganizationSummary {
  organization: { id: number | string; name: string; slug: string };
  counts: { sites: number; exposureGroups: number; workers: number; agents: number; members: number };
}

export const organizationKey = (organizationId: string) => ['orgs', organizationId] as const;

/** GET /api/orgs/:orgId/summary (org:read). */
export function getOrganizationSummary(organizationId: string, signal?: AbortSignal): Promise<OrganizationSummary> {
  return api.get<OrganizationSummary>(`${apiPath('/api/orgs', organizationId)}/summary`, { signal });
}

export function organizationSummaryQuery(organizationId: string) {
  return queryOptions({
    queryKey: [...organizationKey(organizationId), 'summary'] as const,
    queryFn: ({ signal }) => getOrganizationSummary(organizationId, signal),
  });
}

export function useOrganizationSummary(organizationId: string) {
  return useQuery(organizationSummaryQuery(organizationId));
}
