import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPage } from '@schema/list-query';
import type { Worker } from '@schema/workers';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/**
 * A worker as the API sends it. For roles without 'workerNames:read' (consultants) the `name`
 * and `email` keys are absent and `nameHidden` is true: the server never sends them.
 */
export type WorkerPublic = Omit<Worker, 'name' | 'email' | 'organizationId'> & { name?: string | null; email?: string | null; nameHidden?: true };
export type WorkerListItem = WorkerPublic & { currentGroups: Array<{ id: number; name: string }> };

/** GET /api/orgs/:orgId/workers?q&sort&page&pageSize&archived&groupId&memberOn&jobTitle (org:read). */
export function getWorkers(organizationId: string, query: string, signal?: AbortSignal): Promise<ListPage<WorkerListItem>> {
  return api.get<ListPage<WorkerListItem>>(`${apiPath('/api/orgs', organizationId)}/workers?${query}`, { signal });
}

export function workersQuery(organizationId: string, query: string) {
  return queryOptions({
    queryKey: [...orgKeys.workers(organizationId), 'list', query] as const,
    queryFn: ({ signal }) => getWorkers(organizationId, query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useWorkers(organizationId: string, query: string) {
  return useQuery(workersQuery(organizationId, query));
}

/** Workers in use, by code, for pick lists (at most 200: the pick list also searches by code). */
export function useWorkerChoices(organizationId: string) {
  return useWorkers(organizationId, 'archived=false&sort=code&pageSize=200');
}
