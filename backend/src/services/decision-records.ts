import { and, asc, count, desc, eq, gt, inArray, isNotNull, lte, ne, not, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { PriorName } from '@schema/assessment';
import {
  decisionAcknowledgements,
  decisionComments,
  decisionDraftCreate,
  decisionDraftUpdate,
  decisionRecords,
  type DecisionChange,
  type DecisionExclusion,
  type DecisionPerson,
  type DecisionProposal,
  type DecisionRecordListItem,
  type DecisionRecordListQuery,
  type DecisionRecordRow,
  type DecisionRecordSummary,
  type DecisionRecordView,
  type FrozenFigures,
  type FrozenInputs,
  type GroupDecisions,
} from '@schema/decision-records';
import { exposureGroups } from '@schema/exposure-groups';
import type { ListPage } from '@schema/list-query';
import { organizations, organizationSettings } from '@schema/organizations';
import { sites } from '@schema/sites';
import { users } from '@schema/users';
import { en689ReassessmentMonths } from '@stats/en689';
import type { ExposureCategory } from '@stats/types';
import type { z } from 'zod';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict, Forbidden, NotFound } from '../errors';
import { getGroupAssessment, type AssessmentEngine } from './assessment';
import { audit, changedFields, fieldError, type Tx } from './changes';
import { findExposureGroup } from './exposure-groups';
import { today } from './dates';
import { orderBy, pageOf, pageWindow, searchCondition } from './list';

/*
 * The decision-record workflow (issue 7, PRODUCT.md capability 6 and roles):
 *   draft ──approve (an analyst who did not draft)──▶ approved ──(newer record approved)──▶ superseded
 *     │  ▲
 *   return (comment required)   resubmit (by the drafter, after editing)
 *     ▼  │
 *   returned
 * Figures always come from the assessment service (services/assessment.ts getGroupAssessment), the same
 * engine call as the page and `npm run -s assess`; approval stores that answer as it was computed.
 * Approved records are immutable: every change below checks the status first (409), and SQLite
 * triggers refuse what slips past (migration 0004_decision-records-immutable.sql).
 */

type Actor = { id: number };

const entityType = 'decision_record';

/** Months added to a calendar date, clamped to the last day of the target month (31 Jan + 1 month → 28/29 Feb). */
export function addMonths(date: string, months: number): string {
  const [year, month, day] = date.split('-').map(Number) as [number, number, number];
  const target = new Date(Date.UTC(year, month - 1 + months, 1));
  const lastDay = new Date(Date.UTC(target.getUTCFullYear(), target.getUTCMonth() + 1, 0)).getUTCDate();
  target.setUTCDate(Math.min(day, lastDay));
  return target.toISOString().slice(0, 10);
}

/**
 * The proposed review interval: the organization's `reviewIntervalMonths` when set, else EN 689:2018's
 * reassessment guidance by GM/OEL (36/24/18/12 months; stats/en689.ts, from memory per REFERENCES.md).
 */
export function reviewIntervalOf(settingMonths: number | undefined, geometricMean: number, oel: number): { months: number; source: string } {
  if (settingMonths !== undefined) return { months: settingMonths, source: `Organization setting: review every ${settingMonths} months` };
  const months = en689ReassessmentMonths(geometricMean, oel);
  const percent = (100 * geometricMean) / oel;
  return {
    months,
    source: `EN 689:2018 reassessment guidance (from memory): GM is ${percent < 1 ? percent.toPrecision(2) : percent.toFixed(1)} % of the OEL → ${months} months`,
  };
}

function reviewIntervalSetting(db: Tx, organizationId: number): number | undefined {
  const row = db.select({ settings: organizations.settings }).from(organizations).where(eq(organizations.id, organizationId)).get();
  const parsed = organizationSettings.shape.reviewIntervalMonths.safeParse((row?.settings as Record<string, unknown> | undefined)?.reviewIntervalMonths);
  return parsed.success ? parsed.data : undefined;
}

