import { forgotPassword, resetPassword as resetPasswordBody, signIn } from '@schema/auth';
import { passwordResetEmail } from '../email/templates';
import { Unauthorized } from '../errors';
import { csrfTokenOf } from '../middleware/csrf';
import { endUserSession, startUserSession } from '../middleware/session';
import { verifyAgainstDecoy, verifyPassword } from '../services/passwords';
import { requestPasswordReset, resetPassword } from '../services/password-resets';
import { findUserByEmail, sessionView } from '../services/users';
import { parseBody } from '../validation';
import { publicRoute } from './define-route';

export const authRoutes = [
  publicRoute({
    method: 'get',
    path: '/auth/csrf',
    summary: 'The session’s CSRF token (creates the session if needed)',
    handler: ({ req, res }) => {
      res.json({ csrfToken: csrfTokenOf(req) });
    },
  }),

  publicRoute({
    method: 'post',
    path: '/auth/sign-in',
    summary: 'Sign in with e-mail and password',
    rateLimits: ['signInPerAddress', 'signIn'],
    handler: async ({ req, res, deps }) => {
      const input = parseBody(signIn, req.body);
      const user = findUserByEmail(deps.db, input.email);
      const valid = user ? await verifyPassword(user.passwordHash, input.password) : await verifyAgainstDecoy(input.password);
      if (!user || !valid) throw new Unauthorized('E-mail or password is wrong');
      const csrfToken = await startUserSession(req, user.id);
      res.json({ ...sessionView(deps.db, user), csrfToken });
    },
  }),

  publicRoute({
    method: 'post',
    path: '/auth/sign-out',
    summary: 'Sign out (ends the session)',
    handler: async ({ req, res }) => {
      await endUserSession(req, res);
      res.status(204).end();
    },
  }),

  publicRoute({
    method: 'post',
    path: '/auth/forgot-password',
    summary: 'E-mail a password reset link (answers 202 whether or not the account exists)',
    rateLimits: ['forgotPassword'],
    handler: ({ req, res, deps }) => {
      const { email } = parseBody(forgotPassword, req.body);
      const reset = requestPasswordReset(deps.db, deps.clock, email);
      if (reset) {
        const message = passwordResetEmail({
          to: reset.user.email,
          name: reset.user.name,
          link: `${deps.config.appUrl}/reset-password/${reset.token}`,
          expiresAt: reset.expiresAt,
        });
        // Not awaited: waiting for the mail server would make known addresses answer slower.
        deps.mailer.send(message).catch((error: unknown) => {
          req.log.error({ err: error }, 'the password reset e-mail could not be sent');
        });
      }
      res.status(202).json({ ok: true });
    },
  }),

  publicRoute({
    method: 'post',
    path: '/auth/reset-password',
    summary: 'Set a new password with a reset link token',
    rateLimits: ['resetPassword'],
    handler: async ({ req, res, deps }) => {
      const input = parseBody(resetPasswordBody, req.body);
      await resetPassword(deps.db, deps.clock, input.token, input.password);
      res.status(204).end();
    },
  }),
];
