import { z } from 'zod';
import { roles } from './permissions';

// Request shapes for sign-in, invitations and password resets, shared by the server and the forms.

export const email = z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(254);
/** Passwords: at least 10 characters (NIST SP 800-63B asks for ≥ 8; we ask a little more). */
export const password = z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters');

export const signIn = z.object({ email, password: z.string().min(1, 'Enter your password').max(200) });
export type SignIn = z.infer<typeof signIn>;

export const forgotPassword = z.object({ email });
export type ForgotPassword = z.infer<typeof forgotPassword>;

export const resetPassword = z.object({ token: z.string().min(20).max(200), password });
export type ResetPassword = z.infer<typeof resetPassword>;

export const invitationCreate = z.object({ email, role: z.enum(roles) });
export type InvitationCreate = z.infer<typeof invitationCreate>;

export const invitationAccept = z.object({
  name: z.string().trim().min(1, 'Enter your name').max(120),
  password,
});
export type InvitationAccept = z.infer<typeof invitationAccept>;

export const membershipUpdate = z
  .object({ role: z.enum(roles), active: z.boolean() })
  .partial()
  .refine((v) => v.role !== undefined || v.active !== undefined, 'Change the role or the active flag');
export type MembershipUpdate = z.infer<typeof membershipUpdate>;