async function assessmentFor(
  db: Db,
  clock: Clock,
  engine: AssessmentEngine,
  organizationId: number,
  groupId: number,
  exclude: readonly number[],
  prior: PriorName,
) {
  try {
    return await getGroupAssessment(db, clock, engine, { organizationId, groupId, exclude: [...exclude].sort((a, b) => a - b), prior });
  } catch (error) {
    // The assessment names `exclude` (a query parameter); here the ids come from the record's exclusions.
    if (error instanceof Error && 'fields' in error && (error as { fields?: Record<string, string> }).fields?.exclude) {
      throw fieldError('exclusions', (error as { fields: Record<string, string> }).fields.exclude);
    }
    throw error;
  }
}

/** What a new draft starts from: the assessment's category (on the 95th percentile) and judgement, and the proposed review date. */
export async function proposeDecision(
  db: Db,
  clock: Clock,
  engine: AssessmentEngine,
  input: { organizationId: number; groupId: number; exclude: readonly number[]; prior: PriorName },
): Promise<DecisionProposal> {
  const assessment = await assessmentFor(db, clock, engine, input.organizationId, input.groupId, input.exclude, input.prior);
  const classical = assessment.classical;
  const interval = reviewIntervalOf(reviewIntervalSetting(db, input.organizationId), classical.gm, assessment.group.oel);
  return {
    category: classical.categoryByP95,
    judgement: classical.judgement,
    reviewDate: addMonths(today(clock), interval.months),
    reviewDateSource: interval.source,
    reviewIntervalMonths: interval.months,
    n: classical.n,
    p95: classical.p95,
    utl95_95: classical.utl95_95,
    exceedanceFraction: classical.exceedanceFraction,
    gm: classical.gm,
    oel: assessment.group.oel,
    oelUnit: assessment.group.oelUnit,
    dataVersion: assessment.group.dataVersion,
    dataHash: assessment.data.dataHash,
    excludedIds: assessment.data.excludedIds,
  };
}

function checkExclusions(exclusions: readonly DecisionExclusion[]): void {
  const seen = new Set<number>();
  exclusions.forEach((exclusion, index) => {
    if (seen.has(exclusion.resultId)) throw fieldError(`exclusions.${index}.resultId`, `result ${exclusion.resultId} is listed twice`);
    seen.add(exclusion.resultId);
  });
}

/** A hygienist's new draft. Category, judgement and review date default from the assessment with the draft's exclusions. */
export async function createDecisionDraft(
  db: Db,
  clock: Clock,
  engine: AssessmentEngine,
  input: { organizationId: number; groupId: number; actor: Actor; draft: z.output<typeof decisionDraftCreate> },
): Promise<DecisionRecordView> {
  const { draft } = input;
  checkExclusions(draft.exclusions);
  const proposal = await proposeDecision(db, clock, engine, {
    organizationId: input.organizationId,
    groupId: input.groupId,
    exclude: draft.exclusions.map((exclusion) => exclusion.resultId),
    prior: draft.prior,
  });
  const now = clock.now();
  const stamp = now.toISOString();
  const id = db.transaction((tx) => {
    const open = tx
      .select({ id: decisionRecords.id })
      .from(decisionRecords)
      .where(and(eq(decisionRecords.exposureGroupId, input.groupId), inArray(decisionRecords.status, ['draft', 'returned'])))
      .get();
    if (open) throw new Conflict(`This group already has an open draft (decision record ${open.id}); edit that one instead`);
    const reviewDateSet = draft.reviewDate !== undefined && draft.reviewDate !== proposal.reviewDate;
    const row = tx
      .insert(decisionRecords)
      .values({
        organizationId: input.organizationId,
        exposureGroupId: input.groupId,
        status: 'draft',
        category: (draft.category ?? proposal.category) as ExposureCategory,
        judgement: draft.judgement ?? proposal.judgement,
        rationale: draft.rationale,
        actions: draft.actions,
        reviewDate: draft.reviewDate ?? proposal.reviewDate,
        reviewDateSource: reviewDateSet ? `Set by the drafter (proposed: ${proposal.reviewDate}; ${proposal.reviewDateSource})` : proposal.reviewDateSource,
        prior: draft.prior,
        exclusions: draft.exclusions,
        draftedByUserId: input.actor.id,
        submittedAt: stamp,
        dataVersionAtDraft: proposal.dataVersion,
        createdAt: stamp,
        updatedAt: stamp,
      })
      .returning({ id: decisionRecords.id })
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType,
      entityId: row.id,
      action: 'drafted',
      after: {
        exposureGroupId: input.groupId,
        category: draft.category ?? proposal.category,
        judgement: draft.judgement ?? proposal.judgement,
        exclusions: draft.exclusions,
      },
      at: now,
    });
    return row.id;
  });
  return getDecisionRecord(db, clock, input.organizationId, id);
}

