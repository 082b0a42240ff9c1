import { agentRoutes } from './agents';
import { assessmentRoutes } from './assessment';
import { auditTrailRoutes } from './audit-trail';
import { authRoutes } from './auth';
import { dashboardRoutes } from './dashboard';
import { decisionRecordRoutes } from './decision-records';
import { evidencePackRoutes } from './evidence-packs';
import type { RouteDefinition } from './define-route';
import { exposureGroupRoutes } from './exposure-groups';
import { healthRoutes } from './health';
import { hearingProtectorRoutes } from './hearing-protectors';
import { invitationLinkRoutes } from './invitation-links';
import { labImportRoutes } from './lab-imports';
import { meRoutes } from './me';
import { noiseEstimateRoutes } from './noise-estimates';
import { noiseLogRoutes } from './noise-logs';
import { notificationPreferenceRoutes } from './notification-preferences';
import { memberRoutes } from './members';
import { mixtureRoutes } from './mixtures';
import { organizationInvitationRoutes } from './organization-invitations';
import { organizationRoutes } from './organizations';
import { outboxRoutes } from './outbox';
import { samplingPlanRoutes } from './sampling-plans';
import { shiftResultRoutes } from './shift-results';
import { siteRoutes } from './sites';
import { workerRoutes } from './workers';
import { workerLetterRoutes } from './worker-letters';

/**
 * Every API route, in one list (the route inventory). Add a new resource's routes here;
 * tests/api/route-inventory.test.ts walks this list.
 */
export const apiRoutes: readonly RouteDefinition[] = [
  ...healthRoutes,
  ...authRoutes,
  ...meRoutes,
  ...notificationPreferenceRoutes,
  ...invitationLinkRoutes,
  ...outboxRoutes,
  ...organizationRoutes,
  ...memberRoutes,
  ...organizationInvitationRoutes,
  ...siteRoutes,
  ...agentRoutes,
  ...exposureGroupRoutes,
  ...workerRoutes,
  ...workerLetterRoutes,
  ...samplingPlanRoutes,
  ...shiftResultRoutes,
  ...labImportRoutes,
  ...noiseLogRoutes,
  ...noiseEstimateRoutes,
  ...assessmentRoutes,
  ...decisionRecordRoutes,
  ...evidencePackRoutes,
  ...dashboardRoutes,
  ...auditTrailRoutes,
  ...hearingProtectorRoutes,
  ...mixtureRoutes,
];
