import { and, asc, count, eq, inArray } from 'drizzle-orm';
import { agents, exposureUnitLabels, type Agent } from '@schema/agents';
import { exposureGroups, type ExposureGroup } from '@schema/exposure-groups';
import {
  mixtureComponents,
  type MixtureCreate,
  type MixturePlan,
  type MixtureShiftRow,
  type MixtureSkippedShift,
  type MixtureUpdate,
  type MixtureView,
} from '@schema/mixtures';
import { shiftResults } from '@schema/shift-results';
import { workers, type Worker } from '@schema/workers';
import { mixtureIndex } from '@stats/mixture-index';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict, NotFound, Unprocessable } from '../errors';
import { saveAuditedChange, audit, fieldError, ownedOrFieldError, type Actor, type Tx } from './changes';
import { checkAgentNameFree } from './agents';
import { effectiveOelOf, findExposureGroup, touchGroupResults } from './exposure-groups';
import { insertShiftResult, shiftResultWriter } from './shift-results';
import { isMemberOn } from './workers';

/*
 * Mixtures of agents with similar (additive) effects (docs/decisions/023-hearing-protectors-and-mixtures.md).
 * A mixture is an agent of kind `mixture` with its component agents; an exposure group set up for it
 * (OEL 1, unit `index`) gets one shift result per worker-shift: the index Σ Cᵢ/OELᵢ of the
 * components' valid shift results for the same worker on the same date
 * (OSHA 29 CFR 1910.1000(d)(2)(i); stats/mixture-index.ts), so the group statistics judge the
 * index against 1 like any other result.
 */

export const MIXTURE_FORMULA = 'Em = Σ Cᵢ/OELᵢ';
export const MIXTURE_SOURCE = 'OSHA 29 CFR 1910.1000(d)(2)(i) (additive effects; the same formula as the ACGIH TLV booklet’s appendix on mixtures)';
/** Reason written on mixture results replaced by a new computation. */
export const RECOMPUTED_REASON = 'recomputed';

function componentsOf(db: Tx, mixtureId: number): MixtureView['components'] {
  return db
    .select({ id: agents.id, name: agents.name, archived: agents.archived })
    .from(mixtureComponents)
    .innerJoin(agents, eq(agents.id, mixtureComponents.componentAgentId))
    .where(eq(mixtureComponents.mixtureAgentId, mixtureId))
    .orderBy(asc(agents.name))
    .all();
}

function mixtureResultCount(db: Tx, mixtureId: number): number {
  return (
    db
      .select({ total: count() })
      .from(shiftResults)
      .where(and(eq(shiftResults.agentId, mixtureId), eq(shiftResults.status, 'valid')))
      .get()?.total ?? 0
  );
}

function toView(db: Tx, agent: Agent): MixtureView {
  const groupCount = db.select({ total: count() }).from(exposureGroups).where(eq(exposureGroups.agentId, agent.id)).get()?.total ?? 0;
  return {
    id: agent.id,
    name: agent.name,
    notes: agent.notes,
    archived: agent.archived,
    components: componentsOf(db, agent.id),
    groupCount,
    validResultCount: mixtureResultCount(db, agent.id),
  };
}

function findMixture(db: Tx, organizationId: number, mixtureId: number): Agent {
  const agent = db
    .select()
    .from(agents)
    .where(and(eq(agents.id, mixtureId), eq(agents.organizationId, organizationId), eq(agents.kind, 'mixture')))
    .get();
  if (!agent) throw new NotFound(`No mixture ${mixtureId} in this organization`);
  return agent;
}

export function listMixtures(db: Db, organizationId: number): MixtureView[] {
  return db
    .select()
    .from(agents)
    .where(and(eq(agents.organizationId, organizationId), eq(agents.kind, 'mixture')))
    .orderBy(asc(agents.name))
    .all()
    .map((agent) => toView(db, agent));
}

export function getMixture(db: Tx, organizationId: number, mixtureId: number): MixtureView {
  return toView(db, findMixture(db, organizationId, mixtureId));
}

