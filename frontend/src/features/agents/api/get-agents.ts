import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Agent } from '@schema/agents';
import type { ListPage } from '@schema/list-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** An agent with the number of groups and OEL list entries (in use) that refer to it. */
export type AgentView = Omit<Agent, 'organizationId'> & { exposureGroupCount: number; oelEntryCount: number };

/** GET /api/orgs/:orgId/agents?q&sort&page&pageSize&archived&kind (org:read). */
export function getAgents(organizationId: string, query: string, signal?: AbortSignal): Promise<ListPage<AgentView>> {
  return api.get<ListPage<AgentView>>(`${apiPath('/api/orgs', organizationId)}/agents?${query}`, { signal });
}

export function agentsQuery(organizationId: string, query: string) {
  return queryOptions({
    queryKey: [...orgKeys.agents(organizationId), 'list', query] as const,
    queryFn: ({ signal }) => getAgents(organizationId, query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useAgents(organizationId: string, query: string) {
  return useQuery(agentsQuery(organizationId, query));
}

/** Every agent in use, by name, for pick lists. */
export function useAgentChoices(organizationId: string) {
  return useAgents(organizationId, 'archived=false&sort=name&pageSize=200');
}
