import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OelEntry } from '@schema/agents';
import { api, apiPath } from '@frontend/lib/api-client';
import type { ExposureGroupView, GroupAgent, GroupMember, PlanSummary, PlanView, SamplingGuidance, ShiftResultView } from '@frontend/lib/api-types';
import { orgKeys } from '@frontend/lib/query-keys';

/** The group page in one answer (GET /api/orgs/:orgId/exposure-groups/:groupId/overview). */
export interface GroupOverview {
  group: ExposureGroupView;
  site: { id: number; name: string; archived: boolean };
  agent: GroupAgent;
  /** The OEL list entry the group's limit was copied from, if any. */
  oelEntry: Omit<OelEntry, 'organizationId'> | null;
  members: GroupMember[];
  /** The newest plan in use, with its picks. */
  currentPlan: PlanView | null;
  /** Every plan, archived ones too, newest first. */
  plans: PlanSummary[];
  results: ShiftResultView[];
  counts: { total: number; valid: number; void: number; nonDetect: number; detected: number };
  guidance: SamplingGuidance;
  cautions: string[];
}

export function getGroupOverview(organizationId: string, groupId: string, signal?: AbortSignal): Promise<GroupOverview> {
  return api.get<GroupOverview>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/overview`, { signal });
}

/**
 * Under the groups key, so any change to a group, its members, plans or results (each of those
 * mutations refreshes the groups key) brings the page up to date.
 */
export function groupOverviewQuery(organizationId: string, groupId: string) {
  return queryOptions({
    queryKey: [...orgKeys.exposureGroups(organizationId), 'overview', groupId] as const,
    queryFn: ({ signal }) => getGroupOverview(organizationId, groupId, signal),
  });
}

export function useGroupOverview(organizationId: string, groupId: string) {
  return useQuery(groupOverviewQuery(organizationId, groupId));
}
