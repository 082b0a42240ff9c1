import { z } from 'zod';
import { idParam } from '@schema/columns';
import { archivedFilter } from '@schema/list-query';
import { samplingGuidance, samplingPlanCreate, samplingPlanRedraw, samplingPlanUpdate } from '@schema/sampling-plans';
import { createSamplingPlan, fieldSheet, getSamplingPlan, listGroupPlans, redrawSamplingPlan, updateSamplingPlan } from '../services/sampling-plans';
import { parseBody, parseParams, parseQuery } from '../validation';
import { nameAccessOf } from './access';
import { archiveRoutes } from './archive-routes';
import { orgRoute } from './define-route';

const groupParams = z.object({ groupId: idParam });
const planParams = z.object({ planId: idParam });
const planListQuery = z.object({ archived: archivedFilter });

export const samplingPlanRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/sampling-guidance',
    permission: 'org:read',
    summary: 'Why plans ask for 6 shifts by default, with sources',
    handler: ({ res }) => {
      res.json(samplingGuidance);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/sampling-plans',
    permission: 'org:read',
    summary: 'A group’s sampling plans with progress, newest first',
    handler: ({ req, res, deps, organization, membership }) => {
      const { groupId } = parseParams(groupParams, req.params);
      const { archived } = parseQuery(planListQuery, req.query);
      res.json(listGroupPlans(deps.db, organization.id, groupId, archived, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exposure-groups/:groupId/sampling-plans',
    permission: 'data:edit',
    summary: 'Create a sampling plan and draw its worker-shifts from the seed',
    handler: ({ req, res, deps, organization, user, membership }) => {
      const { groupId } = parseParams(groupParams, req.params);
      const plan = parseBody(samplingPlanCreate, req.body);
      res.status(201).json(createSamplingPlan(deps.db, deps.clock, { organizationId: organization.id, groupId, actor: user, plan }, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/sampling-plans/:planId',
    permission: 'org:read',
    summary: 'A sampling plan with its picks and progress',
    handler: ({ req, res, deps, organization, membership }) => {
      const { planId } = parseParams(planParams, req.params);
      res.json(getSamplingPlan(deps.db, organization.id, planId, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/sampling-plans/:planId',
    permission: 'data:edit',
    summary: 'Edit a plan (a new target, window or weekend choice redraws with the same seed)',
    handler: ({ req, res, deps, organization, user, membership }) => {
      const { planId } = parseParams(planParams, req.params);
      const changes = parseBody(samplingPlanUpdate, req.body);
      res.json(updateSamplingPlan(deps.db, deps.clock, { organizationId: organization.id, planId, actor: user, changes }, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sampling-plans/:planId/redraw',
    permission: 'data:edit',
    summary: 'Redraw a plan’s picks with a new seed (audited)',
    handler: ({ req, res, deps, organization, user, membership }) => {
      const { planId } = parseParams(planParams, req.params);
      const redraw = parseBody(samplingPlanRedraw, req.body);
      res.json(redrawSamplingPlan(deps.db, deps.clock, { organizationId: organization.id, planId, actor: user, redraw }, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/sampling-plans/:planId/field-sheet',
    permission: 'org:read',
    summary: 'What the printable field sheet shows',
    handler: ({ req, res, deps, organization, membership }) => {
      const { planId } = parseParams(planParams, req.params);
      res.json(fieldSheet(deps.db, deps.clock, organization.id, planId, nameAccessOf(membership)));
    },
  }),
  ...archiveRoutes({
    path: '/orgs/:orgId/sampling-plans/:planId',
    param: 'planId',
    summaries: { archive: 'Archive a sampling plan', unarchive: 'Bring an archived sampling plan back' },
    apply: ({ deps, organization, user, membership }, planId, archived, reason) =>
      updateSamplingPlan(
        deps.db,
        deps.clock,
        { organizationId: organization.id, planId, actor: user, changes: { archived }, reason },
        nameAccessOf(membership),
      ),
  }),
];
