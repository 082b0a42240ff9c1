import type { AgentCreate } from '@schema/agents';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';
import type { AgentView } from './get-agents';

/** POST /api/orgs/:orgId/agents → 201; 409 when the name is taken. */
export function createAgent(organizationId: string, agent: AgentCreate): Promise<AgentView> {
  return api.post<AgentView>(`${apiPath('/api/orgs', organizationId)}/agents`, agent);
}

export function useCreateAgent(organizationId: string) {
  return useOrganizationMutation(organizationId, (agent: AgentCreate) => createAgent(organizationId, agent), [orgKeys.agents, orgKeys.summary]);
}
