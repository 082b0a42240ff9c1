import { queryOptions, useQuery } from '@tanstack/react-query';
import type { GroupWorkerLetters } from '@schema/worker-letters';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET /api/orgs/:orgId/exposure-groups/:groupId/worker-letters (workerNames:read). */
export function getWorkerLetters(organizationId: string, groupId: string, signal?: AbortSignal): Promise<GroupWorkerLetters> {
  return api.get<GroupWorkerLetters>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/worker-letters`, { signal });
}

/**
 * Under the groups key: entering, voiding or restoring a result refreshes the groups key, and with
 * it the results waiting for a letter.
 */
export function workerLettersQuery(organizationId: string, groupId: string) {
  return queryOptions({
    queryKey: [...orgKeys.exposureGroups(organizationId), 'worker-letters', groupId] as const,
    queryFn: ({ signal }) => getWorkerLetters(organizationId, groupId, signal),
  });
}

/** `enabled` false for roles that may not see names (the server would answer 403). */
export function useWorkerLetters(organizationId: string, groupId: string, enabled = true) {
  return useQuery({ ...workerLettersQuery(organizationId, groupId), enabled });
}

/** Address of a letter's PDF (a preview of a draft; the kept file once sent or handed over). */
export function workerLetterPdfUrl(organizationId: string, letterId: number): string {
  return `${apiPath('/api/orgs', organizationId, 'worker-letters')}/${letterId}.pdf`;
}
