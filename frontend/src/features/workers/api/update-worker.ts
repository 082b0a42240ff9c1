import type { WorkerUpdate } from '@schema/workers';
import { api, apiPath } from '@frontend/lib/api-client';
import { setArchived, useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';
import type { WorkerDetail } from './get-worker';

// Group pages, plans and results show worker codes and names.
const touches = [orgKeys.workers, orgKeys.exposureGroups, orgKeys.shiftResults, orgKeys.summary];

/** PATCH /api/orgs/:orgId/workers/:workerId. */
export function updateWorker(organizationId: string, workerId: number, changes: WorkerUpdate): Promise<WorkerDetail> {
  return api.patch<WorkerDetail>(apiPath('/api/orgs', organizationId, 'workers', workerId), changes);
}

export function useUpdateWorker(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ workerId, changes }: { workerId: number; changes: WorkerUpdate }) => updateWorker(organizationId, workerId, changes),
    touches,
  );
}

/** POST …/workers/:workerId/archive | unarchive (an archived worker is left out of new plan draws). */
export function useArchiveWorker(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ workerId, archived, reason }: { workerId: number; archived: boolean; reason?: string }) =>
      setArchived<WorkerDetail>(apiPath('/api/orgs', organizationId, 'workers', workerId), archived, reason),
    touches,
  );
}
