import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';
import type { LabUpload } from './types';

/**
 * POST /api/orgs/:orgId/lab-imports, multipart field "file" (a .csv or .txt, at most 5 MB) → 201:
 * the file is kept with its SHA-256 and read into a preview. A file that cannot be read as a table
 * is refused (400 with every problem) and nothing is stored.
 */
export function uploadLabFile(organizationId: string, file: File): Promise<LabUpload> {
  const form = new FormData();
  form.append('file', file, file.name);
  return api.upload<LabUpload>(`${apiPath('/api/orgs', organizationId)}/lab-imports`, form);
}

export function useUploadLabFile(organizationId: string) {
  return useOrganizationMutation(organizationId, (file: File) => uploadLabFile(organizationId, file), [orgKeys.labImports]);
}
