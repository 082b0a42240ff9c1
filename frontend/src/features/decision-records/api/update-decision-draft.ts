import type { DecisionDraftUpdate, DecisionRecordView } from '@schema/decision-records';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/** PATCH /api/orgs/:orgId/decision-records/:recordId: the drafter edits a draft or a returned draft (409 once approved). */
export function updateDecisionDraft(organizationId: string, recordId: number, changes: DecisionDraftUpdate): Promise<DecisionRecordView> {
  return api.patch<DecisionRecordView>(apiPath('/api/orgs', organizationId, 'decision-records', recordId), changes);
}

export function useUpdateDecisionDraft(organizationId: string, recordId: number) {
  return useOrganizationMutation(organizationId, (changes: DecisionDraftUpdate) => updateDecisionDraft(organizationId, recordId, changes), [
    orgKeys.decisionRecords,
    orgKeys.dashboard,
  ]);
}
