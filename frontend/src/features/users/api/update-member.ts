import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MembershipUpdate } from '@schema/auth';
import { api, apiPath } from '@frontend/lib/api-client';
import { membersKey, type Member } from './get-members';

/** PATCH /api/orgs/:orgId/members/:membershipId `{ role?, active? }`; 409 for the last active admin. */
export function updateMember(organizationId: string, membershipId: Member['id'], input: MembershipUpdate): Promise<Member> {
  return api.patch<Member>(`${apiPath('/api/orgs', organizationId, 'members', membershipId)}`, input);
}

/**
 * Changes a role or the active flag. Invalidates the member list, the organization summary
 * (its member count) and /api/me (the change may be one's own role).
 */
export function useUpdateMember(organizationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ membershipId, input }: { membershipId: Member['id']; input: MembershipUpdate }) => updateMember(organizationId, membershipId, input),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: membersKey(organizationId) }),
        queryClient.invalidateQueries({ queryKey: ['orgs', organizationId, 'summary'] }),
        queryClient.invalidateQueries({ queryKey: ['me'] }),
      ]),
  });
}
