import type { ExposureGroupCreate } from '@schema/exposure-groups';
import { api, apiPath } from '@frontend/lib/api-client';
import type { ExposureGroupView } from '@frontend/lib/api-types';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/** POST /api/orgs/:orgId/exposure-groups → 201; 409 when the site already has a group of that name. */
export function createExposureGroup(organizationId: string, group: ExposureGroupCreate): Promise<ExposureGroupView> {
  return api.post<ExposureGroupView>(`${apiPath('/api/orgs', organizationId)}/exposure-groups`, group);
}

export function useCreateExposureGroup(organizationId: string) {
  return useOrganizationMutation(organizationId, (group: ExposureGroupCreate) => createExposureGroup(organizationId, group), [
    orgKeys.exposureGroups,
    orgKeys.sites,
    orgKeys.agents,
    orgKeys.summary,
  ]);
}
