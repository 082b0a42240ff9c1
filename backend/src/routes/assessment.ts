import { z } from 'zod';
import { assessmentQuery } from '@schema/assessment';
import { idParam } from '@schema/columns';
import { can } from '@schema/permissions';
import { Forbidden } from '../errors';
import { getGroupAssessment } from '../services/assessment';
import { parseParams, parseQuery } from '../validation';
import { orgRoute } from './define-route';

const groupParams = z.object({ groupId: idParam });

export const assessmentRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/assessment',
    permission: 'org:read',
    summary: 'A group’s assessment: classical and Bayesian views, between-worker analysis, sample planner (what-if: ?exclude=ids, ?prior=)',
    handler: async ({ req, res, deps, organization, membership }) => {
      const { groupId } = parseParams(groupParams, req.params);
      const query = parseQuery(assessmentQuery, req.query);
      // Anyone in the organization reads a group's assessment; trying other data or another prior is running
      // statistics (PRODUCT.md roles: hygienists, analysts and consultants).
      if ((query.exclude.length > 0 || query.prior !== 'reference') && !can(membership.role, 'stats:run')) {
        throw new Forbidden('Your role can read the assessment but not run what-if variations (leaving results out, another prior)');
      }
      res.json(
        await getGroupAssessment(deps.db, deps.clock, deps.assessment, {
          organizationId: organization.id,
          groupId,
          exclude: query.exclude,
          prior: query.prior,
        }),
      );
    },
  }),
];
