import { and, asc, desc, eq, gte, lte } from 'drizzle-orm';
import { agents } from '@schema/agents';
import type { ExposureGroup } from '@schema/exposure-groups';
import { organizations } from '@schema/organizations';
import {
  plannedPicks,
  samplingGuidance,
  samplingPlans,
  type SamplingPlan,
  type SamplingPlanCreate,
  type SamplingPlanRedraw,
  type SamplingPlanUpdate,
} from '@schema/sampling-plans';
import { shiftResults } from '@schema/shift-results';
import { sites } from '@schema/sites';
import { groupMemberships, workers } from '@schema/workers';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict } from '../errors';
import { archiveAction, audit, changedFields, fieldError, ownedOrNotFound, type Actor, type Tx } from './changes';
import { weekdayOf } from './dates';
import { effectiveOelOf, findExposureGroup } from './exposure-groups';
import { candidateShifts, drawShifts, newSeed } from './sampling-draw';
import { workerReference, type NameAccess, type WorkerReference } from './workers';

/** Cautions shown wherever plans and results are (PRODUCT.md "Cautions shown in the product"). */
export const cautions = [
  'Statistics support and never replace the judgement of a qualified hygienist.',
  'Limits, sampling duties and hearing conservation requirements come from the local regulations that apply; follow them and licensed or certified professional practice.',
] as const;

export interface PlanPick {
  id: number;
  position: number;
  date: string;
  weekday: string;
  worker: WorkerReference;
  /** A valid shift result exists for this worker and date in the group. */
  done: boolean;
  resultId: number | null;
}

export interface PlanProgress {
  targetCount: number;
  picked: number;
  done: number;
  remaining: number;
  /** done / targetCount, in % (0–100, rounded down). */
  percentOfTarget: number;
  /** Valid results of the group between the plan's dates, picked or not. */
  validResultsInWindow: number;
  /** Of those, the ones on a worker-shift the plan did not pick. */
  unplannedResultsInWindow: number;
}

export type PlanSummary = Omit<SamplingPlan, 'organizationId'> & { exposureGroupName: string; progress: PlanProgress; warnings: string[] };
export type PlanView = PlanSummary & { picks: PlanPick[]; guidance: typeof samplingGuidance };

/** The plan row, or 404 (also for another organization's plan). */
function findPlan(db: Tx, organizationId: number, planId: number): SamplingPlan {
  return ownedOrNotFound(db, samplingPlans, organizationId, planId, 'sampling plan');
}

/** Draws the plan's picks for its current seed and parameters and stores them as draw `draw`. */
function storeDraw(tx: Tx, plan: SamplingPlan): number {
  const periods = tx
    .select({ workerId: groupMemberships.workerId, workerCode: workers.code, fromDate: groupMemberships.fromDate, toDate: groupMemberships.toDate })
    .from(groupMemberships)
    .innerJoin(workers, eq(workers.id, groupMemberships.workerId))
    .where(and(eq(groupMemberships.exposureGroupId, plan.exposureGroupId), eq(workers.archived, false)))
    .all();
  const candidates = candidateShifts(periods, plan);
  const picks = drawShifts(candidates, plan.targetCount, plan.seed);
  for (const pick of picks) {
    tx.insert(plannedPicks)
      .values({
        organizationId: plan.organizationId,
        samplingPlanId: plan.id,
        draw: plan.draw,
        workerId: pick.workerId,
        date: pick.date,
        position: pick.position,
      })
      .run();
  }
  tx.update(samplingPlans).set({ availableShifts: candidates.length }).where(eq(samplingPlans.id, plan.id)).run();
  return candidates.length;
}

function warningsFor(plan: SamplingPlan, picked: number): string[] {
  const warnings: string[] = [];
  if (plan.availableShifts === 0)
    warnings.push(
      `The group has no members on the plan's ${plan.includeWeekends ? '' : 'working '}days from ${plan.startDate} to ${plan.endDate}: add members, then redraw.`,
    );
  else if (picked < plan.targetCount)
    warnings.push(
      `Only ${plan.availableShifts} worker-shifts are available from ${plan.startDate} to ${plan.endDate}; the plan picks all of them, ${plan.targetCount - picked} short of the target.`,
    );
  if (plan.targetCount < samplingGuidance.defaultTargetCount)
    warnings.push('Fewer than 6 results allow only the preliminary test of EN 689:2018, not its statistical test.');
  return warnings;
}

