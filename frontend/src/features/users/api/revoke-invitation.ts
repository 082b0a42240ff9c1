import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { invitationsKey, type Invitation } from './get-invitations';

/** DELETE /api/orgs/:orgId/invitations/:id → 204; the link stops working. */
export function revokeInvitation(organizationId: string, invitationId: Invitation['id']): Promise<void> {
  return api.delete(apiPath('/api/orgs', organizationId, 'invitations', invitationId));
}

export function useRevokeInvitation(organizationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: Invitation['id']) => revokeInvitation(organizationId, invitationId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationsKey(organizationId) }),
  });
}