/** Components must be chemicals of the organization, in use (400 naming `componentAgentIds`). */
function checkComponents(db: Tx, organizationId: number, ids: readonly number[]): Agent[] {
  return ids.map((id) => {
    const agent = ownedOrFieldError(db, agents, organizationId, id, 'agent', 'componentAgentIds');
    if (agent.kind !== 'chemical')
      throw fieldError('componentAgentIds', `"${agent.name}" is ${agent.kind === 'noise' ? 'noise' : 'a mixture'}: a mixture's components are chemicals`);
    if (agent.archived) throw fieldError('componentAgentIds', `"${agent.name}" is archived: bring it back first`);
    return agent;
  });
}

/** Defines a mixture: its agent (kind `mixture`) and components, audited. */
export function createMixture(db: Db, clock: Clock, input: { organizationId: number; actor: Actor; mixture: MixtureCreate }): MixtureView {
  const now = clock.now();
  const stamp = now.toISOString();
  return db.transaction((tx) => {
    checkAgentNameFree(tx, input.organizationId, input.mixture.name);
    const components = checkComponents(tx, input.organizationId, input.mixture.componentAgentIds);
    const agent = tx
      .insert(agents)
      .values({
        organizationId: input.organizationId,
        name: input.mixture.name,
        kind: 'mixture',
        notes: input.mixture.notes ?? '',
        createdAt: stamp,
        updatedAt: stamp,
      })
      .returning()
      .get();
    tx.insert(mixtureComponents)
      .values(
        components.map((component) => ({ organizationId: input.organizationId, mixtureAgentId: agent.id, componentAgentId: component.id, createdAt: stamp })),
      )
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'agent',
      entityId: agent.id,
      action: 'created',
      after: { name: agent.name, kind: 'mixture', components: components.map((component) => component.name) },
      at: now,
    });
    return toView(tx, agent);
  });
}

/**
 * Edits a mixture. The components cannot change while valid mixture results exist (they were
 * computed from the old list): void them or recompute after a change is not possible, so the
 * answer is 409 naming the count.
 */
export function updateMixture(
  db: Db,
  clock: Clock,
  input: { organizationId: number; mixtureId: number; actor: Actor; changes: MixtureUpdate; reason?: string },
): MixtureView {
  const now = clock.now();
  const stamp = now.toISOString();
  db.transaction((tx) => {
    const current = findMixture(tx, input.organizationId, input.mixtureId);
    const before: Record<string, unknown> = {};
    const after: Record<string, unknown> = {};
    const set: Partial<Agent> = {};
    if (input.changes.name !== undefined && input.changes.name !== current.name) {
      checkAgentNameFree(tx, input.organizationId, input.changes.name, current.id);
      before.name = current.name;
      after.name = set.name = input.changes.name;
    }
    if (input.changes.notes !== undefined && input.changes.notes !== current.notes) {
      before.notes = current.notes;
      after.notes = set.notes = input.changes.notes;
    }
    if (input.changes.archived !== undefined && input.changes.archived !== current.archived) {
      if (input.changes.archived) {
        const active =
          tx
            .select({ total: count() })
            .from(exposureGroups)
            .where(and(eq(exposureGroups.agentId, current.id), eq(exposureGroups.archived, false)))
            .get()?.total ?? 0;
        if (active > 0) throw new Conflict(`"${current.name}" is the agent of ${active} exposure group(s) in use: archive those first`);
      }
      before.archived = current.archived;
      after.archived = set.archived = input.changes.archived;
    }
    if (input.changes.componentAgentIds !== undefined) {
      const old = componentsOf(tx, current.id).map((component) => component.id);
      const next = [...input.changes.componentAgentIds].sort((a, b) => a - b);
      if (old.join(',') !== next.join(',')) {
        const results = mixtureResultCount(tx, current.id);
        if (results > 0)
          throw new Conflict(`"${current.name}" has ${results} valid mixture result(s) computed from its components: void them before changing the components`);
        const components = checkComponents(tx, input.organizationId, next);
        tx.delete(mixtureComponents).where(eq(mixtureComponents.mixtureAgentId, current.id)).run();
        tx.insert(mixtureComponents)
          .values(
            components.map((component) => ({
              organizationId: input.organizationId,
              mixtureAgentId: current.id,
              componentAgentId: component.id,
              createdAt: stamp,
            })),
          )
          .run();
        before.componentAgentIds = old;
        after.componentAgentIds = next;
      }
    }
    if (Object.keys(after).length === 0) return;
    saveAuditedChange(tx, agents, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'agent',
      entityId: current.id,
      reason: input.reason,
      before,
      after,
      set: set,
      at: now,
    });
  });
  return getMixture(db, input.organizationId, input.mixtureId);
}

