import type { WorkerLetterDraft, WorkerLetterView } from '@schema/worker-letters';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/** POST /api/orgs/:orgId/exposure-groups/:groupId/worker-letters: one letter per worker for the waiting results. */
export function draftWorkerLetters(organizationId: string, groupId: number, draft: WorkerLetterDraft): Promise<{ letters: WorkerLetterView[] }> {
  return api.post<{ letters: WorkerLetterView[] }>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/worker-letters`, draft);
}

export function useDraftWorkerLetters(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ groupId, draft }: { groupId: number; draft: WorkerLetterDraft }) => draftWorkerLetters(organizationId, groupId, draft),
    [orgKeys.exposureGroups],
  );
}
