import { z } from 'zod';
import { idParam } from '@schema/columns';
import { workerListQuery } from '@schema/list-query';
import { groupMembershipCreate, groupMembershipEnd, groupMembershipUpdate, workerCreate, workerUpdate } from '@schema/workers';
import { createGroupMembership, createWorker, getWorker, listWorkers, updateGroupMembership, updateWorker } from '../services/workers';
import { parseBody, parseParams, parseQuery } from '../validation';
import { nameAccessOf } from './access';
import { archiveRoutes } from './archive-routes';
import { orgRoute } from './define-route';

const workerParams = z.object({ workerId: idParam });
const membershipParams = z.object({ membershipId: idParam });

export const workerRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/workers',
    permission: 'org:read',
    summary: 'Workers (names only with workerNames:read): search, group and job-title filters, sort, page',
    handler: ({ req, res, deps, organization, membership }) => {
      res.json(listWorkers(deps.db, deps.clock, organization.id, parseQuery(workerListQuery, req.query), nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/workers',
    permission: 'data:edit',
    summary: 'Create a worker (code unique in the organization; name optional)',
    handler: ({ req, res, deps, organization, user, membership }) => {
      const worker = parseBody(workerCreate, req.body);
      res.status(201).json(createWorker(deps.db, deps.clock, { organizationId: organization.id, actor: user, worker }, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/workers/:workerId',
    permission: 'org:read',
    summary: 'One worker with their group memberships over time',
    handler: ({ req, res, deps, organization, membership }) => {
      const { workerId } = parseParams(workerParams, req.params);
      res.json(getWorker(deps.db, deps.clock, organization.id, workerId, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/workers/:workerId',
    permission: 'data:edit',
    summary: 'Edit a worker',
    handler: ({ req, res, deps, organization, user, membership }) => {
      const { workerId } = parseParams(workerParams, req.params);
      const changes = parseBody(workerUpdate, req.body);
      res.json(updateWorker(deps.db, deps.clock, { organizationId: organization.id, workerId, actor: user, changes }, nameAccessOf(membership)));
    },
  }),
  ...archiveRoutes({
    path: '/orgs/:orgId/workers/:workerId',
    param: 'workerId',
    summaries: { archive: 'Archive a worker (left out of new plan draws)', unarchive: 'Bring an archived worker back' },
    apply: ({ deps, organization, user, membership }, workerId, archived, reason) =>
      updateWorker(deps.db, deps.clock, { organizationId: organization.id, workerId, actor: user, changes: { archived }, reason }, nameAccessOf(membership)),
  }),

  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/group-memberships',
    permission: 'data:edit',
    summary: 'Add a worker to a group from a date (to a date, or open-ended); no overlapping periods',
    handler: ({ req, res, deps, organization, user }) => {
      const membership = parseBody(groupMembershipCreate, req.body);
      res.status(201).json(createGroupMembership(deps.db, deps.clock, { organizationId: organization.id, actor: user, membership }));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/group-memberships/:membershipId',
    permission: 'data:edit',
    summary: 'Change a membership’s dates',
    handler: ({ req, res, deps, organization, user }) => {
      const { membershipId } = parseParams(membershipParams, req.params);
      const changes = parseBody(groupMembershipUpdate, req.body);
      res.json(updateGroupMembership(deps.db, deps.clock, { organizationId: organization.id, membershipId, actor: user, changes }));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/group-memberships/:membershipId/end',
    permission: 'data:edit',
    summary: 'End a membership on a date (the last day in the group)',
    handler: ({ req, res, deps, organization, user }) => {
      const { membershipId } = parseParams(membershipParams, req.params);
      const { toDate } = parseBody(groupMembershipEnd, req.body);
      res.json(updateGroupMembership(deps.db, deps.clock, { organizationId: organization.id, membershipId, actor: user, changes: { toDate } }));
    },
  }),
];