// ---------------------------------------------------------------- computing the group's results

export const NON_DETECT_RULE =
  'A non-detect component counts at its detection limit (the upper bound, the cautious choice) and the record keeps the lower bound with it at 0; when every component is a non-detect the index is a non-detect below Σ LOD/OEL.';

interface ComponentResult {
  id: number;
  agentId: number;
  workerId: number;
  date: string;
  value: number;
  unit: ExposureGroup['oelUnit'];
  nonDetect: boolean;
  group: ExposureGroup;
}

function mixtureGroup(db: Tx, organizationId: number, groupId: number): { group: ExposureGroup; mixture: Agent; components: Agent[] } {
  const group = findExposureGroup(db, organizationId, groupId);
  const mixture = db.select().from(agents).where(eq(agents.id, group.agentId)).get()!;
  if (mixture.kind !== 'mixture')
    throw new Unprocessable(`"${group.name}" is not a mixture group: its agent "${mixture.name}" is ${mixture.kind === 'noise' ? 'noise' : 'a chemical'}`);
  if (group.oelValue !== 1 || group.oelUnit !== 'index')
    throw new Unprocessable(
      `"${group.name}" must be judged against 1 ${exposureUnitLabels.index} (its OEL is ${group.oelValue} ${exposureUnitLabels[group.oelUnit]}): the mixture index has a limit of 1`,
    );
  if (group.archived) throw new Unprocessable(`"${group.name}" is archived: bring it back before computing results`);
  const ids = componentsOf(db, mixture.id).map((component) => component.id);
  const components = ids.length === 0 ? [] : db.select().from(agents).where(inArray(agents.id, ids)).orderBy(asc(agents.name)).all();
  return { group, mixture, components };
}

