import type { WorkerLetterView } from '@schema/worker-letters';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/** POST …/worker-letters/:letterId/cancel with a reason: the letter's results wait for a letter again. */
export function cancelWorkerLetter(organizationId: string, letterId: number, reason: string): Promise<WorkerLetterView> {
  return api.post<WorkerLetterView>(`${apiPath('/api/orgs', organizationId, 'worker-letters', letterId)}/cancel`, { reason });
}

export function useCancelWorkerLetter(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ letterId, reason }: { letterId: number; reason: string }) => cancelWorkerLetter(organizationId, letterId, reason),
    [orgKeys.exposureGroups],
  );
}
