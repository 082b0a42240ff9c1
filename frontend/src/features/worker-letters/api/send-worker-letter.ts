import type { WorkerLetterView } from '@schema/worker-letters';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/** POST …/worker-letters/:letterId/send: e-mail the letter with its PDF (422 when the worker has no address). */
export function sendWorkerLetter(organizationId: string, letterId: number): Promise<WorkerLetterView> {
  return api.post<WorkerLetterView>(`${apiPath('/api/orgs', organizationId, 'worker-letters', letterId)}/send`, {});
}

export function useSendWorkerLetter(organizationId: string) {
  return useOrganizationMutation(organizationId, (letterId: number) => sendWorkerLetter(organizationId, letterId), [orgKeys.exposureGroups]);
}
