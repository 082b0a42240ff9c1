import { z } from 'zod';
import { idParam } from '@schema/columns';
import { noiseEstimateArchive, noiseEstimateInput } from '@schema/noise-estimates';
import {
  createNoiseEstimate,
  getNoiseEstimate,
  listGroupEstimates,
  listNoiseLogDays,
  replaceNoiseEstimate,
  setNoiseEstimateArchived,
} from '../services/noise-estimates';
import { parseBody, parseParams, parseQuery } from '../validation';
import { orgRoute } from './define-route';

const groupParams = z.object({ groupId: idParam });
const estimateParams = z.object({ estimateId: idParam });
const listQuery = z.object({ archived: z.enum(['include', 'exclude']).default('exclude') });

/** ISO 9612:2009 noise estimates of an exposure group (docs/api/noise-estimates.md). */
export const noiseEstimateRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/noise-estimates',
    permission: 'org:read',
    summary: 'A noise group’s ISO 9612 estimates with LEX,8h, U and the comparison with the values in force, newest first',
    handler: ({ req, res, deps, organization }) => {
      const { groupId } = parseParams(groupParams, req.params);
      const { archived } = parseQuery(listQuery, req.query);
      res.json(listGroupEstimates(deps.db, organization.id, groupId, archived === 'include'));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exposure-groups/:groupId/noise-estimates',
    permission: 'data:edit',
    summary: 'Create an ISO 9612 estimate (task-based, job-based or full-day) with its tasks and measurements',
    handler: ({ req, res, deps, organization, user }) => {
      const { groupId } = parseParams(groupParams, req.params);
      const estimate = parseBody(noiseEstimateInput, req.body);
      res.status(201).json(createNoiseEstimate(deps.db, deps.clock, { organizationId: organization.id, groupId, actor: user, estimate }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/noise-log-days',
    permission: 'org:read',
    summary: 'The group’s accepted noise-log days with their reviewed LAeq, to start a full-day estimate from',
    handler: ({ req, res, deps, organization }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.json(listNoiseLogDays(deps.db, organization.id, groupId));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/noise-estimates/:estimateId',
    permission: 'org:read',
    summary: 'One ISO 9612 estimate with its inputs, uncertainty budget and comparison',
    handler: ({ req, res, deps, organization }) => {
      const { estimateId } = parseParams(estimateParams, req.params);
      res.json(getNoiseEstimate(deps.db, organization.id, estimateId));
    },
  }),
  orgRoute({
    method: 'put',
    path: '/orgs/:orgId/noise-estimates/:estimateId',
    permission: 'data:edit',
    summary: 'Replace an ISO 9612 estimate’s inputs, tasks and measurements (audited with before and after)',
    handler: ({ req, res, deps, organization, user }) => {
      const { estimateId } = parseParams(estimateParams, req.params);
      const estimate = parseBody(noiseEstimateInput, req.body);
      res.json(replaceNoiseEstimate(deps.db, deps.clock, { organizationId: organization.id, estimateId, actor: user, estimate }));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/noise-estimates/:estimateId/archive',
    permission: 'data:edit',
    summary: 'Archive or restore an ISO 9612 estimate (audited)',
    handler: ({ req, res, deps, organization, user }) => {
      const { estimateId } = parseParams(estimateParams, req.params);
      const { archived } = parseBody(noiseEstimateArchive, req.body);
      res.json(setNoiseEstimateArchived(deps.db, deps.clock, { organizationId: organization.id, estimateId, actor: user, archived }));
    },
  }),
];
