import type { QueryClient } from '@tanstack/react-query';
import { rememberCsrfToken } from '@frontend/lib/api-client';
import { forgetEverythingButMe, meKey, type Me } from '../api/get-me';

/** What sign-in and invitation acceptance answer: the session's person and a new CSRF token. */
export interface SessionStart extends Me {
  csrfToken: string;
}

/**
 * After sign-in (or accepting an invitation, which signs in): keep the rotated CSRF token,
 * drop every cached answer that belonged to whoever used this tab before, and seed /api/me.
 */
export function startSession(queryClient: QueryClient, response: SessionStart): void {
  rememberCsrfToken(response.csrfToken);
  forgetEverythingButMe(queryClient);
  const me: Me = { user: response.user, memberships: response.memberships };
  queryClient.setQueryData(meKey, me);
}