function picksOf(db: Tx, plan: SamplingPlan, access: NameAccess): { picks: PlanPick[]; progress: PlanProgress } {
  const rows = db
    .select({ pick: plannedPicks, worker: workers })
    .from(plannedPicks)
    .innerJoin(workers, eq(workers.id, plannedPicks.workerId))
    .where(and(eq(plannedPicks.samplingPlanId, plan.id), eq(plannedPicks.draw, plan.draw)))
    .orderBy(asc(plannedPicks.date), asc(workers.code))
    .all();
  const results = db
    .select({ id: shiftResults.id, workerId: shiftResults.workerId, date: shiftResults.date })
    .from(shiftResults)
    .where(
      and(
        eq(shiftResults.exposureGroupId, plan.exposureGroupId),
        eq(shiftResults.status, 'valid'),
        gte(shiftResults.date, plan.startDate),
        lte(shiftResults.date, plan.endDate),
      ),
    )
    .all();
  const resultByShift = new Map(results.map((result) => [`${result.workerId}|${result.date}`, result.id]));
  const picks = rows.map(({ pick, worker }) => {
    const resultId = resultByShift.get(`${pick.workerId}|${pick.date}`) ?? null;
    return {
      id: pick.id,
      position: pick.position,
      date: pick.date,
      weekday: weekdayOf(pick.date),
      worker: workerReference(worker, access),
      done: resultId !== null,
      resultId,
    };
  });
  const pickedShifts = new Set(rows.map(({ pick }) => `${pick.workerId}|${pick.date}`));
  const done = picks.filter((pick) => pick.done).length;
  return {
    picks,
    progress: {
      targetCount: plan.targetCount,
      picked: picks.length,
      done,
      remaining: picks.length - done,
      percentOfTarget: Math.min(100, Math.floor((100 * done) / plan.targetCount)),
      validResultsInWindow: results.length,
      unplannedResultsInWindow: results.filter((result) => !pickedShifts.has(`${result.workerId}|${result.date}`)).length,
    },
  };
}

function summarize(plan: SamplingPlan, groupName: string, picksAndProgress: { picks: PlanPick[]; progress: PlanProgress }): PlanSummary {
  const { organizationId: _organizationId, ...rest } = plan;
  return { ...rest, exposureGroupName: groupName, progress: picksAndProgress.progress, warnings: warningsFor(plan, picksAndProgress.picks.length) };
}

export function getSamplingPlan(db: Tx, organizationId: number, planId: number, access: NameAccess): PlanView {
  const plan = findPlan(db, organizationId, planId);
  const group = findExposureGroup(db, organizationId, plan.exposureGroupId);
  const picksAndProgress = picksOf(db, plan, access);
  return { ...summarize(plan, group.name, picksAndProgress), picks: picksAndProgress.picks, guidance: samplingGuidance };
}

/** The group's plans, newest first (archived ones only when asked). */
export function listGroupPlans(db: Tx, organizationId: number, groupId: number, archived: 'false' | 'true' | 'all', access: NameAccess): PlanSummary[] {
  const group = findExposureGroup(db, organizationId, groupId);
  return db
    .select()
    .from(samplingPlans)
    .where(and(eq(samplingPlans.exposureGroupId, group.id), archived === 'all' ? undefined : eq(samplingPlans.archived, archived === 'true')))
    .orderBy(desc(samplingPlans.createdAt), desc(samplingPlans.id))
    .all()
    .map((plan) => summarize(plan, group.name, picksOf(db, plan, access)));
}

/** The plan the group page shows: the newest plan in use, or null. */
export function currentPlanOf(db: Tx, organizationId: number, groupId: number, access: NameAccess): PlanView | null {
  const plan = db
    .select({ id: samplingPlans.id })
    .from(samplingPlans)
    .where(and(eq(samplingPlans.exposureGroupId, groupId), eq(samplingPlans.organizationId, organizationId), eq(samplingPlans.archived, false)))
    .orderBy(desc(samplingPlans.createdAt), desc(samplingPlans.id))
    .get();
  return plan ? getSamplingPlan(db, organizationId, plan.id, access) : null;
}

