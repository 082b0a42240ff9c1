import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignIn } from '@schema/auth';
import { api } from '@frontend/lib/api-client';
import { startSession, type SessionStart } from '../lib/start-session';

/** POST /api/auth/sign-in → the person, memberships and a fresh CSRF token. */
export function signIn(input: SignIn): Promise<SessionStart> {
  return api.post<SessionStart>('/api/auth/sign-in', input);
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (response) => startSession(queryClient, response),
  });
}
