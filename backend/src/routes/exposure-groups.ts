import { z } from 'zod';
import { idParam } from '@schema/columns';
import { exposureGroupCreate, exposureGroupUpdate } from '@schema/exposure-groups';
import { exposureGroupListQuery } from '@schema/list-query';
import { sendCachedJson } from '../middleware/read-cache';
import { today } from '../services/dates';
import { createExposureGroup, getExposureGroup, listExposureGroups, updateExposureGroup } from '../services/exposure-groups';
import { groupOverview } from '../services/group-overview';
import { listGroupMembers } from '../services/workers';
import { parseBody, parseParams, parseQuery } from '../validation';
import { nameAccessOf } from './access';
import { archiveRoutes } from './archive-routes';
import { orgRoute } from './define-route';

const groupParams = z.object({ groupId: idParam });

export const exposureGroupRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups',
    permission: 'org:read',
    summary: 'Exposure groups: search, site and agent filters, sort, page, archived filter',
    handler: ({ req, res, deps, organization }) => {
      const query = parseQuery(exposureGroupListQuery, req.query);
      // Cached until the next write (middleware/read-cache.ts); member counts are as of today.
      sendCachedJson(req, res, deps.db, `exposure-groups:${organization.id}:${today(deps.clock)}:${JSON.stringify(query)}`, () =>
        listExposureGroups(deps.db, deps.clock, organization.id, query),
      );
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exposure-groups',
    permission: 'data:edit',
    summary: 'Create an exposure group (OEL typed in or picked from the OEL list)',
    handler: ({ req, res, deps, organization, user }) => {
      const group = parseBody(exposureGroupCreate, req.body);
      res.status(201).json(createExposureGroup(deps.db, deps.clock, { organizationId: organization.id, actor: user, group }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId',
    permission: 'org:read',
    summary: 'One exposure group with counts and its effective OEL',
    handler: ({ req, res, deps, organization }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.json(getExposureGroup(deps.db, deps.clock, organization.id, groupId));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/overview',
    permission: 'org:read',
    summary: 'The group page in one answer: definition, members, plan and progress, results with counts',
    handler: ({ req, res, deps, organization, membership }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.json(groupOverview(deps.db, deps.clock, organization.id, groupId, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/members',
    permission: 'org:read',
    summary: 'The group’s memberships over time, with each worker',
    handler: ({ req, res, deps, organization, membership }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.json(listGroupMembers(deps.db, deps.clock, organization.id, groupId, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/exposure-groups/:groupId',
    permission: 'data:edit',
    summary: 'Edit an exposure group (agent and OEL unit fixed once it has results)',
    handler: ({ req, res, deps, organization, user }) => {
      const { groupId } = parseParams(groupParams, req.params);
      const changes = parseBody(exposureGroupUpdate, req.body);
      res.json(updateExposureGroup(deps.db, deps.clock, { organizationId: organization.id, groupId, actor: user, changes }));
    },
  }),
  ...archiveRoutes({
    path: '/orgs/:orgId/exposure-groups/:groupId',
    param: 'groupId',
    summaries: { archive: 'Archive an exposure group (its results and plans stay)', unarchive: 'Bring an archived exposure group back' },
    apply: ({ deps, organization, user }, groupId, archived, reason) =>
      updateExposureGroup(deps.db, deps.clock, { organizationId: organization.id, groupId, actor: user, changes: { archived }, reason }),
  }),
];
