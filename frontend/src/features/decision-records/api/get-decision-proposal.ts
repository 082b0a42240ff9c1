import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DecisionProposal } from '@schema/decision-records';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET …/decision-records/proposal?exclude=: category, judgement, figures and review date a new draft starts from. */
export function getDecisionProposal(organizationId: string, groupId: string, exclude: readonly number[], signal?: AbortSignal): Promise<DecisionProposal> {
  const query = exclude.length > 0 ? `?exclude=${exclude.join(',')}` : '';
  return api.get<DecisionProposal>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/decision-records/proposal${query}`, { signal });
}

export function decisionProposalQuery(organizationId: string, groupId: string, exclude: readonly number[]) {
  return queryOptions({
    queryKey: [...orgKeys.decisionRecords(organizationId), 'proposal', groupId, exclude.join(',')] as const,
    queryFn: ({ signal }) => getDecisionProposal(organizationId, groupId, exclude, signal),
  });
}

export function useDecisionProposal(organizationId: string, groupId: string, exclude: readonly number[], enabled = true) {
  return useQuery({ ...decisionProposalQuery(organizationId, groupId, exclude), placeholderData: (previous) => previous, enabled: enabled && groupId !== '' });
}
