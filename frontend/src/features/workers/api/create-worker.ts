import type { WorkerCreate } from '@schema/workers';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';
import type { WorkerDetail } from './get-worker';

/** POST /api/orgs/:orgId/workers → 201; 409 when the code is taken (codes ignore case). */
export function createWorker(organizationId: string, worker: WorkerCreate): Promise<WorkerDetail> {
  return api.post<WorkerDetail>(`${apiPath('/api/orgs', organizationId)}/workers`, worker);
}

export function useCreateWorker(organizationId: string) {
  return useOrganizationMutation(organizationId, (worker: WorkerCreate) => createWorker(organizationId, worker), [orgKeys.workers, orgKeys.summary]);
}
