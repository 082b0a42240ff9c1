import { and, count, eq, inArray, ne, sql } from 'drizzle-orm';
import { agents, type Agent, type ExposureUnit } from '@schema/agents';
import { exposureGroups, type ExposureGroup, type ExposureGroupCreate, type ExposureGroupUpdate } from '@schema/exposure-groups';
import type { ExposureGroupListQuery, ListPage } from '@schema/list-query';
import { shiftResults } from '@schema/shift-results';
import { sites } from '@schema/sites';
import { groupMemberships } from '@schema/workers';
import { briefScalaReductionFactor } from '@stats/extended-shift';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict, NotFound } from '../errors';
import { agentFromBody, checkUnitFitsAgent, getOelEntry } from './agents';
import { saveAuditedChange, audit, changedFields, fieldError, ownedOrFieldError, ownedOrNotFound, type Actor, type Tx } from './changes';
import { today } from './dates';
import { archivedCondition, orderBy, pageOf, pageWindow, qualified, searchCondition } from './list';

/** The limit a group's results are judged against, after any extended-shift adjustment. */
export interface EffectiveOel {
  value: number;
  unit: ExposureUnit;
  /** The group's OEL before adjustment. */
  baseValue: number;
  reductionFactor: number;
  method: 'none' | 'brief-scala';
  /** In words, with the source. */
  statement: string;
}

/** A group as lists and pages show it. */
export type ExposureGroupView = ExposureGroup & {
  siteName: string;
  agentName: string;
  agentKind: Agent['kind'];
  /** Workers who are members today (the server's date, UTC). */
  memberCount: number;
  validResultCount: number;
  voidResultCount: number;
  effectiveOel: EffectiveOel;
};

/**
 * The OEL after the group's extended-shift adjustment. Brief & Scala (1975) for a chemical 8-hour
 * TWA limit and a shift over 8 h (stats/extended-shift.ts); otherwise the OEL unchanged.
 */
export function effectiveOelOf(group: Pick<ExposureGroup, 'oelValue' | 'oelUnit' | 'shiftHours' | 'extendedShiftAdjustment'>): EffectiveOel {
  if (group.extendedShiftAdjustment === 'brief-scala') {
    const factor = briefScalaReductionFactor(group.shiftHours);
    return {
      value: group.oelValue * factor,
      unit: group.oelUnit,
      baseValue: group.oelValue,
      reductionFactor: factor,
      method: 'brief-scala',
      statement:
        factor === 1
          ? `Shift of ${group.shiftHours} h: no reduction (Brief & Scala 1975 lowers a limit only for shifts over 8 h).`
          : `OEL ${group.oelValue} × ${round(factor, 4)} = ${round(group.oelValue * factor, 6)} for a ${group.shiftHours}-h shift: Brief & Scala (1975) reduction factor (8/h)·(24−h)/16.`,
    };
  }
  return {
    value: group.oelValue,
    unit: group.oelUnit,
    baseValue: group.oelValue,
    reductionFactor: 1,
    method: 'none',
    statement: 'The OEL as set on the group, without an extended-shift adjustment.',
  };
}

function round(value: number, digits: number): number {
  const scale = 10 ** digits;
  return Math.round(value * scale) / scale;
}

const viewColumns = (date: string) => ({
  group: exposureGroups,
  siteName: sites.name,
  agentName: agents.name,
  agentKind: agents.kind,
  memberCount: sql<number>`(select count(distinct ${qualified(groupMemberships.workerId)}) from ${groupMemberships} where ${qualified(groupMemberships.exposureGroupId)} = ${qualified(exposureGroups.id)} and ${qualified(groupMemberships.fromDate)} <= ${date} and (${qualified(groupMemberships.toDate)} is null or ${qualified(groupMemberships.toDate)} >= ${date}))`,
  validResultCount: sql<number>`(select count(*) from ${shiftResults} where ${qualified(shiftResults.exposureGroupId)} = ${qualified(exposureGroups.id)} and ${qualified(shiftResults.status)} = 'valid')`,
  voidResultCount: sql<number>`(select count(*) from ${shiftResults} where ${qualified(shiftResults.exposureGroupId)} = ${qualified(exposureGroups.id)} and ${qualified(shiftResults.status)} = 'void')`,
});

