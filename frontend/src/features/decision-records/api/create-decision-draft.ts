import type { DecisionDraftCreate, DecisionRecordView } from '@schema/decision-records';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/** POST /api/orgs/:orgId/exposure-groups/:groupId/decision-records → 201; 409 when a draft is already open. */
export function createDecisionDraft(organizationId: string, groupId: string, draft: DecisionDraftCreate): Promise<DecisionRecordView> {
  return api.post<DecisionRecordView>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/decision-records`, draft);
}

export function useCreateDecisionDraft(organizationId: string, groupId: string) {
  return useOrganizationMutation(organizationId, (draft: DecisionDraftCreate) => createDecisionDraft(organizationId, groupId, draft), [
    orgKeys.decisionRecords,
    orgKeys.dashboard,
  ]);
}
