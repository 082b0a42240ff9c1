import { agentRoutes } from './agents';
import { assessmentRoutes } from './assessment';
import { authRoutes } from './auth';
import { dashboardRoutes } from './dashboard';
import { decisionRecordRoutes } from './decision-records';
import type { RouteDefinition } from './define-route';
import { exposureGroupRoutes } from './exposure-groups';
import { healthRoutes } from './health';
import { invitationLinkRoutes } from './invitation-links';
import { labImportRoutes } from './lab-imports';
import { meRoutes } from './me';
import { noiseLogRoutes } from './noise-logs';
import { memberRoutes } from './members';
import { organizationInvitationRoutes } from './organization-invitations';
import { organizationRoutes } from './organizations';
import { outboxRoutes } from './outbox';
import { samplingPlanRoutes } from './sampling-plans';
import { shiftResultRoutes } from './shift-results';
import { siteRoutes } from './sites';
import { workerRoutes } from './workers';

/**
 * Every API route, in one list (the route inventory). Add a new resource's routes here;
 * tests/api/route-inventory.test.ts walks this list.
 */
export const apiRoutes: readonly RouteDefinition[] = [
  ...healthRoutes,
  ...authRoutes,
  ...meRoutes,
  ...invitationLinkRoutes,
  ...outboxRoutes,
  ...organizationRoutes,
  ...memberRoutes,
  ...organizationInvitationRoutes,
  ...siteRoutes,
  ...agentRoutes,
  ...exposureGroupRoutes,
  ...workerRoutes,
  ...samplingPlanRoutes,
  ...shiftResultRoutes,
  ...labImportRoutes,
  ...noiseLogRoutes,
  ...assessmentRoutes,
  ...decisionRecordRoutes,
  ...dashboardRoutes,
];
