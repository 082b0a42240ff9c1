import { apiPath } from '@frontend/lib/api-client';

/**
 * GET /api/orgs/:orgId/decision-records/:recordId/evidence-pack.zip|pdf — the evidence pack of an approved record
 * (permission evidence:export). A plain link downloads it: the session cookie goes with it and the server names
 * the file (Content-Disposition), so there is no fetcher or query here.
 */
export function evidencePackUrl(organizationId: string, recordId: number, format: 'zip' | 'pdf'): string {
  return apiPath('/api/orgs', organizationId, 'decision-records', recordId, `evidence-pack.${format}`);
}