interface ViewRow {
  group: ExposureGroup;
  siteName: string;
  agentName: string;
  agentKind: Agent['kind'];
  memberCount: number;
  validResultCount: number;
  voidResultCount: number;
}
function selectViews(db: Tx, date: string, where: ReturnType<typeof and>) {
  return db
    .select(viewColumns(date))
    .from(exposureGroups)
    .innerJoin(sites, eq(sites.id, exposureGroups.siteId))
    .innerJoin(agents, eq(agents.id, exposureGroups.agentId))
    .where(where);
}
function toView(row: ViewRow): ExposureGroupView {
  const { group, ...rest } = row;
  return { ...group, ...rest, effectiveOel: effectiveOelOf(group) };
}

export function listExposureGroups(db: Db, clock: Clock, organizationId: number, query: ExposureGroupListQuery): ListPage<ExposureGroupView> {
  const where = and(
    eq(exposureGroups.organizationId, organizationId),
    archivedCondition(query.archived, exposureGroups.archived),
    query.siteId ? eq(exposureGroups.siteId, query.siteId) : undefined,
    query.agentId ? eq(exposureGroups.agentId, query.agentId) : undefined,
    searchCondition(query.q, [
      exposureGroups.name,
      exposureGroups.processArea,
      exposureGroups.tasks,
      exposureGroups.jobTitles,
      exposureGroups.exposureProfile,
      sites.name,
      agents.name,
    ]),
  );
  const total =
    db
      .select({ total: count() })
      .from(exposureGroups)
      .innerJoin(sites, eq(sites.id, exposureGroups.siteId))
      .innerJoin(agents, eq(agents.id, exposureGroups.agentId))
      .where(where)
      .get()?.total ?? 0;
  const { limit, offset } = pageWindow(query.page, query.pageSize);
  // The page's ids first, then the member and result counts for those rows only: SQLite evaluates a
  // correlated subquery of the select list for every row it sorts, so selecting the views directly
  // counted results for every group of the organization on each page (slow for thousands of groups).
  const pageIds = db
    .select({ id: exposureGroups.id })
    .from(exposureGroups)
    .innerJoin(sites, eq(sites.id, exposureGroups.siteId))
    .innerJoin(agents, eq(agents.id, exposureGroups.agentId))
    .where(where)
    .orderBy(
      ...orderBy(
        query.sort,
        {
          name: exposureGroups.name,
          siteName: sites.name,
          agentName: agents.name,
          processArea: exposureGroups.processArea,
          shiftHours: exposureGroups.shiftHours,
          resultsChangedAt: exposureGroups.resultsChangedAt,
          createdAt: exposureGroups.createdAt,
          updatedAt: exposureGroups.updatedAt,
        },
        exposureGroups.id,
      ),
    )
    .limit(limit)
    .offset(offset)
    .all()
    .map((row) => row.id);
  const views = new Map(
    (pageIds.length === 0 ? [] : selectViews(db, today(clock), inArray(exposureGroups.id, pageIds)).all()).map((row) => [row.group.id, row] as const),
  );
  const items = pageIds.map((id) => toView(views.get(id)!));
  return pageOf(items, total, query.page, query.pageSize);
}

/** The group row, or 404 (also for another organization's group). */
export function findExposureGroup(db: Tx, organizationId: number, groupId: number): ExposureGroup {
  return ownedOrNotFound(db, exposureGroups, organizationId, groupId, 'exposure group');
}

/** A group named in a request body: 400 naming the field when it is not one of the organization's. */
export function exposureGroupFromBody(db: Tx, organizationId: number, groupId: number, field = 'exposureGroupId'): ExposureGroup {
  return ownedOrFieldError(db, exposureGroups, organizationId, groupId, 'exposure group', field);
}

