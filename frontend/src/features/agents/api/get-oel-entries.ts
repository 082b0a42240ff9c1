import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AgentKind, OelEntry } from '@schema/agents';
import type { ListPage } from '@schema/list-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** One line of the organization's OEL list, with its agent's name and kind. */
export type OelEntryView = Omit<OelEntry, 'organizationId'> & { agentName: string; agentKind: AgentKind };

/** GET /api/orgs/:orgId/oel-entries?q&sort&page&pageSize&archived&agentId (org:read). */
export function getOelEntries(organizationId: string, query: string, signal?: AbortSignal): Promise<ListPage<OelEntryView>> {
  return api.get<ListPage<OelEntryView>>(`${apiPath('/api/orgs', organizationId)}/oel-entries?${query}`, { signal });
}

export function oelEntriesQuery(organizationId: string, query: string) {
  return queryOptions({
    queryKey: [...orgKeys.oelEntries(organizationId), 'list', query] as const,
    queryFn: ({ signal }) => getOelEntries(organizationId, query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useOelEntries(organizationId: string, query: string) {
  return useQuery(oelEntriesQuery(organizationId, query));
}

/** The entries in use for one agent (the group form offers them); nothing is fetched without an agent. */
export function useOelEntriesOfAgent(organizationId: string, agentId: number | undefined) {
  return useQuery({
    ...oelEntriesQuery(organizationId, `archived=false&sort=source&pageSize=200&agentId=${agentId ?? 0}`),
    enabled: agentId !== undefined && agentId > 0,
    placeholderData: undefined,
  });
}
