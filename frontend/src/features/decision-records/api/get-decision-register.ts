import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { DecisionRecordListItem } from '@schema/decision-records';
import type { ListPage } from '@schema/list-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** GET /api/orgs/:orgId/decision-records?q&status&category&judgement&siteId&outOfDate&reviewBy&sort&page&pageSize (org:read). */
export function getDecisionRegister(organizationId: string, query: string, signal?: AbortSignal): Promise<ListPage<DecisionRecordListItem>> {
  return api.get<ListPage<DecisionRecordListItem>>(`${apiPath('/api/orgs', organizationId)}/decision-records?${query}`, { signal });
}

// Under the decision-records key, so drafting, approving or returning a record refreshes the register too.
export function decisionRegisterQuery(organizationId: string, query: string) {
  return queryOptions({
    queryKey: [...orgKeys.decisionRecords(organizationId), 'register', query] as const,
    queryFn: ({ signal }) => getDecisionRegister(organizationId, query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useDecisionRegister(organizationId: string, query: string) {
  return useQuery(decisionRegisterQuery(organizationId, query));
}