export function getExposureGroup(db: Tx, clock: Clock, organizationId: number, groupId: number): ExposureGroupView {
  const row = selectViews(db, today(clock), and(eq(exposureGroups.id, groupId), eq(exposureGroups.organizationId, organizationId))).get();
  if (!row) throw new NotFound(`No exposure group ${groupId} in this organization`);
  return toView(row);
}

type GroupFields = Omit<ExposureGroup, 'id' | 'organizationId' | 'archived' | 'dataVersion' | 'resultsChangedAt' | 'createdAt' | 'updatedAt'>;

/**
 * Fills the OEL from the list entry when one is picked, and checks the group's rules that need the
 * database: site and agent of this organization, the entry for the same agent, a unit that fits the
 * agent, a criteria set for noise only, an action level below the OEL, Brief & Scala only for a
 * chemical 8-hour TWA limit.
 */
function resolveGroupFields(
  db: Tx,
  organizationId: number,
  fields: Partial<GroupFields> & Pick<GroupFields, 'siteId' | 'agentId'>,
  changed: { entry: boolean; site: boolean; agent: boolean },
): GroupFields {
  const site = ownedOrFieldError(db, sites, organizationId, fields.siteId, 'site', 'siteId');
  if (changed.site && site.archived) throw fieldError('siteId', `Site "${site.name}" is archived: bring it back first`);
  const agent = agentFromBody(db, organizationId, fields.agentId);
  if (changed.agent && agent.archived) throw fieldError('agentId', `Agent "${agent.name}" is archived: bring it back first`);
  const entryChanged = changed.entry;
  const resolved = { ...fields };
  if (fields.oelEntryId != null && entryChanged) {
    let entry;
    try {
      entry = getOelEntry(db, organizationId, fields.oelEntryId);
    } catch {
      throw fieldError('oelEntryId', `No OEL list entry ${fields.oelEntryId} in this organization`);
    }
    if (entry.agentId !== agent.id)
      throw fieldError('oelEntryId', `OEL list entry ${entry.id} is for "${entry.agentName}", not for the group's agent "${agent.name}"`);
    const fromEntry = { oelValue: entry.value, oelUnit: entry.unit, oelSource: entry.source, oelAveragingTime: entry.averagingTime };
    for (const [key, value] of Object.entries(fromEntry) as Array<[keyof typeof fromEntry, string | number]>) {
      if (fields[key] != null && fields[key] !== value)
        throw fieldError(key, `differs from OEL list entry ${entry.id} (${value}): leave it out to copy the entry, or unlink the entry (oelEntryId: null)`);
    }
    Object.assign(resolved, fromEntry);
  }
  const complete = resolved as GroupFields;
  checkUnitFitsAgent(agent, complete.oelUnit, 'oelUnit');
  if (agent.kind === 'noise' && complete.noiseCriteriaSet == null)
    throw fieldError('noiseCriteriaSet', 'Choose the noise criteria set the group is judged with');
  if (agent.kind !== 'noise' && complete.noiseCriteriaSet != null)
    throw fieldError('noiseCriteriaSet', 'Only noise groups have a criteria set: leave it empty');
  if (complete.actionLevel != null && complete.actionLevel >= complete.oelValue)
    throw fieldError('actionLevel', `The action level (${complete.actionLevel}) must be below the OEL (${complete.oelValue})`);
  if (complete.extendedShiftAdjustment === 'brief-scala' && (agent.kind !== 'chemical' || complete.oelAveragingTime !== '8h-twa'))
    throw fieldError('extendedShiftAdjustment', 'The Brief & Scala adjustment is for a chemical 8-hour TWA limit only');
  return complete;
}

function checkGroupNameFree(db: Tx, siteId: number, name: string, exceptId?: number): void {
  const clash = db
    .select({ id: exposureGroups.id })
    .from(exposureGroups)
    .where(and(eq(exposureGroups.siteId, siteId), eq(exposureGroups.name, name), exceptId === undefined ? undefined : ne(exposureGroups.id, exceptId)))
    .get();
  if (clash) throw new Conflict(`The site already has an exposure group named "${name}" (group ${clash.id})`);
}