function recordOrNotFound(db: Tx, organizationId: number, recordId: number): DecisionRecordRow {
  const row = db
    .select()
    .from(decisionRecords)
    .where(and(eq(decisionRecords.id, recordId), eq(decisionRecords.organizationId, organizationId)))
    .get();
  if (!row) throw new NotFound(`No decision record ${recordId} in this organization`);
  return row;
}

function refuseFrozen(row: DecisionRecordRow, doing: string): void {
  if (row.status === 'approved' || row.status === 'superseded') {
    throw new Conflict(`Decision record ${row.id} is ${row.status} and cannot be changed (${doing}); draft a new record instead`);
  }
}

function refuseOtherDrafter(row: DecisionRecordRow, actor: Actor, doing: string): void {
  if (row.draftedByUserId !== actor.id) throw new Forbidden(`Only the person who drafted decision record ${row.id} may ${doing} it`);
}

/** The drafter edits a draft or a returned draft (an approved record: 409). */
export function updateDecisionDraft(
  db: Db,
  clock: Clock,
  input: { organizationId: number; recordId: number; actor: Actor; changes: z.output<typeof decisionDraftUpdate> },
): DecisionRecordView {
  const now = clock.now();
  db.transaction((tx) => {
    const row = recordOrNotFound(tx, input.organizationId, input.recordId);
    refuseFrozen(row, 'edit');
    refuseOtherDrafter(row, input.actor, 'edit');
    const changes = input.changes;
    if (changes.exclusions) checkExclusions(changes.exclusions);
    const set: Partial<DecisionRecordRow> = {};
    if (changes.category !== undefined) set.category = changes.category as ExposureCategory;
    if (changes.judgement !== undefined) set.judgement = changes.judgement;
    if (changes.rationale !== undefined) set.rationale = changes.rationale;
    if (changes.actions !== undefined) set.actions = changes.actions;
    if (changes.exclusions !== undefined) set.exclusions = changes.exclusions;
    if (changes.reviewDate !== undefined && changes.reviewDate !== row.reviewDate) {
      set.reviewDate = changes.reviewDate;
      set.reviewDateSource = `Set by the drafter (${row.reviewDateSource.startsWith('Set by the drafter') ? 'changed' : `proposed: ${row.reviewDate}; ${row.reviewDateSource}`})`;
    }
    const { before, after } = changedFields(row, set);
    if (Object.keys(after).length === 0) return;
    tx.update(decisionRecords)
      .set({ ...set, updatedAt: now.toISOString() })
      .where(eq(decisionRecords.id, row.id))
      .run();
    audit(tx, { organizationId: input.organizationId, actor: input.actor, entityType, entityId: row.id, action: 'edited', before, after, at: now });
  });
  return getDecisionRecord(db, clock, input.organizationId, input.recordId);
}

/** The drafter sends a returned draft back for review. */
export function resubmitDecisionDraft(db: Db, clock: Clock, input: { organizationId: number; recordId: number; actor: Actor }): DecisionRecordView {
  const now = clock.now();
  db.transaction((tx) => {
    const row = recordOrNotFound(tx, input.organizationId, input.recordId);
    refuseFrozen(row, 'resubmit');
    refuseOtherDrafter(row, input.actor, 'resubmit');
    if (row.status !== 'returned') throw new Conflict(`Decision record ${row.id} is already waiting for review; only a returned draft is resubmitted`);
    tx.update(decisionRecords)
      .set({ status: 'draft', submittedAt: now.toISOString(), updatedAt: now.toISOString() })
      .where(eq(decisionRecords.id, row.id))
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType,
      entityId: row.id,
      action: 'resubmitted',
      before: { status: 'returned' },
      after: { status: 'draft' },
      at: now,
    });
  });
  return getDecisionRecord(db, clock, input.organizationId, input.recordId);
}

