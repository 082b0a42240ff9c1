import type { DecisionRecordView } from '@schema/decision-records';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/*
 * The record's workflow steps, each one POST …/decision-records/:recordId/<step>:
 * approve and return (analysts, never their own draft), resubmit (the drafter), acknowledge (managers, once),
 * comments (anyone who may comment). Every step answers the record as it is now.
 */

export type DecisionStep =
  { step: 'approve' } | { step: 'return'; comment: string } | { step: 'resubmit' } | { step: 'acknowledge' } | { step: 'comments'; body: string };

export function reviewDecision(organizationId: string, recordId: number, action: DecisionStep): Promise<DecisionRecordView> {
  const { step, ...body } = action;
  return api.post<DecisionRecordView>(`${apiPath('/api/orgs', organizationId, 'decision-records', recordId)}/${step}`, body);
}

export function useReviewDecision(organizationId: string, recordId: number) {
  return useOrganizationMutation(organizationId, (action: DecisionStep) => reviewDecision(organizationId, recordId, action), [
    orgKeys.decisionRecords,
    orgKeys.dashboard,
  ]);
}
