import type { WorkerLetterView } from '@schema/worker-letters';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/** POST …/worker-letters/:letterId/hand-over: the printed letter was handed to the worker on a date. */
export function handOverWorkerLetter(organizationId: string, letterId: number, handedOverOn: string): Promise<WorkerLetterView> {
  return api.post<WorkerLetterView>(`${apiPath('/api/orgs', organizationId, 'worker-letters', letterId)}/hand-over`, { handedOverOn });
}

export function useHandOverWorkerLetter(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ letterId, handedOverOn }: { letterId: number; handedOverOn: string }) => handOverWorkerLetter(organizationId, letterId, handedOverOn),
    [orgKeys.exposureGroups],
  );
}