/** An analyst returns a draft with a comment saying what must change. */
export function returnDecisionDraft(
  db: Db,
  clock: Clock,
  input: { organizationId: number; recordId: number; actor: Actor; comment: string },
): DecisionRecordView {
  const now = clock.now();
  db.transaction((tx) => {
    const row = recordOrNotFound(tx, input.organizationId, input.recordId);
    refuseFrozen(row, 'return');
    if (row.draftedByUserId === input.actor.id) throw new Forbidden('You drafted this record: another analyst must review it');
    if (row.status !== 'draft') throw new Conflict(`Decision record ${row.id} is ${row.status}; only a draft waiting for review can be returned`);
    tx.update(decisionRecords)
      .set({ status: 'returned', returnedByUserId: input.actor.id, returnedAt: now.toISOString(), returnComment: input.comment, updatedAt: now.toISOString() })
      .where(eq(decisionRecords.id, row.id))
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType,
      entityId: row.id,
      action: 'returned',
      reason: input.comment,
      before: { status: 'draft' },
      after: { status: 'returned' },
      at: now,
    });
  });
  return getDecisionRecord(db, clock, input.organizationId, input.recordId);
}

/**
 * An analyst who did not draft approves: the assessment is computed now (the draft's exclusions and prior),
 * and the results used, the data hash, method, versions, settings and every figure are frozen. A previously
 * approved record of the group becomes superseded. If the group's results change while the figures are
 * computed, the approval is refused (409) rather than freezing figures of data that is already gone.
 */
export async function approveDecisionDraft(
  db: Db,
  clock: Clock,
  engine: AssessmentEngine,
  input: { organizationId: number; recordId: number; actor: Actor },
): Promise<DecisionRecordView> {
  const first = recordOrNotFound(db, input.organizationId, input.recordId);
  refuseFrozen(first, 'approve');
  if (first.draftedByUserId === input.actor.id) throw new Forbidden('You drafted this record: another analyst must approve it');
  if (first.status === 'returned') throw new Conflict(`Decision record ${first.id} was returned to its drafter; it can be approved once resubmitted`);
  const exclusions = first.exclusions;
  const assessment = await assessmentFor(
    db,
    clock,
    engine,
    input.organizationId,
    first.exposureGroupId,
    exclusions.map((exclusion) => exclusion.resultId),
    first.prior,
  );
  const reasons = new Map(exclusions.map((exclusion) => [exclusion.resultId, exclusion.reason]));
  const frozenResult = (result: { id: number; workerCode: string; date: string; value: number; nonDetect: boolean }) => ({
    id: result.id,
    workerCode: result.workerCode,
    date: result.date,
    value: result.value,
    nonDetect: result.nonDetect,
  });
  const frozenInputs: FrozenInputs = {
    results: assessment.data.results.map(frozenResult),
    excluded: assessment.data.excluded.map((result) => ({ ...frozenResult(result), reason: reasons.get(result.id) ?? '' })),
    oel: assessment.group.oel,
    oelUnit: assessment.group.oelUnit,
    oelSource: assessment.group.oelSource,
    actionLevel: assessment.group.actionLevel,
  };
  const { computation: _computation, ...figures } = assessment;
  const frozenFigures: FrozenFigures = figures;
  const now = clock.now();
  const stamp = now.toISOString();
  db.transaction((tx) => {
    const row = recordOrNotFound(tx, input.organizationId, input.recordId);
    refuseFrozen(row, 'approve');
    if (row.status !== 'draft' || row.updatedAt !== first.updatedAt) {
      throw new Conflict(`Decision record ${row.id} changed while it was being approved; reload it and try again`);
    }
    const group = tx.select({ dataVersion: exposureGroups.dataVersion }).from(exposureGroups).where(eq(exposureGroups.id, row.exposureGroupId)).get()!;
    if (group.dataVersion !== assessment.group.dataVersion) {
      throw new Conflict('The group’s results changed while the figures were computed; approve again to freeze the current data');
    }
    const previous = tx
      .select({ id: decisionRecords.id })
      .from(decisionRecords)
      .where(and(eq(decisionRecords.exposureGroupId, row.exposureGroupId), eq(decisionRecords.status, 'approved'), ne(decisionRecords.id, row.id)))
      .all();
    for (const old of previous) {
      tx.update(decisionRecords).set({ status: 'superseded', supersededAt: stamp, updatedAt: stamp }).where(eq(decisionRecords.id, old.id)).run();
      audit(tx, {
        organizationId: input.organizationId,
        actor: input.actor,
        entityType,
        entityId: old.id,
        action: 'superseded',
        after: { supersededBy: row.id },
        at: now,
      });
    }
    tx.update(decisionRecords)
      .set({
        status: 'approved',
        frozenInputs,
        dataHash: assessment.data.dataHash,
        method: assessment.classical.fit.method,
        engineVersion: assessment.engineVersion,
        settings: assessment.settings,
        figures: frozenFigures,
        approvedByUserId: input.actor.id,
        approvedAt: stamp,
        dataVersionAtApproval: assessment.group.dataVersion,
        updatedAt: stamp,
      })
      .where(eq(decisionRecords.id, row.id))
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType,
      entityId: row.id,
      action: 'approved',
      before: { status: 'draft' },
      after: { status: 'approved', category: row.category, judgement: row.judgement, dataHash: assessment.data.dataHash, reviewDate: row.reviewDate },
      at: now,
    });
  });
  return getDecisionRecord(db, clock, input.organizationId, input.recordId);
}

