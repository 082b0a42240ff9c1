import { and, count, eq, sql } from 'drizzle-orm';
import {
  agents,
  exposureUnitLabels,
  oelEntries,
  unitsForAgentKind,
  type Agent,
  type AgentCreate,
  type AgentUpdate,
  type ExposureUnit,
  type OelEntry,
  type OelEntryCreate,
  type OelEntryUpdate,
} from '@schema/agents';
import { exposureGroups } from '@schema/exposure-groups';
import type { AgentListQuery, ListPage, OelEntryListQuery } from '@schema/list-query';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict, NotFound } from '../errors';
import {
  saveAuditedChange,
  audit,
  changedFields,
  fieldError,
  fieldErrors,
  ownedOrFieldError,
  ownedOrNotFound,
  sameNameRow,
  type Actor,
  type Tx,
} from './changes';
import { archivedCondition, orderBy, pageOf, pageWindow, qualified, searchCondition } from './list';

/** An agent with the number of groups (in use) and OEL list entries (in use) that refer to it. */
export type AgentView = Agent & { exposureGroupCount: number; oelEntryCount: number };
/** An OEL list entry with its agent's name and kind. */
export type OelEntryView = OelEntry & { agentName: string; agentKind: Agent['kind'] };

const groupsOfAgent = sql<number>`(select count(*) from ${exposureGroups} where ${qualified(exposureGroups.agentId)} = ${qualified(agents.id)} and ${qualified(exposureGroups.archived)} = 0)`;
const entriesOfAgent = sql<number>`(select count(*) from ${oelEntries} where ${qualified(oelEntries.agentId)} = ${qualified(agents.id)} and ${qualified(oelEntries.archived)} = 0)`;

export function listAgents(db: Db, organizationId: number, query: AgentListQuery): ListPage<AgentView> {
  const where = and(
    eq(agents.organizationId, organizationId),
    archivedCondition(query.archived, agents.archived),
    query.kind ? eq(agents.kind, query.kind) : undefined,
    searchCondition(query.q, [agents.name, agents.casNumber, agents.notes]),
  );
  const total = db.select({ total: count() }).from(agents).where(where).get()?.total ?? 0;
  const { limit, offset } = pageWindow(query.page, query.pageSize);
  const items = db
    .select({ agent: agents, exposureGroupCount: groupsOfAgent, oelEntryCount: entriesOfAgent })
    .from(agents)
    .where(where)
    .orderBy(
      ...orderBy(
        query.sort,
        { name: agents.name, kind: agents.kind, casNumber: agents.casNumber, createdAt: agents.createdAt, updatedAt: agents.updatedAt },
        agents.id,
      ),
    )
    .limit(limit)
    .offset(offset)
    .all()
    .map((row) => ({ ...row.agent, exposureGroupCount: row.exposureGroupCount, oelEntryCount: row.oelEntryCount }));
  return pageOf(items, total, query.page, query.pageSize);
}

/** The agent, or 404. */
export function findAgent(db: Tx, organizationId: number, agentId: number): Agent {
  return ownedOrNotFound(db, agents, organizationId, agentId, 'agent');
}

export function getAgent(db: Db, organizationId: number, agentId: number): AgentView {
  const agent = findAgent(db, organizationId, agentId);
  const row = db.select({ exposureGroupCount: groupsOfAgent, oelEntryCount: entriesOfAgent }).from(agents).where(eq(agents.id, agent.id)).get()!;
  return { ...agent, ...row };
}

/** 409 when another agent (chemical, noise or mixture) of the organization has this name. */
export function checkAgentNameFree(db: Tx, organizationId: number, name: string, exceptId?: number): void {
  const clash = sameNameRow(db, agents, organizationId, name, exceptId);
  if (clash !== undefined) throw new Conflict(`An agent named "${name}" already exists in this organization (agent ${clash})`);
}

