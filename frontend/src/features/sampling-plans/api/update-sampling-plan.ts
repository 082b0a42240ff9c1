import type { SamplingPlanRedraw, SamplingPlanUpdate } from '@schema/sampling-plans';
import { api, apiPath } from '@frontend/lib/api-client';
import type { PlanView } from '@frontend/lib/api-types';
import { setArchived, useOrganizationMutation } from '@frontend/lib/org-mutation';
import { planTouches } from './create-sampling-plan';

/**
 * PATCH /api/orgs/:orgId/sampling-plans/:planId. A new target, window or weekend choice redraws
 * with the same seed (a new draw); title and notes do not.
 */
export function updateSamplingPlan(organizationId: string, planId: number, changes: SamplingPlanUpdate): Promise<PlanView> {
  return api.patch<PlanView>(apiPath('/api/orgs', organizationId, 'sampling-plans', planId), changes);
}

export function useUpdateSamplingPlan(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ planId, changes }: { planId: number; changes: SamplingPlanUpdate }) => updateSamplingPlan(organizationId, planId, changes),
    planTouches,
  );
}

/** POST …/sampling-plans/:planId/redraw `{ seed?, reason? }`: new picks from a new seed (audited with both seeds). */
export function redrawSamplingPlan(organizationId: string, planId: number, redraw: SamplingPlanRedraw): Promise<PlanView> {
  return api.post<PlanView>(`${apiPath('/api/orgs', organizationId, 'sampling-plans', planId)}/redraw`, redraw);
}

export function useRedrawSamplingPlan(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ planId, redraw }: { planId: number; redraw: SamplingPlanRedraw }) => redrawSamplingPlan(organizationId, planId, redraw),
    planTouches,
  );
}

/** POST …/sampling-plans/:planId/archive | unarchive. */
export function useArchiveSamplingPlan(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ planId, archived, reason }: { planId: number; archived: boolean; reason?: string }) =>
      setArchived<PlanView>(apiPath('/api/orgs', organizationId, 'sampling-plans', planId), archived, reason),
    planTouches,
  );
}
