import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvitationCreate } from '@schema/auth';
import { api, apiPath } from '@frontend/lib/api-client';
import { invitationsKey, type Invitation } from './get-invitations';

/** POST /api/orgs/:orgId/invitations `{ email, role }` → 201; the server e-mails the link. */
export function createInvitation(organizationId: string, input: InvitationCreate): Promise<Invitation> {
  return api.post<Invitation>(`${apiPath('/api/orgs', organizationId)}/invitations`, input);
}

/** Sends an invitation; refreshes the invitation list and the outbox (the e-mail lands there). */
export function useCreateInvitation(organizationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvitationCreate) => createInvitation(organizationId, input),
    onSuccess: () =>
      Promise.all([queryClient.invalidateQueries({ queryKey: invitationsKey(organizationId) }), queryClient.invalidateQueries({ queryKey: ['outbox'] })]),
  });
}
