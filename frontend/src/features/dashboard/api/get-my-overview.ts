import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OverviewOrganization } from '@schema/dashboard';
import { api } from '@frontend/lib/api-client';

/** GET /api/me/overview: the signed-in person's organizations side by side (the consultant's view). */
export function getMyOverview(signal?: AbortSignal): Promise<{ organizations: OverviewOrganization[] }> {
  return api.get<{ organizations: OverviewOrganization[] }>('/api/me/overview', { signal });
}

export function myOverviewQuery() {
  return queryOptions({ queryKey: ['me', 'overview'] as const, queryFn: ({ signal }) => getMyOverview(signal) });
}

export function useMyOverview(enabled: boolean) {
  return useQuery({ ...myOverviewQuery(), enabled });
}
