import { myOverview, organizationDashboard } from '../services/dashboard';
import { orgRoute, userRoute } from './define-route';

/** Dashboards (issue 7): the organization overview and a person's overview across their organizations. */
export const dashboardRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/dashboard',
    permission: 'org:read',
    summary: 'Organization overview: site × category, unacceptable and uncertain groups, review dates due, sampling progress, recent decisions',
    handler: ({ res, deps, organization }) => {
      res.json(organizationDashboard(deps.db, deps.clock, organization.id));
    },
  }),
  userRoute({
    method: 'get',
    path: '/me/overview',
    summary: 'The signed-in person’s overview across every organization they are an active member of',
    handler: ({ res, deps, user }) => {
      res.json(myOverview(deps.db, deps.clock, user.id));
    },
  }),
];