export function createAgent(db: Db, clock: Clock, input: { organizationId: number; actor: Actor; agent: AgentCreate }): AgentView {
  const now = clock.now();
  const stamp = now.toISOString();
  return db.transaction((tx) => {
    checkAgentNameFree(tx, input.organizationId, input.agent.name);
    const row = tx
      .insert(agents)
      .values({
        organizationId: input.organizationId,
        name: input.agent.name,
        kind: input.agent.kind,
        casNumber: input.agent.casNumber || null,
        molecularWeight: input.agent.molecularWeight ?? null,
        notes: input.agent.notes ?? '',
        createdAt: stamp,
        updatedAt: stamp,
      })
      .returning()
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'agent',
      entityId: row.id,
      action: 'created',
      after: { name: row.name, kind: row.kind, casNumber: row.casNumber, molecularWeight: row.molecularWeight },
      at: now,
    });
    return { ...row, exposureGroupCount: 0, oelEntryCount: 0 };
  });
}

/**
 * Edits an agent. Noise has no CAS number or molecular weight; the kind cannot change once groups
 * or OEL entries refer to the agent (their units and statistics depend on it); an agent in use by
 * groups is not archived. A new molecular weight applies to later conversions only: stored results
 * keep the weight they were converted with (in their details).
 */
export function updateAgent(
  db: Db,
  clock: Clock,
  input: { organizationId: number; agentId: number; actor: Actor; changes: AgentUpdate; reason?: string },
): AgentView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = findAgent(tx, input.organizationId, input.agentId);
    const changes = { ...input.changes };
    if (changes.casNumber === '') changes.casNumber = null;
    const { before, after } = changedFields(current, changes);
    if (Object.keys(after).length === 0) return;
    const merged = { ...current, ...after } as Agent;
    if (merged.kind === 'noise') {
      const fields: Record<string, string> = {};
      if (merged.casNumber != null) fields.casNumber = 'Noise has no CAS number';
      if (merged.molecularWeight != null) fields.molecularWeight = 'Noise has no molecular weight';
      if (Object.keys(fields).length > 0) throw fieldErrors(fields);
    }
    const usage = getAgentUsage(tx, current.id);
    if (after.kind !== undefined && usage.groups + usage.entries > 0) {
      throw new Conflict(
        `The kind of "${current.name}" cannot change: ${usage.groups} exposure group(s) and ${usage.entries} OEL list entr${usage.entries === 1 ? 'y' : 'ies'} refer to it`,
      );
    }
    if (after.archived === true && usage.activeGroups > 0) {
      throw new Conflict(`"${current.name}" is the agent of ${usage.activeGroups} exposure group(s) in use: archive those first`);
    }
    if (after.name !== undefined) checkAgentNameFree(tx, input.organizationId, String(after.name), current.id);
    saveAuditedChange(tx, agents, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'agent',
      entityId: current.id,
      reason: input.reason,
      before,
      after,
      at: now,
    });
  });
  return getAgent(db, input.organizationId, input.agentId);
}

function getAgentUsage(db: Tx, agentId: number) {
  const groups = db.select({ total: count() }).from(exposureGroups).where(eq(exposureGroups.agentId, agentId)).get()?.total ?? 0;
  const activeGroups =
    db
      .select({ total: count() })
      .from(exposureGroups)
      .where(and(eq(exposureGroups.agentId, agentId), eq(exposureGroups.archived, false)))
      .get()?.total ?? 0;
  const entries = db.select({ total: count() }).from(oelEntries).where(eq(oelEntries.agentId, agentId)).get()?.total ?? 0;
  return { groups, activeGroups, entries };
}

/** 400 naming `field` unless `unit` suits the agent's kind (noise: dB(A) or % dose; chemicals: concentrations). */
export function checkUnitFitsAgent(agent: Agent, unit: ExposureUnit, field: string): void {
  const allowed = unitsForAgentKind[agent.kind];
  if (!allowed.includes(unit)) {
    const message = `${exposureUnitLabels[unit]} does not fit ${agent.kind === 'noise' ? 'noise' : 'a chemical'} ("${agent.name}"): use ${allowed
      .map((item) => exposureUnitLabels[item])
      .join(' or ')}`;
    throw fieldError(field, message);
  }
}

/** An agent of the organization named in a request body: 400 naming the field when unknown. */
export function agentFromBody(db: Tx, organizationId: number, agentId: number, field = 'agentId'): Agent {
  return ownedOrFieldError(db, agents, organizationId, agentId, 'agent', field);
}

const oelEntryColumns = { entry: oelEntries, agentName: agents.name, agentKind: agents.kind };

