import type { GroupMembershipCreate } from '@schema/workers';
import { api, apiPath } from '@frontend/lib/api-client';
import type { WorkerMembership } from '@frontend/lib/api-types';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/** What a membership change can show up in: workers, groups (members, counts, plans' pools). */
export const membershipTouches = [orgKeys.workers, orgKeys.exposureGroups, orgKeys.samplingPlans];

/** POST /api/orgs/:orgId/group-memberships → 201; 409 when it overlaps another period of the same worker and group. */
export function createGroupMembership(organizationId: string, membership: GroupMembershipCreate): Promise<WorkerMembership> {
  return api.post<WorkerMembership>(`${apiPath('/api/orgs', organizationId)}/group-memberships`, membership);
}

export function useCreateGroupMembership(organizationId: string) {
  return useOrganizationMutation(organizationId, (membership: GroupMembershipCreate) => createGroupMembership(organizationId, membership), membershipTouches);
}
