import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, forgetCsrfToken } from '@frontend/lib/api-client';
import { forgetEverythingButMe, meKey } from './get-me';

/** POST /api/auth/sign-out → 204. */
export function signOut(): Promise<void> {
  return api.post<void>('/api/auth/sign-out');
}

/** Signs out, forgets the CSRF token (the server rotated it) and every cached answer. */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => {
      forgetCsrfToken();
      forgetEverythingButMe(queryClient);
      queryClient.setQueryData(meKey, null);
    },
  });
}