export function listOelEntries(db: Db, organizationId: number, query: OelEntryListQuery): ListPage<OelEntryView> {
  const where = and(
    eq(oelEntries.organizationId, organizationId),
    archivedCondition(query.archived, oelEntries.archived),
    query.agentId ? eq(oelEntries.agentId, query.agentId) : undefined,
    searchCondition(query.q, [oelEntries.source, oelEntries.notes, agents.name]),
  );
  const total = db.select({ total: count() }).from(oelEntries).innerJoin(agents, eq(agents.id, oelEntries.agentId)).where(where).get()?.total ?? 0;
  const { limit, offset } = pageWindow(query.page, query.pageSize);
  const items = db
    .select(oelEntryColumns)
    .from(oelEntries)
    .innerJoin(agents, eq(agents.id, oelEntries.agentId))
    .where(where)
    .orderBy(
      ...orderBy(
        query.sort,
        {
          agentName: agents.name,
          source: oelEntries.source,
          value: oelEntries.value,
          unit: oelEntries.unit,
          averagingTime: oelEntries.averagingTime,
          createdAt: oelEntries.createdAt,
        },
        oelEntries.id,
      ),
    )
    .limit(limit)
    .offset(offset)
    .all()
    .map((row) => ({ ...row.entry, agentName: row.agentName, agentKind: row.agentKind }));
  return pageOf(items, total, query.page, query.pageSize);
}

/** The OEL list entry with its agent, or 404. */
export function getOelEntry(db: Tx, organizationId: number, entryId: number): OelEntryView {
  const row = db
    .select(oelEntryColumns)
    .from(oelEntries)
    .innerJoin(agents, eq(agents.id, oelEntries.agentId))
    .where(and(eq(oelEntries.id, entryId), eq(oelEntries.organizationId, organizationId)))
    .get();
  if (!row) throw new NotFound(`No OEL list entry ${entryId} in this organization`);
  return { ...row.entry, agentName: row.agentName, agentKind: row.agentKind };
}

function oelAuditFields(entry: Pick<OelEntry, 'agentId' | 'source' | 'value' | 'unit' | 'averagingTime'>) {
  return { agentId: entry.agentId, source: entry.source, value: entry.value, unit: entry.unit, averagingTime: entry.averagingTime };
}

export function createOelEntry(db: Db, clock: Clock, input: { organizationId: number; actor: Actor; entry: OelEntryCreate }): OelEntryView {
  const now = clock.now();
  const stamp = now.toISOString();
  const id = db.transaction((tx) => {
    const agent = agentFromBody(tx, input.organizationId, input.entry.agentId);
    checkUnitFitsAgent(agent, input.entry.unit, 'unit');
    const row = tx
      .insert(oelEntries)
      .values({ organizationId: input.organizationId, ...input.entry, notes: input.entry.notes ?? '', createdAt: stamp, updatedAt: stamp })
      .returning()
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'oel_entry',
      entityId: row.id,
      action: 'created',
      after: oelAuditFields(row),
      at: now,
    });
    return row.id;
  });
  return getOelEntry(db, input.organizationId, id);
}

/**
 * Edits an OEL list entry. Groups copied the entry when they were set up, so an edit here never
 * changes what an existing group is judged against (docs/decisions/006-database-and-migrations.md).
 */
export function updateOelEntry(
  db: Db,
  clock: Clock,
  input: { organizationId: number; entryId: number; actor: Actor; changes: OelEntryUpdate; reason?: string },
): OelEntryView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = getOelEntry(tx, input.organizationId, input.entryId);
    const { before, after } = changedFields(current as OelEntry, input.changes);
    if (Object.keys(after).length === 0) return;
    const agent =
      after.agentId !== undefined ? agentFromBody(tx, input.organizationId, Number(after.agentId)) : findAgent(tx, input.organizationId, current.agentId);
    checkUnitFitsAgent(agent, (after.unit as ExposureUnit | undefined) ?? current.unit, 'unit');
    saveAuditedChange(tx, oelEntries, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'oel_entry',
      entityId: current.id,
      reason: input.reason,
      before,
      after,
      at: now,
    });
  });
  return getOelEntry(db, input.organizationId, input.entryId);
}
