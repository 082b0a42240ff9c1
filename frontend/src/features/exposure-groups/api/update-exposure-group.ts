import type { ExposureGroupUpdate } from '@schema/exposure-groups';
import { api, apiPath } from '@frontend/lib/api-client';
import type { ExposureGroupView } from '@frontend/lib/api-types';
import { setArchived, useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

const touches = [orgKeys.exposureGroups, orgKeys.sites, orgKeys.agents, orgKeys.workers, orgKeys.summary];

/** PATCH /api/orgs/:orgId/exposure-groups/:groupId; 409 when the agent or unit changes on a group with results. */
export function updateExposureGroup(organizationId: string, groupId: number, changes: ExposureGroupUpdate): Promise<ExposureGroupView> {
  return api.patch<ExposureGroupView>(apiPath('/api/orgs', organizationId, 'exposure-groups', groupId), changes);
}

export function useUpdateExposureGroup(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ groupId, changes }: { groupId: number; changes: ExposureGroupUpdate }) => updateExposureGroup(organizationId, groupId, changes),
    touches,
  );
}

/** POST …/exposure-groups/:groupId/archive | unarchive (results and plans stay). */
export function useArchiveExposureGroup(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ groupId, archived, reason }: { groupId: number; archived: boolean; reason?: string }) =>
      setArchived<ExposureGroupView>(apiPath('/api/orgs', organizationId, 'exposure-groups', groupId), archived, reason),
    touches,
  );
}
