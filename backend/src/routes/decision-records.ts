import { z } from 'zod';
import { assessmentQuery } from '@schema/assessment';
import { idParam } from '@schema/columns';
import { decisionCommentCreate, decisionDraftCreate, decisionDraftUpdate, decisionRecordListQuery, decisionReturn } from '@schema/decision-records';
import {
  acknowledgeDecision,
  approveDecisionDraft,
  commentOnDecision,
  createDecisionDraft,
  getDecisionRecord,
  listDecisionRecords,
  listGroupDecisions,
  proposeDecision,
  resubmitDecisionDraft,
  returnDecisionDraft,
  updateDecisionDraft,
} from '../services/decision-records';
import { notifyDecisionApproved, notifyDecisionReturned } from '../services/notifications';
import { parseBody, parseParams, parseQuery } from '../validation';
import { orgRoute } from './define-route';

const groupParams = z.object({ groupId: idParam });
const recordParams = z.object({ recordId: idParam });
const groupPath = '/orgs/:orgId/exposure-groups/:groupId/decision-records';
const recordPath = '/orgs/:orgId/decision-records/:recordId';

/** Decision records (issue 7): draft, review (approve / return), resubmit, acknowledge, comment, history. */
export const decisionRecordRoutes = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/decision-records',
    permission: 'org:read',
    summary: 'Every decision record of the organization: search, status, category, judgement, site, out-of-date and review-by filters, sort, page',
    handler: ({ req, res, deps, organization }) => {
      const query = parseQuery(decisionRecordListQuery, req.query);
      res.json(listDecisionRecords(deps.db, organization.id, query));
    },
  }),
  orgRoute({
    method: 'get',
    path: groupPath,
    permission: 'org:read',
    summary: 'A group’s decision records, the differences between consecutive approved ones, and whether a new draft is due',
    handler: ({ req, res, deps, organization }) => {
      const { groupId } = parseParams(groupParams, req.params);
      res.json(listGroupDecisions(deps.db, organization.id, groupId));
    },
  }),
  orgRoute({
    method: 'get',
    path: `${groupPath}/proposal`,
    // Drafters start from it; analysts read the figures a draft would freeze before approving it.
    permission: 'stats:run',
    summary: 'What a new draft starts from: category, judgement and proposed review date (?exclude=ids, ?prior=)',
    handler: async ({ req, res, deps, organization }) => {
      const { groupId } = parseParams(groupParams, req.params);
      const query = parseQuery(assessmentQuery, req.query);
      res.json(
        await proposeDecision(deps.db, deps.clock, deps.assessment, { organizationId: organization.id, groupId, exclude: query.exclude, prior: query.prior }),
      );
    },
  }),
  orgRoute({
    method: 'post',
    path: groupPath,
    permission: 'decision:draft',
    summary: 'Draft a decision record for a group',
    handler: async ({ req, res, deps, organization, user }) => {
      const { groupId } = parseParams(groupParams, req.params);
      const draft = parseBody(decisionDraftCreate, req.body);
      res.status(201).json(await createDecisionDraft(deps.db, deps.clock, deps.assessment, { organizationId: organization.id, groupId, actor: user, draft }));
    },
  }),
  orgRoute({
    method: 'get',
    path: recordPath,
    permission: 'org:read',
    summary: 'One decision record in full: frozen inputs and figures, approvals, acknowledgements, comments',
    handler: ({ req, res, deps, organization }) => {
      const { recordId } = parseParams(recordParams, req.params);
      res.json(getDecisionRecord(deps.db, deps.clock, organization.id, recordId));
    },
  }),
  orgRoute({
    method: 'patch',
    path: recordPath,
    permission: 'decision:draft',
    summary: 'The drafter edits a draft or a returned draft (approved records: 409)',
    handler: ({ req, res, deps, organization, user }) => {
      const { recordId } = parseParams(recordParams, req.params);
      const changes = parseBody(decisionDraftUpdate, req.body);
      res.json(updateDecisionDraft(deps.db, deps.clock, { organizationId: organization.id, recordId, actor: user, changes }));
    },
  }),
  orgRoute({
    method: 'post',
    path: `${recordPath}/resubmit`,
    permission: 'decision:draft',
    summary: 'The drafter sends a returned draft back for review',
    handler: ({ req, res, deps, organization, user }) => {
      const { recordId } = parseParams(recordParams, req.params);
      res.json(resubmitDecisionDraft(deps.db, deps.clock, { organizationId: organization.id, recordId, actor: user }));
    },
  }),
  orgRoute({
    method: 'post',
    path: `${recordPath}/approve`,
    permission: 'decision:approve',
    summary: 'Approve a draft (never one’s own): freezes data, hash, versions, settings and figures',
    handler: async ({ req, res, deps, organization, user }) => {
      const { recordId } = parseParams(recordParams, req.params);
      const view = await approveDecisionDraft(deps.db, deps.clock, deps.assessment, { organizationId: organization.id, recordId, actor: user });
      // The approval is committed; e-mail failures are logged and kept, never undo it (services/notifications.ts).
      await notifyDecisionApproved(deps, { organizationId: organization.id, recordId });
      res.json(view);
    },
  }),
  orgRoute({
    method: 'post',
    path: `${recordPath}/return`,
    permission: 'decision:approve',
    summary: 'Return a draft to its drafter with a comment',
    handler: async ({ req, res, deps, organization, user }) => {
      const { recordId } = parseParams(recordParams, req.params);
      const { comment } = parseBody(decisionReturn, req.body);
      const view = returnDecisionDraft(deps.db, deps.clock, { organizationId: organization.id, recordId, actor: user, comment });
      await notifyDecisionReturned(deps, { organizationId: organization.id, recordId });
      res.json(view);
    },
  }),
  orgRoute({
    method: 'post',
    path: `${recordPath}/acknowledge`,
    permission: 'decision:acknowledge',
    summary: 'A manager acknowledges an approved record (once)',
    handler: ({ req, res, deps, organization, user }) => {
      const { recordId } = parseParams(recordParams, req.params);
      res.json(acknowledgeDecision(deps.db, deps.clock, { organizationId: organization.id, recordId, actor: user }));
    },
  }),
  orgRoute({
    method: 'post',
    path: `${recordPath}/comments`,
    permission: 'comment:write',
    summary: 'Comment on a decision record',
    handler: ({ req, res, deps, organization, user }) => {
      const { recordId } = parseParams(recordParams, req.params);
      const { body } = parseBody(decisionCommentCreate, req.body);
      res.status(201).json(commentOnDecision(deps.db, deps.clock, { organizationId: organization.id, recordId, actor: user, body }));
    },
  }),
];
