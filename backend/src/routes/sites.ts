import { z } from 'zod';
import { idParam } from '@schema/columns';
import { siteListQuery } from '@schema/list-query';
import { siteCreate, siteUpdate } from '@schema/sites';
import { createSite, getSite, listSites, updateSite } from '../services/sites';
import { parseBody, parseParams, parseQuery } from '../validation';
import { archiveRoutes } from './archive-routes';
import { orgRoute } from './define-route';

const siteParams = z.object({ siteId: idParam });

export const siteRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/sites',
    permission: 'org:read',
    summary: 'Sites: search (q), sort, page, archived filter',
    handler: ({ req, res, deps, organization }) => {
      const query = parseQuery(siteListQuery, req.query);
      res.json(listSites(deps.db, organization.id, query));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sites',
    permission: 'data:edit',
    summary: 'Create a site',
    handler: ({ req, res, deps, organization, user }) => {
      const site = parseBody(siteCreate, req.body);
      res.status(201).json(createSite(deps.db, deps.clock, { organizationId: organization.id, actor: user, site }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/sites/:siteId',
    permission: 'org:read',
    summary: 'One site',
    handler: ({ req, res, deps, organization }) => {
      const { siteId } = parseParams(siteParams, req.params);
      res.json(getSite(deps.db, organization.id, siteId));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/sites/:siteId',
    permission: 'data:edit',
    summary: 'Edit a site',
    handler: ({ req, res, deps, organization, user }) => {
      const { siteId } = parseParams(siteParams, req.params);
      const changes = parseBody(siteUpdate, req.body);
      res.json(updateSite(deps.db, deps.clock, { organizationId: organization.id, siteId, actor: user, changes }));
    },
  }),
  ...archiveRoutes({
    path: '/orgs/:orgId/sites/:siteId',
    param: 'siteId',
    summaries: { archive: 'Archive a site (none of its groups in use)', unarchive: 'Bring an archived site back' },
    apply: ({ deps, organization, user }, siteId, archived, reason) =>
      updateSite(deps.db, deps.clock, { organizationId: organization.id, siteId, actor: user, changes: { archived }, reason }),
  }),
];
