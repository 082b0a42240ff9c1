import { organizationSummary } from '../services/organizations';
import { orgRoute } from './define-route';

export const organizationRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/summary',
    permission: 'org:read',
    summary: 'The organization with counts of sites, groups, workers, agents and members',
    handler: ({ res, deps, organization }) => {
      res.json(organizationSummary(deps.db, organization));
    },
  }),
];
