import { z } from 'zod';
import { invitationCreate } from '@schema/auth';
import { idParam } from '@schema/columns';
import { invitationEmail } from '../email/templates';
import { createInvitation, listInvitations, revokeInvitation, viewOf } from '../services/invitations';
import { parseBody, parseParams } from '../validation';
import { orgRoute } from './define-route';

const invitationParams = z.object({ invitationId: idParam });

export const organizationInvitationRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/invitations',
    permission: 'users:manage',
    summary: 'Invitations (pending, accepted, expired), newest first',
    handler: ({ res, deps, organization }) => {
      res.json(listInvitations(deps.db, deps.clock, organization.id));
    },
  }),

  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/invitations',
    permission: 'users:manage',
    summary: 'Invite someone by e-mail with a role (link valid 7 days, single use)',
    handler: async ({ req, res, deps, organization, user }) => {
      const input = parseBody(invitationCreate, req.body);
      const { invitation, token } = createInvitation(deps.db, deps.clock, { ...input, organization, invitedBy: user });
      await deps.mailer.send(
        invitationEmail({
          to: invitation.email,
          organizationName: organization.name,
          inviterName: user.name,
          role: invitation.role,
          link: `${deps.config.appUrl}/accept-invitation/${token}`,
          expiresAt: new Date(invitation.expiresAt),
        }),
      );
      res.status(201).json(viewOf(invitation, user.name, deps.clock.now()));
    },
  }),

  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/invitations/:invitationId',
    permission: 'users:manage',
    summary: 'Revoke a pending invitation',
    handler: ({ req, res, deps, organization, user }) => {
      const { invitationId } = parseParams(invitationParams, { invitationId: req.params.invitationId });
      revokeInvitation(deps.db, deps.clock, { organizationId: organization.id, invitationId, actor: user });
      res.status(204).end();
    },
  }),
];
