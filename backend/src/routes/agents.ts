import { z } from 'zod';
import { agentCreate, agentUpdate, oelEntryCreate, oelEntryUpdate } from '@schema/agents';
import { idParam } from '@schema/columns';
import { agentListQuery, oelEntryListQuery } from '@schema/list-query';
import { createAgent, createOelEntry, getAgent, getOelEntry, listAgents, listOelEntries, updateAgent, updateOelEntry } from '../services/agents';
import { parseBody, parseParams, parseQuery } from '../validation';
import { archiveRoutes } from './archive-routes';
import { orgRoute } from './define-route';

const agentParams = z.object({ agentId: idParam });
const entryParams = z.object({ entryId: idParam });

export const agentRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/agents',
    permission: 'org:read',
    summary: 'Agents (noise, chemicals): search, kind filter, sort, page, archived filter',
    handler: ({ req, res, deps, organization }) => {
      res.json(listAgents(deps.db, organization.id, parseQuery(agentListQuery, req.query)));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/agents',
    permission: 'data:edit',
    summary: 'Create an agent (chemicals with CAS number and molecular weight)',
    handler: ({ req, res, deps, organization, user }) => {
      const agent = parseBody(agentCreate, req.body);
      res.status(201).json(createAgent(deps.db, deps.clock, { organizationId: organization.id, actor: user, agent }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/agents/:agentId',
    permission: 'org:read',
    summary: 'One agent',
    handler: ({ req, res, deps, organization }) => {
      const { agentId } = parseParams(agentParams, req.params);
      res.json(getAgent(deps.db, organization.id, agentId));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/agents/:agentId',
    permission: 'data:edit',
    summary: 'Edit an agent',
    handler: ({ req, res, deps, organization, user }) => {
      const { agentId } = parseParams(agentParams, req.params);
      const changes = parseBody(agentUpdate, req.body);
      res.json(updateAgent(deps.db, deps.clock, { organizationId: organization.id, agentId, actor: user, changes }));
    },
  }),
  ...archiveRoutes({
    path: '/orgs/:orgId/agents/:agentId',
    param: 'agentId',
    summaries: { archive: 'Archive an agent (no group in use has it)', unarchive: 'Bring an archived agent back' },
    apply: ({ deps, organization, user }, agentId, archived, reason) =>
      updateAgent(deps.db, deps.clock, { organizationId: organization.id, agentId, actor: user, changes: { archived }, reason }),
  }),

  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/oel-entries',
    permission: 'org:read',
    summary: 'The organization’s OEL list (agent × source × value × unit × averaging time)',
    handler: ({ req, res, deps, organization }) => {
      res.json(listOelEntries(deps.db, organization.id, parseQuery(oelEntryListQuery, req.query)));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/oel-entries',
    permission: 'data:edit',
    summary: 'Add an OEL list entry',
    handler: ({ req, res, deps, organization, user }) => {
      const entry = parseBody(oelEntryCreate, req.body);
      res.status(201).json(createOelEntry(deps.db, deps.clock, { organizationId: organization.id, actor: user, entry }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/oel-entries/:entryId',
    permission: 'org:read',
    summary: 'One OEL list entry',
    handler: ({ req, res, deps, organization }) => {
      const { entryId } = parseParams(entryParams, req.params);
      res.json(getOelEntry(deps.db, organization.id, entryId));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/oel-entries/:entryId',
    permission: 'data:edit',
    summary: 'Edit an OEL list entry (groups keep the copy they took)',
    handler: ({ req, res, deps, organization, user }) => {
      const { entryId } = parseParams(entryParams, req.params);
      const changes = parseBody(oelEntryUpdate, req.body);
      res.json(updateOelEntry(deps.db, deps.clock, { organizationId: organization.id, entryId, actor: user, changes }));
    },
  }),
  ...archiveRoutes({
    path: '/orgs/:orgId/oel-entries/:entryId',
    param: 'entryId',
    summaries: { archive: 'Archive an OEL list entry', unarchive: 'Bring an archived OEL list entry back' },
    apply: ({ deps, organization, user }, entryId, archived, reason) =>
      updateOelEntry(deps.db, deps.clock, { organizationId: organization.id, entryId, actor: user, changes: { archived }, reason }),
  }),
];
