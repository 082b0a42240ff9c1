import { sendCachedJson } from '../middleware/read-cache';
import { myOverview, organizationDashboard } from '../services/dashboard';
import { today } from '../services/dates';
import { orgRoute, userRoute } from './define-route';

/** Dashboards (issue 7): the organization overview and a person's overview across their organizations. */
export const dashboardRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/dashboard',
    permission: 'org:read',
    summary: 'Organization overview: site × category, unacceptable and uncertain groups, review dates due, sampling progress, recent decisions',
    handler: ({ req, res, deps, organization }) => {
      // Cached until the next write (middleware/read-cache.ts); the date decides which reviews are due.
      sendCachedJson(req, res, deps.db, `dashboard:${organization.id}:${today(deps.clock)}`, () => organizationDashboard(deps.db, deps.clock, organization.id));
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
