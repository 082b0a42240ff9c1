import { z } from 'zod';
import { invitationAccept } from '@schema/auth';
import { NotFound } from '../errors';
import { startUserSession } from '../middleware/session';
import { acceptInvitation, findOpenInvitation } from '../services/invitations';
import { sessionView } from '../services/users';
import { parseBody, parseParams } from '../validation';
import { publicRoute } from './define-route';

const tokenParams = z.object({ token: z.string().min(20, 'The link is incomplete').max(200) });

export const invitationLinkRoutes = [
  publicRoute({
    method: 'get',
    path: '/invitations/:token',
    summary: 'What an invitation link offers (404 if unknown, expired, revoked or used)',
    handler: ({ req, res, deps }) => {
      const { token } = parseParams(tokenParams, req.params);
      const open = findOpenInvitation(deps.db, deps.clock, token);
      if (!open) throw new NotFound('This invitation link is unknown, expired, revoked or already used');
      res.json({
        email: open.invitation.email,
        organizationName: open.organization.name,
        role: open.invitation.role,
        expiresAt: open.invitation.expiresAt,
      });
    },
  }),

  publicRoute({
    method: 'post',
    path: '/invitations/:token/accept',
    summary: 'Accept an invitation: set name and password (or confirm the existing one) and sign in',
    rateLimits: ['resetPassword'],
    handler: async ({ req, res, deps }) => {
      const { token } = parseParams(tokenParams, req.params);
      const input = parseBody(invitationAccept, req.body);
      const user = await acceptInvitation(deps.db, deps.clock, token, input);
      const csrfToken = await startUserSession(req, user.id);
      res.json({ ...sessionView(deps.db, user), csrfToken });
    },
  }),
];
