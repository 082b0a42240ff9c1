import { useMutation } from '@tanstack/react-query';
import type { ForgotPassword } from '@schema/auth';
import { api } from '@frontend/lib/api-client';

/** POST /api/auth/forgot-password → 202 whether or not the address has an account. */
export function forgotPassword(input: ForgotPassword): Promise<void> {
  return api.post<void>('/api/auth/forgot-password', input);
}

export function useForgotPassword() {
  return useMutation({ mutationFn: forgotPassword });
}
