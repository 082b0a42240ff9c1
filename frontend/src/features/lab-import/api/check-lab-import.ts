import { useMutation } from '@tanstack/react-query';
import type { LabImportCommit } from '@schema/lab-imports';
import { api, apiPath } from '@frontend/lib/api-client';
import type { LabImportCheck } from './types';

/**
 * POST /api/orgs/:orgId/lab-imports/:batchId/check — a dry run: the results the commit would store,
 * or a 400 listing every problem by row and column. Stores nothing.
 */
export function checkLabImport(organizationId: string, batchId: number, commit: LabImportCommit): Promise<LabImportCheck> {
  return api.post<LabImportCheck>(`${apiPath('/api/orgs', organizationId, 'lab-imports', batchId)}/check`, commit);
}

export function useCheckLabImport(organizationId: string) {
  return useMutation({ mutationFn: ({ batchId, commit }: { batchId: number; commit: LabImportCommit }) => checkLabImport(organizationId, batchId, commit) });
}
