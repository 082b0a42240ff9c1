import type { LabImportCommit } from '@schema/lab-imports';
import { api, apiPath } from '@frontend/lib/api-client';
import type { ShiftResultView } from '@frontend/lib/api-types';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys, resultChangeKeys } from '@frontend/lib/query-keys';
import type { ImportBatchSummary } from './types';

export interface LabImportCommitted {
  batch: ImportBatchSummary;
  results: ShiftResultView[];
}

/**
 * POST /api/orgs/:orgId/lab-imports/:batchId/commit → 201. All or nothing: a single problem refuses
 * the whole file (400 listing every problem) and stores nothing; 409 when already committed.
 */
export function commitLabImport(organizationId: string, batchId: number, commit: LabImportCommit): Promise<LabImportCommitted> {
  return api.post<LabImportCommitted>(`${apiPath('/api/orgs', organizationId, 'lab-imports', batchId)}/commit`, commit);
}

export function useCommitLabImport(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ batchId, commit }: { batchId: number; commit: LabImportCommit }) => commitLabImport(organizationId, batchId, commit),
    [orgKeys.labImports, ...resultChangeKeys],
  );
}
