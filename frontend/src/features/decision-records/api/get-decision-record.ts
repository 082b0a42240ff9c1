import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DecisionRecordView } from '@schema/decision-records';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET /api/orgs/:orgId/decision-records/:recordId: one record in full. */
export function getDecisionRecord(organizationId: string, recordId: string, signal?: AbortSignal): Promise<DecisionRecordView> {
  return api.get<DecisionRecordView>(apiPath('/api/orgs', organizationId, 'decision-records', recordId), { signal });
}

export function decisionRecordQuery(organizationId: string, recordId: string) {
  return queryOptions({
    queryKey: [...orgKeys.decisionRecords(organizationId), 'record', recordId] as const,
    queryFn: ({ signal }) => getDecisionRecord(organizationId, recordId, signal),
  });
}

export function useDecisionRecord(organizationId: string, recordId: string) {
  return useQuery(decisionRecordQuery(organizationId, recordId));
}