/** A manager acknowledges an approved record, once. */
export function acknowledgeDecision(db: Db, clock: Clock, input: { organizationId: number; recordId: number; actor: Actor }): DecisionRecordView {
  const now = clock.now();
  db.transaction((tx) => {
    const row = recordOrNotFound(tx, input.organizationId, input.recordId);
    if (row.status !== 'approved') throw new Conflict(`Decision record ${row.id} is ${row.status}; only the current approved record can be acknowledged`);
    const done = tx
      .select({ at: decisionAcknowledgements.at })
      .from(decisionAcknowledgements)
      .where(and(eq(decisionAcknowledgements.decisionRecordId, row.id), eq(decisionAcknowledgements.userId, input.actor.id)))
      .get();
    if (done) throw new Conflict(`You already acknowledged decision record ${row.id} on ${done.at.slice(0, 10)}`);
    tx.insert(decisionAcknowledgements)
      .values({ organizationId: input.organizationId, decisionRecordId: row.id, userId: input.actor.id, at: now.toISOString() })
      .run();
    audit(tx, { organizationId: input.organizationId, actor: input.actor, entityType, entityId: row.id, action: 'acknowledged', at: now });
  });
  return getDecisionRecord(db, clock, input.organizationId, input.recordId);
}

/** A comment on any record (it does not change the record itself). */
export function commentOnDecision(db: Db, clock: Clock, input: { organizationId: number; recordId: number; actor: Actor; body: string }): DecisionRecordView {
  const now = clock.now();
  db.transaction((tx) => {
    const row = recordOrNotFound(tx, input.organizationId, input.recordId);
    const comment = tx
      .insert(decisionComments)
      .values({ organizationId: input.organizationId, decisionRecordId: row.id, userId: input.actor.id, body: input.body, createdAt: now.toISOString() })
      .returning({ id: decisionComments.id })
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType,
      entityId: row.id,
      action: 'commented',
      after: { commentId: comment.id },
      at: now,
    });
  });
  return getDecisionRecord(db, clock, input.organizationId, input.recordId);
}

const drafters = alias(users, 'drafters');
const approvers = alias(users, 'approvers');

/** The record columns a summary needs (not the frozen inputs and figures, which lists never show). */
const summaryRecordColumns = {
  id: decisionRecords.id,
  exposureGroupId: decisionRecords.exposureGroupId,
  status: decisionRecords.status,
  category: decisionRecords.category,
  judgement: decisionRecords.judgement,
  reviewDate: decisionRecords.reviewDate,
  draftedByUserId: decisionRecords.draftedByUserId,
  approvedByUserId: decisionRecords.approvedByUserId,
  submittedAt: decisionRecords.submittedAt,
  approvedAt: decisionRecords.approvedAt,
  returnedAt: decisionRecords.returnedAt,
  dataVersionAtDraft: decisionRecords.dataVersionAtDraft,
  dataVersionAtApproval: decisionRecords.dataVersionAtApproval,
};
type SummaryRecord = Pick<DecisionRecordRow, keyof typeof summaryRecordColumns>;

