import { z } from 'zod';
import { idParam } from '@schema/columns';
import { can } from '@schema/permissions';
import { workerLetterCancel, workerLetterDraft, workerLetterHandOver } from '@schema/worker-letters';
import { Forbidden } from '../errors';
import {
  cancelWorkerLetter,
  draftWorkerLetters,
  getWorkerLetter,
  groupWorkerLetters,
  handOverWorkerLetter,
  sendWorkerLetter,
  workerLetterPdfFile,
} from '../services/worker-letters';
import { parseBody, parseParams } from '../validation';
import { orgRoute, type OrganizationContext } from './define-route';

const groupParams = z.object({ groupId: idParam });
const letterParams = z.object({ letterId: idParam });
const letterPath = '/orgs/:orgId/worker-letters/:letterId';

/** Letters name the worker: changing them needs `data:edit` and also `workerNames:read`. */
function letterActor({ user, membership }: OrganizationContext) {
  if (!can(membership.role, 'workerNames:read')) throw new Forbidden('Worker letters name the worker: your role may not see worker names');
  return { id: user.id, name: user.name, email: user.email };
}

/** Worker letters for results at or above the action level (docs/decisions/024-worker-letters.md). */
export const workerLetterRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exposure-groups/:groupId/worker-letters',
    permission: 'workerNames:read',
    summary: 'A group’s worker letters, the results at or above the action level still without one, and the action level used',
    handler: ({ req, res, deps, organization }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.json(groupWorkerLetters(deps.db, organization.id, groupId));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exposure-groups/:groupId/worker-letters',
    permission: 'data:edit',
    summary: 'Draft one letter per worker for the results at or above the action level without a letter (all, or the listed resultIds)',
    handler: (context) => {
      const actor = letterActor(context);
      const { groupId } = parseParams(groupParams, context.req.params);
      const draft = parseBody(workerLetterDraft, context.req.body);
      const letters = draftWorkerLetters(context.deps.db, context.deps.clock, {
        organizationId: context.organization.id,
        organizationName: context.organization.name,
        groupId,
        actor,
        draft,
      });
      context.res.status(201).json({ letters });
    },
  }),
  // Before `${letterPath}`, which would otherwise take "12.pdf" as the id.
  orgRoute({
    method: 'get',
    path: `${letterPath}.pdf`,
    permission: 'workerNames:read',
    summary: 'The letter as a PDF: as sent or handed over (the kept file), else a preview of the draft',
    handler: async ({ req, res, deps, organization }) => {
      const { letterId } = parseParams(letterParams, req.params);
      const file = await workerLetterPdfFile(deps.db, organization.id, letterId);
      res.setHeader('Content-Type', 'application/pdf');
      res.setHeader('Content-Disposition', `inline; filename="${file.fileName}"`);
      res.setHeader('Cache-Control', 'no-store');
      res.setHeader('X-Content-SHA256', file.sha256);
      res.send(file.bytes);
    },
  }),
  orgRoute({
    method: 'get',
    path: letterPath,
    permission: 'workerNames:read',
    summary: 'One worker letter with its status and dates',
    handler: ({ req, res, deps, organization }) => {
      const { letterId } = parseParams(letterParams, req.params);
      res.json(getWorkerLetter(deps.db, organization.id, letterId));
    },
  }),
  orgRoute({
    method: 'post',
    path: `${letterPath}/send`,
    permission: 'data:edit',
    summary: 'E-mail a drafted letter to the worker with its PDF attached (422 when the worker has no address)',
    handler: async (context) => {
      const actor = letterActor(context);
      const { letterId } = parseParams(letterParams, context.req.params);
      context.res.json(
        await sendWorkerLetter(context.deps.db, context.deps.clock, context.deps.mailer, { organizationId: context.organization.id, letterId, actor }),
      );
    },
  }),
  orgRoute({
    method: 'post',
    path: `${letterPath}/hand-over`,
    permission: 'data:edit',
    summary: 'Record that the printed letter was handed to the worker on a date',
    handler: async (context) => {
      const actor = letterActor(context);
      const { letterId } = parseParams(letterParams, context.req.params);
      const { handedOverOn } = parseBody(workerLetterHandOver, context.req.body);
      context.res.json(
        await handOverWorkerLetter(context.deps.db, context.deps.clock, { organizationId: context.organization.id, letterId, actor, handedOverOn }),
      );
    },
  }),
  orgRoute({
    method: 'post',
    path: `${letterPath}/cancel`,
    permission: 'data:edit',
    summary: 'Cancel a drafted letter with a reason (its results wait for a letter again)',
    handler: (context) => {
      const actor = letterActor(context);
      const { letterId } = parseParams(letterParams, context.req.params);
      const { reason } = parseBody(workerLetterCancel, context.req.body);
      context.res.json(cancelWorkerLetter(context.deps.db, context.deps.clock, { organizationId: context.organization.id, letterId, actor, reason }));
    },
  }),
];
