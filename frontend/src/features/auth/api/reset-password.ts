import { useMutation } from '@tanstack/react-query';
import type { ResetPassword } from '@schema/auth';
import { api } from '@frontend/lib/api-client';

/** POST /api/auth/reset-password → 204; 400 when the link is invalid, expired or used. */
export function resetPassword(input: ResetPassword): Promise<void> {
  return api.post<void>('/api/auth/reset-password', input);
}

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword });
}