/**
 * Records with their group, site, people and acknowledgement count in one query (the count is a
 * correlated subquery on the acknowledgements' record index, so a page costs no query per row).
 */
function selectSummaryRows(db: Tx) {
  return db
    .select({
      record: summaryRecordColumns,
      groupName: exposureGroups.name,
      groupDataVersion: exposureGroups.dataVersion,
      siteId: sites.id,
      siteName: sites.name,
      drafterName: drafters.name,
      approverName: approvers.name,
      acknowledgements: db.$count(decisionAcknowledgements, eq(decisionAcknowledgements.decisionRecordId, decisionRecords.id)),
    })
    .from(decisionRecords)
    .innerJoin(exposureGroups, eq(exposureGroups.id, decisionRecords.exposureGroupId))
    .innerJoin(sites, eq(sites.id, exposureGroups.siteId))
    .innerJoin(drafters, eq(drafters.id, decisionRecords.draftedByUserId))
    .leftJoin(approvers, eq(approvers.id, decisionRecords.approvedByUserId));
}

/** Summary rows with names and out-of-date flags, for one group or a whole organization. */
export function decisionSummaries(db: Tx, organizationId: number, filter: { groupId?: number; limit?: number }): DecisionRecordSummary[] {
  const query = selectSummaryRows(db)
    .where(
      filter.groupId === undefined
        ? eq(decisionRecords.organizationId, organizationId)
        : and(eq(decisionRecords.organizationId, organizationId), eq(decisionRecords.exposureGroupId, filter.groupId)),
    )
    .orderBy(desc(decisionRecords.updatedAt), desc(decisionRecords.id));
  const rows = filter.limit === undefined ? query.all() : query.limit(filter.limit).all();
  return rows.map((row) => summaryOf(row.record, row.groupName, row.groupDataVersion, row.drafterName, row.approverName, row.acknowledgements));
}

/** Approved, and the group's results changed since (the same rule as `outOfDate` in summaryOf). */
const outOfDateCondition = and(
  eq(decisionRecords.status, 'approved'),
  isNotNull(decisionRecords.dataVersionAtApproval),
  gt(exposureGroups.dataVersion, decisionRecords.dataVersionAtApproval),
)!;

function registerCondition(organizationId: number, query: DecisionRecordListQuery): SQL | undefined {
  return and(
    eq(decisionRecords.organizationId, organizationId),
    query.status ? eq(decisionRecords.status, query.status) : undefined,
    query.category === undefined ? undefined : eq(decisionRecords.category, query.category),
    query.judgement ? eq(decisionRecords.judgement, query.judgement) : undefined,
    query.siteId ? eq(exposureGroups.siteId, query.siteId) : undefined,
    query.outOfDate === undefined ? undefined : query.outOfDate ? outOfDateCondition : not(outOfDateCondition),
    query.reviewBy ? and(eq(decisionRecords.status, 'approved'), lte(decisionRecords.reviewDate, query.reviewBy)) : undefined,
    searchCondition(query.q, [exposureGroups.name, sites.name]),
  );
}

/**
 * The organization's register of decision records: filtered, sorted and paged on the server
 * (services/list.ts), one query for the page and one for the total.
 */
