import { z } from 'zod';
import { idParam } from '@schema/columns';
import { groupProtectorAdd, hearingProtectorCreate, hearingProtectorUpdate, protectorAdequacyQuery, protectorSettingsUpdate } from '@schema/hearing-protectors';
import { archivedFilter } from '@schema/list-query';
import {
  addGroupProtector,
  createHearingProtector,
  getHearingProtector,
  groupProtectorAdequacy,
  listHearingProtectors,
  organizationProtectorSettings,
  protectorsOfGroup,
  removeGroupProtector,
  updateHearingProtector,
  updateProtectorSettings,
} from '../services/hearing-protectors';
import { findExposureGroup } from '../services/exposure-groups';
import { parseBody, parseParams, parseQuery } from '../validation';
import { archiveRoutes } from './archive-routes';
import { orgRoute } from './define-route';

const protectorParams = z.object({ protectorId: idParam });
const groupParams = z.object({ groupId: idParam });
const groupProtectorParams = z.object({ groupId: idParam, protectorId: idParam });
const listQuery = z.object({ archived: archivedFilter });

export const hearingProtectorRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/hearing-protectors',
    permission: 'org:read',
    summary: 'The organization’s hearing protectors (name, type, NRR, SNR, H/M/L), with rating warnings',
    handler: ({ req, res, deps, organization }) => {
      res.json(listHearingProtectors(deps.db, organization.id, parseQuery(listQuery, req.query).archived));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/hearing-protectors',
    permission: 'data:edit',
    summary: 'Add a hearing protector (ratings range-checked)',
    handler: ({ req, res, deps, organization, user }) => {
      const protector = parseBody(hearingProtectorCreate, req.body);
      res.status(201).json(createHearingProtector(deps.db, deps.clock, { organizationId: organization.id, actor: user, protector }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/hearing-protectors/:protectorId',
    permission: 'org:read',
    summary: 'One hearing protector',
    handler: ({ req, res, deps, organization }) => {
      const { protectorId } = parseParams(protectorParams, req.params);
      res.json(getHearingProtector(deps.db, organization.id, protectorId));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/hearing-protectors/:protectorId',
    permission: 'data:edit',
    summary: 'Edit a hearing protector',
    handler: ({ req, res, deps, organization, user }) => {
      const { protectorId } = parseParams(protectorParams, req.params);
      const changes = parseBody(hearingProtectorUpdate, req.body);
      res.json(updateHearingProtector(deps.db, deps.clock, { organizationId: organization.id, protectorId, actor: user, changes }));
    },
  }),
  ...archiveRoutes({
    path: '/orgs/:orgId/hearing-protectors/:protectorId',
    param: 'protectorId',
    summaries: { archive: 'Archive a hearing protector', unarchive: 'Bring an archived hearing protector back' },
    apply: ({ deps, organization, user }, protectorId, archived, reason) =>
      updateHearingProtector(deps.db, deps.clock, { organizationId: organization.id, protectorId, actor: user, changes: { archived }, reason }),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/protector-settings',
    permission: 'org:read',
    summary: 'Action level and EN 458 band margins used for the protector verdicts',
    handler: ({ res, deps, organization }) => {
      res.json(organizationProtectorSettings(deps.db, organization.id));
    },
  }),
  orgRoute({
    method: 'put',
    path: '/orgs/:orgId/protector-settings',
    permission: 'settings:manage',
    summary: 'Change the protector verdict settings',
    handler: ({ req, res, deps, organization, user }) => {
      res.json(
        updateProtectorSettings(deps.db, deps.clock, { organizationId: organization.id, actor: user, values: parseBody(protectorSettingsUpdate, req.body) }),
      );
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/protectors',
    permission: 'org:read',
    summary: 'Hearing protectors in use in a noise group',
    handler: ({ req, res, deps, organization }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.json(protectorsOfGroup(deps.db, deps.clock, organization.id, groupId));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exposure-groups/:groupId/protectors',
    permission: 'data:edit',
    summary: 'Put a hearing protector on a noise group’s list',
    handler: ({ req, res, deps, organization, user }) => {
      const { groupId } = parseParams(groupParams, req.params);
      // The group first: another organization's group answers 404 whatever the body says.
      findExposureGroup(deps.db, organization.id, groupId);
      const { protectorId } = parseBody(groupProtectorAdd, req.body);
      res.status(201).json(addGroupProtector(deps.db, deps.clock, { organizationId: organization.id, groupId, protectorId, actor: user }));
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/exposure-groups/:groupId/protectors/:protectorId',
    permission: 'data:edit',
    summary: 'Take a hearing protector off a noise group’s list (audited)',
    handler: ({ req, res, deps, organization, user }) => {
      const { groupId, protectorId } = parseParams(groupProtectorParams, req.params);
      res.json(removeGroupProtector(deps.db, deps.clock, { organizationId: organization.id, groupId, protectorId, actor: user }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/protector-adequacy',
    permission: 'org:read',
    summary: 'Level at the ear per protector and method (OSHA App. B, NIOSH, EN 458) with verdicts, from the group’s P95 or a typed level',
    handler: ({ req, res, deps, organization }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.json(groupProtectorAdequacy(deps.db, deps.clock, organization.id, groupId, parseQuery(protectorAdequacyQuery, req.query)));
    },
  }),
];