function planAuditFields(plan: SamplingPlan) {
  return {
    exposureGroupId: plan.exposureGroupId,
    targetCount: plan.targetCount,
    startDate: plan.startDate,
    endDate: plan.endDate,
    includeWeekends: plan.includeWeekends,
    seed: plan.seed,
    draw: plan.draw,
  };
}

/**
 * Creates a plan for a group and draws its picks from the seed (made here unless given). The
 * group must be in use; a plan with fewer worker-shifts than its target picks them all and says so.
 */
export function createSamplingPlan(
  db: Db,
  clock: Clock,
  input: { organizationId: number; groupId: number; actor: Actor; plan: SamplingPlanCreate },
  access: NameAccess,
): PlanView {
  const now = clock.now();
  const stamp = now.toISOString();
  const id = db.transaction((tx) => {
    const group = findExposureGroup(tx, input.organizationId, input.groupId);
    if (group.archived) throw new Conflict(`Exposure group "${group.name}" is archived: bring it back before planning it`);
    const plan = tx
      .insert(samplingPlans)
      .values({
        organizationId: input.organizationId,
        exposureGroupId: group.id,
        title: input.plan.title ?? '',
        targetCount: input.plan.targetCount ?? samplingGuidance.defaultTargetCount,
        startDate: input.plan.startDate,
        endDate: input.plan.endDate,
        includeWeekends: input.plan.includeWeekends ?? false,
        seed: input.plan.seed ?? newSeed(),
        notes: input.plan.notes ?? '',
        createdByUserId: input.actor?.id ?? null,
        createdAt: stamp,
        updatedAt: stamp,
      })
      .returning()
      .get();
    const available = storeDraw(tx, plan);
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'sampling_plan',
      entityId: plan.id,
      action: 'created',
      after: { ...planAuditFields(plan), availableShifts: available },
      at: now,
    });
    return plan.id;
  });
  return getSamplingPlan(db, input.organizationId, id, access);
}

const drawParameters = ['targetCount', 'startDate', 'endDate', 'includeWeekends'] as const;

/**
 * Edits a plan. A new target, window or weekend choice makes a new draw with the same seed (the
 * earlier draw's picks are kept, no longer current); title, notes and archiving do not redraw.
 */
export function updateSamplingPlan(
  db: Db,
  clock: Clock,
  input: { organizationId: number; planId: number; actor: Actor; changes: SamplingPlanUpdate; reason?: string },
  access: NameAccess,
): PlanView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = findPlan(tx, input.organizationId, input.planId);
    const { before, after } = changedFields(current, input.changes as Partial<SamplingPlan>);
    if (Object.keys(after).length === 0) return;
    const merged = { ...current, ...(after as Partial<SamplingPlan>) };
    if (merged.endDate < merged.startDate) {
      throw fieldError(
        'startDate' in after ? 'startDate' : 'endDate',
        `The plan would end (${merged.endDate}) before it starts (${merged.startDate}): change both dates together`,
      );
    }
    const redraw = drawParameters.some((key) => key in after);
    const next = { ...merged, draw: redraw ? current.draw + 1 : current.draw, updatedAt: now.toISOString() };
    tx.update(samplingPlans)
      .set({ ...(after as Partial<SamplingPlan>), draw: next.draw, updatedAt: next.updatedAt })
      .where(eq(samplingPlans.id, current.id))
      .run();
    if (redraw) storeDraw(tx, next);
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'sampling_plan',
      entityId: current.id,
      action: archiveAction(after) ?? (redraw ? 'updated_and_redrawn' : 'updated'),
      reason: input.reason,
      before: redraw ? { ...before, draw: current.draw } : before,
      after: redraw ? { ...after, draw: next.draw, seed: current.seed } : after,
      at: now,
    });
  });
  return getSamplingPlan(db, input.organizationId, input.planId, access);
}