/** Works out what computing would write, skip and replace — nothing is written. */
export function planMixtureResults(db: Tx, organizationId: number, groupId: number): MixturePlan {
  const { group, mixture, components } = mixtureGroup(db, organizationId, groupId);
  const componentIds = components.map((component) => component.id);
  const groupCache = new Map<number, ExposureGroup>();
  const groupOf = (id: number) => {
    let found = groupCache.get(id);
    if (!found) groupCache.set(id, (found = db.select().from(exposureGroups).where(eq(exposureGroups.id, id)).get()!));
    return found;
  };
  const componentResults: ComponentResult[] = db
    .select({
      id: shiftResults.id,
      agentId: shiftResults.agentId,
      workerId: shiftResults.workerId,
      date: shiftResults.date,
      value: shiftResults.value,
      unit: shiftResults.unit,
      nonDetect: shiftResults.nonDetect,
      groupId: shiftResults.exposureGroupId,
    })
    .from(shiftResults)
    .where(and(eq(shiftResults.organizationId, organizationId), eq(shiftResults.status, 'valid'), inArray(shiftResults.agentId, componentIds)))
    .orderBy(asc(shiftResults.date), asc(shiftResults.id))
    .all()
    .map(({ groupId: componentGroupId, ...result }) => ({ ...result, group: groupOf(componentGroupId) }));

  const byShift = new Map<string, ComponentResult[]>();
  for (const result of componentResults) {
    const key = `${result.workerId}|${result.date}`;
    byShift.set(key, [...(byShift.get(key) ?? []), result]);
  }
  const existing = db
    .select({
      id: shiftResults.id,
      workerId: shiftResults.workerId,
      date: shiftResults.date,
      value: shiftResults.value,
      source: shiftResults.source,
      code: workers.code,
    })
    .from(shiftResults)
    .innerJoin(workers, eq(workers.id, shiftResults.workerId))
    .where(and(eq(shiftResults.exposureGroupId, group.id), eq(shiftResults.status, 'valid')))
    .orderBy(asc(shiftResults.date), asc(workers.code))
    .all();
  const otherSources = new Map(existing.filter((row) => row.source !== 'mixture').map((row) => [`${row.workerId}|${row.date}`, row]));
  const workerCache = new Map<number, Worker>();
  const workerOf = (id: number) => {
    let found = workerCache.get(id);
    if (!found) workerCache.set(id, (found = db.select().from(workers).where(eq(workers.id, id)).get()!));
    return found;
  };

  const rows: MixtureShiftRow[] = [];
  const skipped: MixtureSkippedShift[] = [];
  const keys = [...byShift.keys()].sort((a, b) => {
    const [workerA, dateA] = a.split('|');
    const [workerB, dateB] = b.split('|');
    return dateA! === dateB! ? workerOf(Number(workerA)).code.localeCompare(workerOf(Number(workerB)).code) : dateA! < dateB! ? -1 : 1;
  });
  for (const key of keys) {
    const found = byShift.get(key)!;
    const worker = workerOf(found[0]!.workerId);
    const date = found[0]!.date;
    // Shifts of workers outside the mixture group on that date are not this group's business.
    if (!isMemberOn(db, worker.id, group.id, date)) continue;
    const skip = (reason: string, missing: string[] = []) => skipped.push({ workerCode: worker.code, date, reason, missing });
    const other = otherSources.get(key);
    if (other) {
      skip(`already has a valid ${other.source} result in "${group.name}" (result ${other.id}): void it to compute the mixture index`);
      continue;
    }
    const missing = components.filter((component) => !found.some((result) => result.agentId === component.id)).map((component) => component.name);
    if (missing.length > 0) {
      skip(`no valid result for ${missing.join(', ')} on this shift: the index needs every component`, missing);
      continue;
    }
    const doubled = components.filter((component) => found.filter((result) => result.agentId === component.id).length > 1);
    if (doubled.length > 0) {
      skip(`${doubled.map((component) => component.name).join(', ')} has valid results in more than one group on this shift: void the one that does not apply`);
      continue;
    }
    const ordered = components.map((component) => found.find((result) => result.agentId === component.id)!);
    const wrongUnit = ordered.find((result) => result.unit !== result.group.oelUnit);
    if (wrongUnit) {
      skip(`result ${wrongUnit.id} is in ${exposureUnitLabels[wrongUnit.unit]} but its group's OEL is in ${exposureUnitLabels[wrongUnit.group.oelUnit]}`);
      continue;
    }
    const parts = ordered.map((result) => ({ value: result.value, nonDetect: result.nonDetect, oel: effectiveOelOf(result.group).value }));
    const computed = mixtureIndex(parts);
    const detail = ordered.map((result, position) => ({
      agentId: result.agentId,
      agentName: components[position]!.name,
      resultId: result.id,
      exposureGroupId: result.group.id,
      value: result.value,
      unit: result.unit,
      nonDetect: result.nonDetect,
      oelValue: parts[position]!.oel,
      ratio: computed.ratios[position]!,
    }));
    const terms = detail
      .map((part) => `${part.nonDetect ? '<' : ''}${sig(part.value)}/${sig(part.oelValue)} ${exposureUnitLabels[part.unit]} (${part.agentName})`)
      .join(' + ');
    const flags: string[] = [];
    if (computed.nonDetectComponents > 0 && !computed.allNonDetect) {
      flags.push(
        `${computed.nonDetectComponents} of ${parts.length} components were non-detects, counted at their detection limit; with them at 0 the index would be ${sig(computed.lowerBound)}`,
      );
    }
    rows.push({
      workerId: worker.id,
      workerCode: worker.code,
      date,
      index: computed.index,
      nonDetect: computed.allNonDetect,
      lowerBound: computed.lowerBound,
      components: detail,
      statement: `Mixture index ${MIXTURE_FORMULA} = ${terms} = ${computed.allNonDetect ? '<' : ''}${sig(computed.index)} (${MIXTURE_SOURCE}).`,
      flags,
    });
  }
  return {
    group: { id: group.id, name: group.name },
    mixture: { id: mixture.id, name: mixture.name, components: components.map((component) => component.name) },
    formula: MIXTURE_FORMULA,
    source: MIXTURE_SOURCE,
    nonDetectRule: NON_DETECT_RULE,
    rows,
    skipped,
    replaces: existing.filter((row) => row.source === 'mixture').map((row) => ({ id: row.id, workerCode: row.code, date: row.date, value: row.value })),
  };
}