const auditedGroupFields = [
  'siteId',
  'name',
  'agentId',
  'oelEntryId',
  'oelValue',
  'oelUnit',
  'oelSource',
  'oelAveragingTime',
  'actionLevel',
  'shiftHours',
  'noiseCriteriaSet',
  'extendedShiftAdjustment',
] as const;

export function createExposureGroup(db: Db, clock: Clock, input: { organizationId: number; actor: Actor; group: ExposureGroupCreate }): ExposureGroupView {
  const now = clock.now();
  const stamp = now.toISOString();
  const id = db.transaction((tx) => {
    const fields = resolveGroupFields(tx, input.organizationId, input.group as GroupFields, { entry: true, site: true, agent: true });
    checkGroupNameFree(tx, fields.siteId, fields.name);
    const row = tx
      .insert(exposureGroups)
      .values({ ...fields, organizationId: input.organizationId, createdAt: stamp, updatedAt: stamp })
      .returning()
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'exposure_group',
      entityId: row.id,
      action: 'created',
      after: Object.fromEntries(auditedGroupFields.map((key) => [key, row[key]])),
      at: now,
    });
    return row.id;
  });
  return getExposureGroup(db, clock, input.organizationId, id);
}

/**
 * Edits a group. Once it has shift results, its agent and OEL unit stay (the results are stored in
 * that unit for that agent): 409. Picking an OEL list entry copies it; archiving keeps everything.
 */
export function updateExposureGroup(
  db: Db,
  clock: Clock,
  input: { organizationId: number; groupId: number; actor: Actor; changes: ExposureGroupUpdate; reason?: string },
): ExposureGroupView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = findExposureGroup(tx, input.organizationId, input.groupId);
    const requested = changedFields(current, input.changes as Partial<ExposureGroup>);
    if (Object.keys(requested.after).length === 0) return;
    const entryChanged = 'oelEntryId' in requested.after;
    const wanted = { ...current, ...(requested.after as Partial<GroupFields>) };
    // A group linked to a list entry whose OEL is then typed over no longer follows that entry.
    const oelTyped = ['oelValue', 'oelUnit', 'oelSource', 'oelAveragingTime'].some((key) => key in requested.after);
    if (!entryChanged && oelTyped) wanted.oelEntryId = null;
    const merged = resolveGroupFields(tx, input.organizationId, wanted, {
      entry: entryChanged,
      site: 'siteId' in requested.after,
      agent: 'agentId' in requested.after,
    });
    const { before, after } = changedFields(current, { ...merged, archived: input.changes.archived ?? current.archived });
    if (Object.keys(after).length === 0) return;
    if ('agentId' in after || 'oelUnit' in after) {
      const results = tx.select({ total: count() }).from(shiftResults).where(eq(shiftResults.exposureGroupId, current.id)).get()?.total ?? 0;
      if (results > 0)
        throw new Conflict(
          `"${current.name}" has ${results} shift result(s) in ${current.oelUnit}: its agent and OEL unit cannot change. Set up a new group instead`,
        );
    }
    if ('name' in after || 'siteId' in after) checkGroupNameFree(tx, merged.siteId, merged.name, current.id);
    saveAuditedChange(tx, exposureGroups, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'exposure_group',
      entityId: current.id,
      reason: input.reason,
      before,
      after,
      at: now,
    });
  });
  return getExposureGroup(db, clock, input.organizationId, input.groupId);
}

/**
 * Marks the group's results as changed: `data_version` + 1 and `results_changed_at` = now. Every
 * write to shift_results calls this in the same transaction (decision records compare versions).
 */
export function touchGroupResults(tx: Tx, groupId: number, now: Date): void {
  tx.update(exposureGroups)
    .set({ dataVersion: sql`${exposureGroups.dataVersion} + 1`, resultsChangedAt: now.toISOString() })
    .where(eq(exposureGroups.id, groupId))
    .run();
}
