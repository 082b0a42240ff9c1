import { z } from 'zod';
import { password } from '@schema/auth';

/**
 * A new password (the server's rule) entered twice. The second entry is a browser-only check
 * — a typo in a new password locks the person out — so it is added here and never sent.
 */
export const newPasswordFields = {
  password,
  confirmPassword: z.string().min(1, 'Enter the password again'),
};

/** Refinement for a schema built from `newPasswordFields`. */
export const passwordsMatch: [(values: { password: string; confirmPassword: string }) => boolean, { path: string[]; message: string }] = [
  (values) => values.password === values.confirmPassword,
  { path: ['confirmPassword'], message: 'The two passwords are not the same' },
];
