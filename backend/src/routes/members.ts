import { z } from 'zod';
import { membershipUpdate } from '@schema/auth';
import { idParam } from '@schema/columns';
import { listMembers, updateMember } from '../services/members';
import { parseBody, parseParams } from '../validation';
import { orgRoute } from './define-route';

const memberParams = z.object({ membershipId: idParam });

export const memberRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/members',
    permission: 'users:manage',
    summary: 'Everyone with a membership, active or not',
    handler: ({ res, deps, organization }) => {
      res.json(listMembers(deps.db, organization.id));
    },
  }),

  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/members/:membershipId',
    permission: 'users:manage',
    summary: 'Change a member’s role or deactivate/reactivate them (the last active admin stays)',
    handler: ({ req, res, deps, organization, user }) => {
      const { membershipId } = parseParams(memberParams, { membershipId: req.params.membershipId });
      const changes = parseBody(membershipUpdate, req.body);
      res.json(updateMember(deps.db, deps.clock, { organizationId: organization.id, membershipId, actor: user, changes }));
    },
  }),
];
