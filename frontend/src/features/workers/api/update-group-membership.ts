import type { GroupMembershipUpdate } from '@schema/workers';
import { api, apiPath } from '@frontend/lib/api-client';
import type { WorkerMembership } from '@frontend/lib/api-types';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { membershipTouches } from './create-group-membership';

/**
 * PATCH /api/orgs/:orgId/group-memberships/:membershipId `{ fromDate?, toDate? }` — change the
 * dates or end the period (toDate). 409 when it would overlap another period, or leave a valid
 * result of the worker in the group outside every period.
 */
export function updateGroupMembership(organizationId: string, membershipId: number, changes: GroupMembershipUpdate): Promise<WorkerMembership> {
  return api.patch<WorkerMembership>(apiPath('/api/orgs', organizationId, 'group-memberships', membershipId), changes);
}

export function useUpdateGroupMembership(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ membershipId, changes }: { membershipId: number; changes: GroupMembershipUpdate }) => updateGroupMembership(organizationId, membershipId, changes),
    membershipTouches,
  );
}
