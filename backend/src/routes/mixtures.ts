import { z } from 'zod';
import { idParam } from '@schema/columns';
import { mixtureCreate, mixtureUpdate } from '@schema/mixtures';
import { computeMixtureResults, createMixture, getMixture, listMixtures, planMixtureResults, updateMixture } from '../services/mixtures';
import { parseBody, parseParams } from '../validation';
import { archiveRoutes } from './archive-routes';
import { orgRoute } from './define-route';

const mixtureParams = z.object({ mixtureId: idParam });
const groupParams = z.object({ groupId: idParam });

export const mixtureRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/mixtures',
    permission: 'org:read',
    summary: 'Mixtures of agents with similar effects and their components',
    handler: ({ res, deps, organization }) => {
      res.json(listMixtures(deps.db, organization.id));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/mixtures',
    permission: 'data:edit',
    summary: 'Define a mixture (name and at least 2 chemical components)',
    handler: ({ req, res, deps, organization, user }) => {
      const mixture = parseBody(mixtureCreate, req.body);
      res.status(201).json(createMixture(deps.db, deps.clock, { organizationId: organization.id, actor: user, mixture }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/mixtures/:mixtureId',
    permission: 'org:read',
    summary: 'One mixture',
    handler: ({ req, res, deps, organization }) => {
      const { mixtureId } = parseParams(mixtureParams, req.params);
      res.json(getMixture(deps.db, organization.id, mixtureId));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/mixtures/:mixtureId',
    permission: 'data:edit',
    summary: 'Edit a mixture (components only while it has no valid results)',
    handler: ({ req, res, deps, organization, user }) => {
      const { mixtureId } = parseParams(mixtureParams, req.params);
      const changes = parseBody(mixtureUpdate, req.body);
      res.json(updateMixture(deps.db, deps.clock, { organizationId: organization.id, mixtureId, actor: user, changes }));
    },
  }),
  ...archiveRoutes({
    path: '/orgs/:orgId/mixtures/:mixtureId',
    param: 'mixtureId',
    summaries: { archive: 'Archive a mixture (no group in use has it)', unarchive: 'Bring an archived mixture back' },
    apply: ({ deps, organization, user }, mixtureId, archived, reason) =>
      updateMixture(deps.db, deps.clock, { organizationId: organization.id, mixtureId, actor: user, changes: { archived }, reason }),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/mixture-preview',
    permission: 'org:read',
    summary: 'What computing the mixture index would write, skip (with missing components) and replace',
    handler: ({ req, res, deps, organization }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.json(planMixtureResults(deps.db, organization.id, groupId));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exposure-groups/:groupId/mixture-results',
    permission: 'data:edit',
    summary: 'Compute the mixture group’s shift results Σ Cᵢ/OELᵢ (earlier ones voided as "recomputed"), in one transaction',
    handler: ({ req, res, deps, organization, user }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.status(201).json(computeMixtureResults(deps.db, deps.clock, { organizationId: organization.id, groupId, actor: user }));
    },
  }),
];