function sig(value: number): string {
  return String(Number(value.toPrecision(4)));
}

/**
 * Computes and stores the group's mixture results in one transaction: valid mixture results already
 * there are voided with the reason "recomputed" (never deleted), then one result per shift of the
 * plan is written through insertShiftResult (audited, data version moved). Answers the plan written.
 */
export function computeMixtureResults(
  db: Db,
  clock: Clock,
  input: { organizationId: number; groupId: number; actor: Actor },
): MixturePlan & { written: number; voided: number } {
  const now = clock.now();
  const stamp = now.toISOString();
  return db.transaction((tx) => {
    const plan = planMixtureResults(tx, input.organizationId, input.groupId);
    if (plan.rows.length === 0 && plan.replaces.length === 0) {
      throw new Unprocessable(
        `Nothing to compute for "${plan.group.name}": no shift of its members has a valid result for every component (${plan.mixture.components.join(', ')})`,
        {
          skipped: plan.skipped,
        },
      );
    }
    const group = findExposureGroup(tx, input.organizationId, input.groupId);
    const mixture = tx.select().from(agents).where(eq(agents.id, group.agentId)).get()!;
    for (const old of plan.replaces) {
      tx.update(shiftResults)
        .set({ status: 'void', voidReason: RECOMPUTED_REASON, voidedByUserId: input.actor?.id ?? null, voidedAt: stamp, updatedAt: stamp })
        .where(eq(shiftResults.id, old.id))
        .run();
      audit(tx, {
        organizationId: input.organizationId,
        actor: input.actor,
        entityType: 'shift_result',
        entityId: old.id,
        action: 'voided',
        reason: RECOMPUTED_REASON,
        before: { status: 'valid' },
        after: { status: 'void' },
        at: now,
      });
    }
    // One prepared writer for every row; the group's data version moves once for the whole recompute.
    const writer = shiftResultWriter(tx);
    for (const row of plan.rows) {
      const worker = tx.select().from(workers).where(eq(workers.id, row.workerId)).get()!;
      insertShiftResult(
        tx,
        now,
        input.actor,
        {
          organizationId: input.organizationId,
          group,
          worker,
          agent: mixture,
          date: row.date,
          value: row.index,
          nonDetect: row.nonDetect,
          detectionLimit: row.nonDetect ? row.index : null,
          source: 'mixture',
          details: {
            statement: row.statement,
            mixture: {
              mixtureId: mixture.id,
              formula: MIXTURE_FORMULA,
              source: MIXTURE_SOURCE,
              components: row.components,
              lowerBound: row.lowerBound,
              upperBound: row.index,
            },
            flags: row.flags,
          },
        },
        { touchGroup: false, writer },
      );
    }
    if (plan.replaces.length > 0 || plan.rows.length > 0) touchGroupResults(tx, group.id, now);
    return { ...plan, written: plan.rows.length, voided: plan.replaces.length };
  });
}
