import { auditEventListQuery } from '@schema/audit';
import { auditEventsCsv, auditFilterOptions, listAuditEvents } from '../services/audit-trail';
import { parseQuery } from '../validation';
import { orgRoute } from './define-route';

/** The audit trail of one organization (PRODUCT.md capability 10): admins and consultants read it. */
export const auditTrailRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit-events',
    permission: 'audit:read',
    summary: 'Audit events, newest first, filtered by person, entityType and from/to dates (UTC, inclusive), paged',
    handler: ({ req, res, deps, organization }) => {
      res.json(listAuditEvents(deps.db, organization.id, parseQuery(auditEventListQuery, req.query)));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit-events.csv',
    permission: 'audit:read',
    summary: 'The same audit events as CSV (same filters, no paging), safe to open in a spreadsheet',
    handler: ({ req, res, deps, organization }) => {
      const query = parseQuery(auditEventListQuery, req.query);
      const stamp = deps.clock.now().toISOString().slice(0, 10);
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="audit-trail-${organization.slug}-${stamp}.csv"`);
      res.send(auditEventsCsv(deps.db, organization.id, query));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit-filters',
    permission: 'audit:read',
    summary: 'The people and entity types that appear in the audit trail, for its filters',
    handler: ({ res, deps, organization }) => {
      res.json(auditFilterOptions(deps.db, organization.id));
    },
  }),
];
