import type { OelEntryCreate } from '@schema/agents';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';
import type { OelEntryView } from './get-oel-entries';

/** POST /api/orgs/:orgId/oel-entries → 201. */
export function createOelEntry(organizationId: string, entry: OelEntryCreate): Promise<OelEntryView> {
  return api.post<OelEntryView>(`${apiPath('/api/orgs', organizationId)}/oel-entries`, entry);
}

export function useCreateOelEntry(organizationId: string) {
  return useOrganizationMutation(organizationId, (entry: OelEntryCreate) => createOelEntry(organizationId, entry), [orgKeys.oelEntries, orgKeys.agents]);
}
