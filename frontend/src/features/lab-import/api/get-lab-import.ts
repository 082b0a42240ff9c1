import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';
import type { LabUpload } from './types';

/** GET /api/orgs/:orgId/lab-imports/:batchId — the batch with its preview (columns, suggested mapping, first rows). */
export function getLabImport(organizationId: string, batchId: string, signal?: AbortSignal): Promise<LabUpload> {
  return api.get<LabUpload>(apiPath('/api/orgs', organizationId, 'lab-imports', batchId), { signal });
}

export function labImportQuery(organizationId: string, batchId: string) {
  return queryOptions({
    queryKey: [...orgKeys.labImports(organizationId), 'one', batchId] as const,
    queryFn: ({ signal }) => getLabImport(organizationId, batchId, signal),
  });
}

export function useLabImport(organizationId: string, batchId: string) {
  return useQuery(labImportQuery(organizationId, batchId));
}
