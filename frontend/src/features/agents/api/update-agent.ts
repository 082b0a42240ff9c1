import type { AgentUpdate } from '@schema/agents';
import { api, apiPath } from '@frontend/lib/api-client';
import { setArchived, useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';
import type { AgentView } from './get-agents';

// The OEL list and the groups show agent names.
const touches = [orgKeys.agents, orgKeys.oelEntries, orgKeys.exposureGroups, orgKeys.summary];

/** PATCH /api/orgs/:orgId/agents/:agentId. */
export function updateAgent(organizationId: string, agentId: number, changes: AgentUpdate): Promise<AgentView> {
  return api.patch<AgentView>(apiPath('/api/orgs', organizationId, 'agents', agentId), changes);
}

export function useUpdateAgent(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ agentId, changes }: { agentId: number; changes: AgentUpdate }) => updateAgent(organizationId, agentId, changes),
    touches,
  );
}

/** POST …/agents/:agentId/archive | unarchive; 409 while a group in use has the agent. */
export function useArchiveAgent(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ agentId, archived, reason }: { agentId: number; archived: boolean; reason?: string }) =>
      setArchived<AgentView>(apiPath('/api/orgs', organizationId, 'agents', agentId), archived, reason),
    touches,
  );
}