export function listDecisionRecords(db: Tx, organizationId: number, query: DecisionRecordListQuery): ListPage<DecisionRecordListItem> {
  const where = registerCondition(organizationId, query);
  const total =
    db
      .select({ total: count() })
      .from(decisionRecords)
      .innerJoin(exposureGroups, eq(exposureGroups.id, decisionRecords.exposureGroupId))
      .innerJoin(sites, eq(sites.id, exposureGroups.siteId))
      .where(where)
      .get()?.total ?? 0;
  const { limit, offset } = pageWindow(query.page, query.pageSize);
  const rows = selectSummaryRows(db)
    .where(where)
    .orderBy(
      ...orderBy(
        query.sort,
        {
          reviewDate: decisionRecords.reviewDate,
          approvedAt: decisionRecords.approvedAt,
          submittedAt: decisionRecords.submittedAt,
          updatedAt: decisionRecords.updatedAt,
          exposureGroupName: exposureGroups.name,
          siteName: sites.name,
          category: decisionRecords.category,
          status: decisionRecords.status,
        },
        decisionRecords.id,
      ),
    )
    .limit(limit)
    .offset(offset)
    .all();
  const items = rows.map((row) => ({
    ...summaryOf(row.record, row.groupName, row.groupDataVersion, row.drafterName, row.approverName, row.acknowledgements),
    siteId: row.siteId,
    siteName: row.siteName,
  }));
  return pageOf(items, total, query.page, query.pageSize);
}

function summaryOf(
  record: SummaryRecord,
  groupName: string,
  groupDataVersion: number,
  drafterName: string,
  approverName: string | null,
  acknowledgements: number,
): DecisionRecordSummary {
  const open = record.status === 'draft' || record.status === 'returned';
  return {
    id: record.id,
    exposureGroupId: record.exposureGroupId,
    exposureGroupName: groupName,
    status: record.status,
    category: record.category,
    judgement: record.judgement,
    reviewDate: record.reviewDate,
    drafter: { id: record.draftedByUserId, name: drafterName },
    approver: record.approvedByUserId === null ? null : { id: record.approvedByUserId, name: approverName ?? '' },
    submittedAt: record.submittedAt,
    approvedAt: record.approvedAt,
    returnedAt: record.returnedAt,
    outOfDate: record.status === 'approved' && record.dataVersionAtApproval !== null && groupDataVersion > record.dataVersionAtApproval,
    dataChangedSinceDraft: open && groupDataVersion > record.dataVersionAtDraft,
    acknowledgements,
  };
}

const decisionCautions = [
  'Statistics support and never replace the judgement of a qualified hygienist; this record states that judgement and the figures it rests on.',
  'Limits, sampling duties and hearing conservation requirements come from the local regulations that apply; follow them and licensed or certified professional practice.',
  'Small samples give wide limits; check the lognormal fit and the grouping before relying on a category.',
];

function personName(db: Tx, userId: number | null): DecisionPerson | null {
  if (userId === null) return null;
  const row = db.select({ id: users.id, name: users.name }).from(users).where(eq(users.id, userId)).get();
  return row ?? null;
}

/** One record in full, with names, acknowledgements and comments; 404 for another organization's record. */
export function getDecisionRecord(db: Tx, _clock: Clock, organizationId: number, recordId: number): DecisionRecordView {
  const record = recordOrNotFound(db, organizationId, recordId);
  const summary = decisionSummaries(db, organizationId, { groupId: record.exposureGroupId }).find((row) => row.id === recordId)!;
  const group = db.select({ dataVersion: exposureGroups.dataVersion }).from(exposureGroups).where(eq(exposureGroups.id, record.exposureGroupId)).get()!;
  const acknowledgedBy = db
    .select({ id: users.id, name: users.name, at: decisionAcknowledgements.at })
    .from(decisionAcknowledgements)
    .innerJoin(users, eq(users.id, decisionAcknowledgements.userId))
    .where(eq(decisionAcknowledgements.decisionRecordId, recordId))
    .orderBy(asc(decisionAcknowledgements.at))
    .all();
  const comments = db
    .select({ id: decisionComments.id, authorId: users.id, authorName: users.name, body: decisionComments.body, createdAt: decisionComments.createdAt })
    .from(decisionComments)
    .innerJoin(users, eq(users.id, decisionComments.userId))
    .where(eq(decisionComments.decisionRecordId, recordId))
    .orderBy(asc(decisionComments.createdAt), asc(decisionComments.id))
    .all();
  return {
    ...summary,
    rationale: record.rationale,
    actions: record.actions,
    reviewDateSource: record.reviewDateSource,
    prior: record.prior,
    exclusions: record.exclusions,
    frozenInputs: record.frozenInputs,
    dataHash: record.dataHash,
    method: record.method,
    engineVersion: record.engineVersion,
    settings: record.settings,
    figures: record.figures,
    returnedBy: personName(db, record.returnedByUserId),
    returnComment: record.returnComment,
    dataVersionAtDraft: record.dataVersionAtDraft,
    dataVersionAtApproval: record.dataVersionAtApproval,
    groupDataVersion: group.dataVersion,
    supersededAt: record.supersededAt,
    acknowledgedBy,
    comments: comments.map((comment) => ({
      id: comment.id,
      author: { id: comment.authorId, name: comment.authorName },
      body: comment.body,
      createdAt: comment.createdAt,
    })),
    // The assessment's own cautions are kept as frozen; ours add what the record states, without repeating a sentence.
    cautions: record.figures
      ? [...decisionCautions, ...record.figures.cautions.filter((caution) => !decisionCautions.some((own) => own.startsWith(caution.replace(/\.$/, ''))))]
      : decisionCautions,
  };
}

