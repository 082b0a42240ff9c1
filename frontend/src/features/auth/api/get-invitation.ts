import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationPreview } from '@schema/organizations';
import { api, apiPath } from '@frontend/lib/api-client';

/** What an invitation link shows before it is accepted (GET /api/invitations/:token). */
export type { InvitationPreview };

export function getInvitation(token: string, signal?: AbortSignal): Promise<InvitationPreview> {
  return api.get<InvitationPreview>(apiPath('/api/invitations', token), { signal });
}

export function invitationQuery(token: string) {
  return queryOptions({
    queryKey: ['invitations', 'by-token', token] as const,
    queryFn: ({ signal }) => getInvitation(token, signal),
    staleTime: Infinity,
  });
}

/** 404 (unknown, expired or used link) arrives as an ApiError with status 404. */
export function useInvitation(token: string) {
  return useQuery(invitationQuery(token));
}
