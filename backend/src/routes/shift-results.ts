import { z } from 'zod';
import { idParam } from '@schema/columns';
import { shiftResultCreate, shiftResultListQuery, shiftResultStatusChange } from '@schema/shift-results';
import { createShiftResult, getShiftResult, listShiftResults, restoreShiftResult, voidShiftResult } from '../services/shift-results';
import { parseBody, parseParams, parseQuery } from '../validation';
import { nameAccessOf } from './access';
import { orgRoute } from './define-route';

const resultParams = z.object({ resultId: idParam });

export const shiftResultRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/shift-results',
    permission: 'org:read',
    summary: 'Shift results: group, worker, status, source, non-detect, date and batch filters; sort; page',
    handler: ({ req, res, deps, organization, membership }) => {
      res.json(listShiftResults(deps.db, organization.id, parseQuery(shiftResultListQuery, req.query), nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/shift-results',
    permission: 'data:edit',
    summary: 'Enter one shift result by hand',
    handler: ({ req, res, deps, organization, user, membership }) => {
      const result = parseBody(shiftResultCreate, req.body);
      res.status(201).json(createShiftResult(deps.db, deps.clock, { organizationId: organization.id, actor: user, result }, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/shift-results/:resultId',
    permission: 'org:read',
    summary: 'One shift result with how it was reached',
    handler: ({ req, res, deps, organization, membership }) => {
      const { resultId } = parseParams(resultParams, req.params);
      res.json(getShiftResult(deps.db, organization.id, resultId, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/shift-results/:resultId/void',
    permission: 'data:edit',
    summary: 'Void a result with a reason (it stays, marked void)',
    handler: ({ req, res, deps, organization, user, membership }) => {
      const { resultId } = parseParams(resultParams, req.params);
      const { reason } = parseBody(shiftResultStatusChange, req.body);
      res.json(voidShiftResult(deps.db, deps.clock, { organizationId: organization.id, resultId, actor: user, reason }, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/shift-results/:resultId/restore',
    permission: 'data:edit',
    summary: 'Restore a void result with a reason',
    handler: ({ req, res, deps, organization, user, membership }) => {
      const { resultId } = parseParams(resultParams, req.params);
      const { reason } = parseBody(shiftResultStatusChange, req.body);
      res.json(restoreShiftResult(deps.db, deps.clock, { organizationId: organization.id, resultId, actor: user, reason }, nameAccessOf(membership)));
    },
  }),
];