/** The figures compared between consecutive approved records, with their labels. */
const comparedFigures: Array<{ field: string; label: string; read: (figures: FrozenFigures) => number | null }> = [
  { field: 'n', label: 'Results used (n)', read: (figures) => figures.classical.n },
  { field: 'gm', label: 'Geometric mean', read: (figures) => figures.classical.gm },
  { field: 'gsd', label: 'Geometric standard deviation', read: (figures) => figures.classical.gsd },
  { field: 'p95', label: '95th percentile', read: (figures) => figures.classical.p95 },
  { field: 'utl95_95', label: 'Upper tolerance limit (95 %, 95 %)', read: (figures) => figures.classical.utl95_95 },
  { field: 'exceedanceFraction', label: 'Exceedance fraction', read: (figures) => figures.classical.exceedanceFraction },
  { field: 'oel', label: 'OEL judged against', read: (figures) => figures.group.oel },
];

/** What changed from one approved record to the next (category, judgement, review date, the main figures). */
export function decisionChanges(before: DecisionRecordRow, after: DecisionRecordRow): DecisionChange[] {
  const changes: DecisionChange[] = [];
  const push = (field: string, label: string, old: string | number | null, now: string | number | null) => {
    if (old !== now) changes.push({ field, label, before: old, after: now });
  };
  push('category', 'Exposure category', before.category, after.category);
  push('judgement', 'Judgement', before.judgement, after.judgement);
  push('reviewDate', 'Review date', before.reviewDate, after.reviewDate);
  if (before.figures && after.figures) {
    for (const figure of comparedFigures) push(figure.field, figure.label, figure.read(before.figures), figure.read(after.figures));
  }
  push('dataHash', 'Data hash', before.dataHash, after.dataHash);
  return changes;
}

/** A group's records (newest first), the differences between consecutive approved records, and whether to offer a new draft. */
export function listGroupDecisions(db: Db, organizationId: number, groupId: number): GroupDecisions {
  const group = findExposureGroup(db, organizationId, groupId);
  const records = decisionSummaries(db, organizationId, { groupId });
  const approvedRows = db
    .select()
    .from(decisionRecords)
    .where(and(eq(decisionRecords.exposureGroupId, groupId), inArray(decisionRecords.status, ['approved', 'superseded'])))
    .orderBy(asc(decisionRecords.approvedAt), asc(decisionRecords.id))
    .all();
  const history: GroupDecisions['history'] = [];
  for (let index = approvedRows.length - 1; index > 0; index -= 1) {
    history.push({ fromId: approvedRows[index - 1].id, toId: approvedRows[index].id, changes: decisionChanges(approvedRows[index - 1], approvedRows[index]) });
  }
  const open = records.find((record) => record.status === 'draft' || record.status === 'returned');
  const current = records.find((record) => record.status === 'approved');
  let offerReason: string | null = null;
  if (!open) {
    if (!current) offerReason = 'This group has no approved decision record yet.';
    else if (current.outOfDate) offerReason = `Results changed after decision record ${current.id} was approved: it is out of date. Draft a new record.`;
  }
  return { group: { id: group.id, name: group.name, dataVersion: group.dataVersion }, records, history, offerNewDraft: offerReason !== null, offerReason };
}
