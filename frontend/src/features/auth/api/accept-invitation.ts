import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvitationAccept } from '@schema/auth';
import { api, apiPath } from '@frontend/lib/api-client';
import { startSession, type SessionStart } from '../lib/start-session';

/** POST /api/invitations/:token/accept → signs the invitee in. */
export function acceptInvitation(token: string, input: InvitationAccept): Promise<SessionStart> {
  return api.post<SessionStart>(`${apiPath('/api/invitations', token)}/accept`, input);
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvitationAccept) => acceptInvitation(token, input),
    onSuccess: (response) => startSession(queryClient, response),
  });
}
