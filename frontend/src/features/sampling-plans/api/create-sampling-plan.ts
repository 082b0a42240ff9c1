import type { SamplingPlanCreate } from '@schema/sampling-plans';
import { api, apiPath } from '@frontend/lib/api-client';
import type { PlanView } from '@frontend/lib/api-types';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/** A plan change shows on the group page (its overview sits under the groups key). */
export const planTouches = [orgKeys.samplingPlans, orgKeys.exposureGroups];

/** POST /api/orgs/:orgId/exposure-groups/:groupId/sampling-plans → 201 with the drawn picks. */
export function createSamplingPlan(organizationId: string, groupId: number, plan: SamplingPlanCreate): Promise<PlanView> {
  return api.post<PlanView>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/sampling-plans`, plan);
}

export function useCreateSamplingPlan(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ groupId, plan }: { groupId: number; plan: SamplingPlanCreate }) => createSamplingPlan(organizationId, groupId, plan),
    planTouches,
  );
}