/** Redraws the picks with a new seed (audited with both seeds and the reason). */
export function redrawSamplingPlan(
  db: Db,
  clock: Clock,
  input: { organizationId: number; planId: number; actor: Actor; redraw: SamplingPlanRedraw },
  access: NameAccess,
): PlanView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = findPlan(tx, input.organizationId, input.planId);
    if (current.archived) throw new Conflict('The plan is archived: bring it back before redrawing it');
    const seed = input.redraw.seed ?? newSeed(current.seed);
    if (seed === current.seed) throw new Conflict(`The plan already uses seed ${seed}: a redraw needs a different seed`);
    const next = { ...current, seed, draw: current.draw + 1, updatedAt: now.toISOString() };
    tx.update(samplingPlans).set({ seed, draw: next.draw, updatedAt: next.updatedAt }).where(eq(samplingPlans.id, current.id)).run();
    storeDraw(tx, next);
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'sampling_plan',
      entityId: current.id,
      action: 'redrawn',
      reason: input.redraw.reason ?? null,
      before: { seed: current.seed, draw: current.draw },
      after: { seed, draw: next.draw },
      at: now,
    });
  });
  return getSamplingPlan(db, input.organizationId, input.planId, access);
}

/** Blanks the field sheet leaves for the person who samples, by kind of agent. */
const fieldsToRecord = {
  chemical: [
    'Sample id',
    'Sampler / pump id',
    'Flow rate before (L/min)',
    'Flow rate after (L/min)',
    'Start time',
    'End time',
    'Tasks and conditions during the shift',
    'Controls and protective equipment in use',
    'Initials',
  ],
  noise: [
    'Dosimeter id',
    'Calibration before (dB)',
    'Calibration after (dB)',
    'Start time',
    'End time',
    'Tasks and conditions during the shift',
    'Hearing protection worn',
    'Initials',
  ],
} as const;

/**
 * Everything the printable field sheet shows: who, what and where, the limit, the picks in date
 * order with blanks to fill in, instructions and cautions.
 */
export function fieldSheet(db: Db, clock: Clock, organizationId: number, planId: number, access: NameAccess) {
  const plan = getSamplingPlan(db, organizationId, planId, access);
  const group: ExposureGroup = findExposureGroup(db, organizationId, plan.exposureGroupId);
  const organization = db.select({ name: organizations.name }).from(organizations).where(eq(organizations.id, organizationId)).get()!;
  const site = db.select({ name: sites.name }).from(sites).where(eq(sites.id, group.siteId)).get()!;
  const agent = db.select().from(agents).where(eq(agents.id, group.agentId)).get()!;
  return {
    generatedAt: clock.now().toISOString(),
    organization: { name: organization.name },
    site: { id: group.siteId, name: site.name },
    group: {
      id: group.id,
      name: group.name,
      processArea: group.processArea,
      jobTitles: group.jobTitles,
      tasks: group.tasks,
      shiftHours: group.shiftHours,
      actionLevel: group.actionLevel,
      noiseCriteriaSet: group.noiseCriteriaSet,
      oel: { value: group.oelValue, unit: group.oelUnit, source: group.oelSource, averagingTime: group.oelAveragingTime },
      effectiveOel: effectiveOelOf(group),
    },
    agent: { id: agent.id, name: agent.name, kind: agent.kind, casNumber: agent.casNumber },
    plan: {
      id: plan.id,
      title: plan.title,
      startDate: plan.startDate,
      endDate: plan.endDate,
      targetCount: plan.targetCount,
      includeWeekends: plan.includeWeekends,
      seed: plan.seed,
      draw: plan.draw,
      progress: plan.progress,
      warnings: plan.warnings,
    },
    rows: plan.picks,
    // A mixture's components are sampled as chemicals (docs/decisions/023-hearing-protectors-and-mixtures.md).
    fieldsToRecord: fieldsToRecord[agent.kind === 'noise' ? 'noise' : 'chemical'],
    instructions: [
      'Sample the whole shift of the worker on the date shown; if that shift cannot be sampled, note why and ask for a replacement pick rather than choosing another worker yourself.',
      'Record the times the sampler was switched on and off; for several samples in one shift, record each one.',
      agent.kind === 'noise'
        ? 'Check the dosimeter calibration before and after the shift and record both readings.'
        : 'Check the flow rate before and after sampling and record both; note any blank or spare samples sent to the lab.',
    ],
    cautions,
  };
}
