import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';
import type { WorkerMembership } from '@frontend/lib/api-types';
import { orgKeys } from '@frontend/lib/query-keys';
import type { WorkerPublic } from './get-workers';

/** One worker with every group membership period, oldest first. */
export type WorkerDetail = WorkerPublic & { memberships: WorkerMembership[] };

/** GET /api/orgs/:orgId/workers/:workerId (org:read). */
export function getWorker(organizationId: string, workerId: string, signal?: AbortSignal): Promise<WorkerDetail> {
  return api.get<WorkerDetail>(apiPath('/api/orgs', organizationId, 'workers', workerId), { signal });
}

export function workerQuery(organizationId: string, workerId: string) {
  return queryOptions({
    queryKey: [...orgKeys.workers(organizationId), 'one', workerId] as const,
    queryFn: ({ signal }) => getWorker(organizationId, workerId, signal),
  });
}

export function useWorker(organizationId: string, workerId: string) {
  return useQuery(workerQuery(organizationId, workerId));
}
