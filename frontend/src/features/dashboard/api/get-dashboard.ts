import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OrganizationDashboard } from '@schema/dashboard';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET /api/orgs/:orgId/dashboard: the organization overview. */
export function getDashboard(organizationId: string, signal?: AbortSignal): Promise<OrganizationDashboard> {
  return api.get<OrganizationDashboard>(`${apiPath('/api/orgs', organizationId)}/dashboard`, { signal });
}

export function dashboardQuery(organizationId: string) {
  return queryOptions({ queryKey: orgKeys.dashboard(organizationId), queryFn: ({ signal }) => getDashboard(organizationId, signal) });
}

export function useDashboard(organizationId: string) {
  return useQuery(dashboardQuery(organizationId));
}
