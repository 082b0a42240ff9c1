import type { OelEntryUpdate } from '@schema/agents';
import { api, apiPath } from '@frontend/lib/api-client';
import { setArchived, useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';
import type { OelEntryView } from './get-oel-entries';

const touches = [orgKeys.oelEntries, orgKeys.agents];

/** PATCH /api/orgs/:orgId/oel-entries/:entryId (groups keep the copy of the limit they took). */
export function updateOelEntry(organizationId: string, entryId: number, changes: OelEntryUpdate): Promise<OelEntryView> {
  return api.patch<OelEntryView>(apiPath('/api/orgs', organizationId, 'oel-entries', entryId), changes);
}

export function useUpdateOelEntry(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ entryId, changes }: { entryId: number; changes: OelEntryUpdate }) => updateOelEntry(organizationId, entryId, changes),
    touches,
  );
}

/** POST …/oel-entries/:entryId/archive | unarchive. */
export function useArchiveOelEntry(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ entryId, archived, reason }: { entryId: number; archived: boolean; reason?: string }) =>
      setArchived<OelEntryView>(apiPath('/api/orgs', organizationId, 'oel-entries', entryId), archived, reason),
    touches,
  );
}
