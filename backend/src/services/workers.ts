import { and, asc, count, eq, gte, inArray, isNull, lte, ne, or, sql, type SQLWrapper } from 'drizzle-orm';
import { exposureGroups } from '@schema/exposure-groups';
import type { ListPage, WorkerListQuery } from '@schema/list-query';
import { shiftResults } from '@schema/shift-results';
import {
  groupMemberships,
  workers,
  type GroupMembership,
  type GroupMembershipCreate,
  type GroupMembershipUpdate,
  type Worker,
  type WorkerCreate,
  type WorkerUpdate,
} from '@schema/workers';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict } from '../errors';
import { saveAuditedChange, audit, changedFields, fieldError, ownedOrFieldError, ownedOrNotFound, type Actor, type Tx } from './changes';
import { today } from './dates';
import { exposureGroupFromBody, findExposureGroup } from './exposure-groups';
import { archivedCondition, orderBy, pageOf, pageWindow, qualified, searchCondition } from './list';

/*
 * Workers and their group membership over time. Names are personal data: they are sent only to
 * roles holding 'workerNames:read' (consultants do not), never searched or sorted on for others,
 * and never written to the audit trail (which consultants may read) — only whether one was set.
 */

/**
 * A worker as the API sends it. Without 'workerNames:read' the `name` key is absent and
 * `nameHidden` is true.
 */
export type WorkerPublic = Omit<Worker, 'name' | 'email' | 'organizationId'> & { name?: string | null; email?: string | null; nameHidden?: true };

/** Whether the caller may see worker names, passed from the route (the role's permissions). */
export interface NameAccess {
  canSeeNames: boolean;
}

/** Strips the name unless the caller may see names. */
export function presentWorker(worker: Worker, access: NameAccess): WorkerPublic {
  // The e-mail address is personal data like the name: both travel only with 'workerNames:read'.
  const { name, email, organizationId: _organizationId, ...rest } = worker;
  return access.canSeeNames ? { ...rest, name, email } : { ...rest, nameHidden: true };
}

/** A worker reference inside other objects (members, picks, results): code always, name if allowed. */
export interface WorkerReference {
  id: number;
  code: string;
  jobTitle: string;
  name?: string | null;
  nameHidden?: true;
}
export function workerReference(worker: Pick<Worker, 'id' | 'code' | 'jobTitle' | 'name'>, access: NameAccess): WorkerReference {
  const base = { id: worker.id, code: worker.code, jobTitle: worker.jobTitle };
  return access.canSeeNames ? { ...base, name: worker.name } : { ...base, nameHidden: true };
}

/** A membership period with its group's name. */
export type MembershipView = Omit<GroupMembership, 'organizationId'> & { groupName: string; current: boolean };

export type WorkerListItem = WorkerPublic & { currentGroups: Array<{ id: number; name: string }> };
export type WorkerDetail = WorkerPublic & { memberships: MembershipView[] };

/** Membership covers `date` (from ≤ date ≤ to, open end = still a member). */
export function coversDate(date: string | SQLWrapper) {
  const from = qualified(groupMemberships.fromDate);
  const to = qualified(groupMemberships.toDate);
  return sql`(${from} <= ${date} and (${to} is null or ${to} >= ${date}))`;
}

export function listWorkers(db: Db, clock: Clock, organizationId: number, query: WorkerListQuery, access: NameAccess): ListPage<WorkerListItem> {
  if (!access.canSeeNames && (query.sort === 'name' || query.sort === '-name'))
    throw fieldError('sort', 'Sorting by name needs the permission to see worker names', 'query');
  const memberOn = query.memberOn ?? today(clock);
  const where = and(
    eq(workers.organizationId, organizationId),
    archivedCondition(query.archived, workers.archived),
    query.jobTitle ? sql`lower(${workers.jobTitle}) = lower(${query.jobTitle})` : undefined,
    query.groupId
      ? sql`exists (select 1 from ${groupMemberships} where ${qualified(groupMemberships.workerId)} = ${qualified(workers.id)} and ${qualified(groupMemberships.exposureGroupId)} = ${query.groupId} and ${coversDate(memberOn)})`
      : undefined,
    searchCondition(query.q, access.canSeeNames ? [workers.code, workers.jobTitle, workers.name] : [workers.code, workers.jobTitle]),
  );
  const total = db.select({ total: count() }).from(workers).where(where).get()?.total ?? 0;
  const { limit, offset } = pageWindow(query.page, query.pageSize);
  const rows = db
    .select()
    .from(workers)
    .where(where)
    .orderBy(
      ...orderBy(
        query.sort,
        { code: workers.code, name: workers.name, jobTitle: workers.jobTitle, createdAt: workers.createdAt, updatedAt: workers.updatedAt },
        workers.id,
      ),
    )
    .limit(limit)
    .offset(offset)
    .all();
  const groupsByWorker = currentGroupsOf(
    db,
    rows.map((row) => row.id),
    today(clock),
  );
  const items = rows.map((row) => ({ ...presentWorker(row, access), currentGroups: groupsByWorker.get(row.id) ?? [] }));
  return pageOf(items, total, query.page, query.pageSize);
}

function currentGroupsOf(db: Tx, workerIds: number[], date: string): Map<number, Array<{ id: number; name: string }>> {
  const result = new Map<number, Array<{ id: number; name: string }>>();
  if (workerIds.length === 0) return result;
  const rows = db
    .select({ workerId: groupMemberships.workerId, id: exposureGroups.id, name: exposureGroups.name })
    .from(groupMemberships)
    .innerJoin(exposureGroups, eq(exposureGroups.id, groupMemberships.exposureGroupId))
    .where(and(inArray(groupMemberships.workerId, workerIds), coversDate(date)))
    .orderBy(asc(exposureGroups.name))
    .all();
  for (const row of rows) {
    const list = result.get(row.workerId) ?? [];
    if (!list.some((group) => group.id === row.id)) list.push({ id: row.id, name: row.name });
    result.set(row.workerId, list);
  }
  return result;
}

/** The worker row, or 404 (also for another organization's worker). */
export function findWorker(db: Tx, organizationId: number, workerId: number): Worker {
  return ownedOrNotFound(db, workers, organizationId, workerId, 'worker');
}

/** A worker named in a request body: 400 naming the field when unknown. */
export function workerFromBody(db: Tx, organizationId: number, workerId: number, field = 'workerId'): Worker {
  return ownedOrFieldError(db, workers, organizationId, workerId, 'worker', field);
}

function membershipViews(db: Tx, where: ReturnType<typeof and>, date: string): MembershipView[] {
  return db
    .select({ membership: groupMemberships, groupName: exposureGroups.name })
    .from(groupMemberships)
    .innerJoin(exposureGroups, eq(exposureGroups.id, groupMemberships.exposureGroupId))
    .where(where)
    .orderBy(asc(groupMemberships.fromDate), asc(groupMemberships.id))
    .all()
    .map(({ membership, groupName }) => {
      const { organizationId: _organizationId, ...rest } = membership;
      return { ...rest, groupName, current: membership.fromDate <= date && (membership.toDate === null || membership.toDate >= date) };
    });
}

export function getWorker(db: Tx, clock: Clock, organizationId: number, workerId: number, access: NameAccess): WorkerDetail {
  const worker = findWorker(db, organizationId, workerId);
  return { ...presentWorker(worker, access), memberships: membershipViews(db, eq(groupMemberships.workerId, worker.id), today(clock)) };
}

/** Codes are compared without regard to case, so RT-001 and rt-001 cannot both exist. */
function checkCodeFree(db: Tx, organizationId: number, code: string, exceptId?: number): void {
  const clash = db
    .select({ id: workers.id, code: workers.code })
    .from(workers)
    .where(
      and(
        eq(workers.organizationId, organizationId),
        sql`lower(${workers.code}) = lower(${code})`,
        exceptId === undefined ? undefined : ne(workers.id, exceptId),
      ),
    )
    .get();
  if (clash) throw new Conflict(`Worker code "${clash.code}" is already used in this organization (worker ${clash.id})`);
}

/** What the audit trail keeps of a worker: never the name itself. */
function workerAuditFields(worker: Partial<Worker>): Record<string, unknown> {
  const { name, email, organizationId: _organizationId, createdAt: _createdAt, updatedAt: _updatedAt, ...rest } = worker;
  return {
    ...rest,
    ...(name === undefined ? {} : { nameRecorded: name !== null && name !== '' }),
    ...(email === undefined ? {} : { emailRecorded: email !== null && email !== '' }),
  };
}

export function createWorker(db: Db, clock: Clock, input: { organizationId: number; actor: Actor; worker: WorkerCreate }, access: NameAccess): WorkerDetail {
  const now = clock.now();
  const stamp = now.toISOString();
  const id = db.transaction((tx) => {
    checkCodeFree(tx, input.organizationId, input.worker.code);
    const row = tx
      .insert(workers)
      .values({
        organizationId: input.organizationId,
        code: input.worker.code,
        name: input.worker.name ? input.worker.name : null,
        jobTitle: input.worker.jobTitle ?? '',
        email: input.worker.email ? input.worker.email : null,
        createdAt: stamp,
        updatedAt: stamp,
      })
      .returning()
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'worker',
      entityId: row.id,
      action: 'created',
      // An address is mentioned only when one was given, so a worker created without one reads as before.
      after: workerAuditFields({ code: row.code, jobTitle: row.jobTitle, name: row.name, ...(row.email ? { email: row.email } : {}) }),
      at: now,
    });
    return row.id;
  });
  return getWorker(db, clock, input.organizationId, id, access);
}

export function updateWorker(
  db: Db,
  clock: Clock,
  input: { organizationId: number; workerId: number; actor: Actor; changes: WorkerUpdate; reason?: string },
  access: NameAccess,
): WorkerDetail {
  const now = clock.now();
  db.transaction((tx) => {
    const current = findWorker(tx, input.organizationId, input.workerId);
    const changes = { ...input.changes };
    if (changes.name === '') changes.name = null;
    if (changes.email === '') changes.email = null;
    const { before, after } = changedFields(current, changes as Partial<Worker>);
    if (Object.keys(after).length === 0) return;
    if (after.code !== undefined) checkCodeFree(tx, input.organizationId, String(after.code), current.id);
    saveAuditedChange(tx, workers, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'worker',
      entityId: current.id,
      reason: input.reason,
      before: workerAuditFields(before as Partial<Worker>),
      after: workerAuditFields(after as Partial<Worker>),
      set: after,
      at: now,
    });
  });
  return getWorker(db, clock, input.organizationId, input.workerId, access);
}

/** The group's memberships, every period (current and past), with each worker. */
export function listGroupMembers(db: Tx, clock: Clock, organizationId: number, groupId: number, access: NameAccess) {
  const group = findExposureGroup(db, organizationId, groupId);
  const date = today(clock);
  return db
    .select({ membership: groupMemberships, worker: workers })
    .from(groupMemberships)
    .innerJoin(workers, eq(workers.id, groupMemberships.workerId))
    .where(eq(groupMemberships.exposureGroupId, group.id))
    .orderBy(asc(workers.code), asc(groupMemberships.fromDate))
    .all()
    .map(({ membership, worker }) => ({
      id: membership.id,
      exposureGroupId: membership.exposureGroupId,
      fromDate: membership.fromDate,
      toDate: membership.toDate,
      current: membership.fromDate <= date && (membership.toDate === null || membership.toDate >= date),
      worker: { ...workerReference(worker, access), archived: worker.archived },
    }));
}

/** The membership, or 404. */
function findMembership(db: Tx, organizationId: number, membershipId: number): GroupMembership {
  return ownedOrNotFound(db, groupMemberships, organizationId, membershipId, 'group membership');
}

function describePeriod(fromDate: string, toDate: string | null): string {
  return toDate === null ? `from ${fromDate} (open-ended)` : `from ${fromDate} to ${toDate}`;
}

/**
 * 409 when the worker already has a membership of the group whose dates overlap the period
 * (two periods [a, b] and [c, d] overlap when a ≤ d and c ≤ b; an open end is +∞).
 */
function checkNoOverlap(
  db: Tx,
  period: { workerId: number; exposureGroupId: number; fromDate: string; toDate: string | null },
  names: { workerCode: string; groupName: string },
  exceptId?: number,
): void {
  const clash = db
    .select()
    .from(groupMemberships)
    .where(
      and(
        eq(groupMemberships.workerId, period.workerId),
        eq(groupMemberships.exposureGroupId, period.exposureGroupId),
        period.toDate === null ? undefined : lte(groupMemberships.fromDate, period.toDate),
        or(isNull(groupMemberships.toDate), gte(groupMemberships.toDate, period.fromDate)),
        exceptId === undefined ? undefined : ne(groupMemberships.id, exceptId),
      ),
    )
    .get();
  if (clash) {
    throw new Conflict(
      `${names.workerCode} is already a member of "${names.groupName}" ${describePeriod(clash.fromDate, clash.toDate)} (membership ${clash.id}), ` +
        `which overlaps ${describePeriod(period.fromDate, period.toDate)}: end or change that membership first, or choose other dates`,
      { membershipId: clash.id, fromDate: clash.fromDate, toDate: clash.toDate },
    );
  }
}

function membershipAuditFields(membership: Pick<GroupMembership, 'workerId' | 'exposureGroupId' | 'fromDate' | 'toDate'>) {
  return { workerId: membership.workerId, exposureGroupId: membership.exposureGroupId, fromDate: membership.fromDate, toDate: membership.toDate };
}

/** Adds a worker to a group from `fromDate` (to `toDate`, or open-ended). */
export function createGroupMembership(
  db: Db,
  clock: Clock,
  input: { organizationId: number; actor: Actor; membership: GroupMembershipCreate },
): MembershipView {
  const now = clock.now();
  const stamp = now.toISOString();
  const id = db.transaction((tx) => {
    const worker = workerFromBody(tx, input.organizationId, input.membership.workerId);
    const group = exposureGroupFromBody(tx, input.organizationId, input.membership.exposureGroupId);
    if (worker.archived) throw fieldError('workerId', `Worker ${worker.code} is archived: bring them back before adding a membership`);
    if (group.archived) throw fieldError('exposureGroupId', `Exposure group "${group.name}" is archived: bring it back before adding members`);
    const period = { ...input.membership, toDate: input.membership.toDate ?? null };
    checkNoOverlap(tx, period, { workerCode: worker.code, groupName: group.name });
    const row = tx
      .insert(groupMemberships)
      .values({ organizationId: input.organizationId, ...period, createdAt: stamp, updatedAt: stamp })
      .returning()
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'group_membership',
      entityId: row.id,
      action: 'created',
      after: membershipAuditFields(row),
      at: now,
    });
    return row.id;
  });
  return membershipViews(db, eq(groupMemberships.id, id), today(clock))[0];
}

/**
 * Changes a membership's dates (ending it is `toDate`). Refused when the new period overlaps
 * another membership of the same worker and group (409), or when it would leave one of the
 * worker's valid shift results in the group outside every membership (409 naming the date).
 */
export function updateGroupMembership(
  db: Db,
  clock: Clock,
  input: { organizationId: number; membershipId: number; actor: Actor; changes: GroupMembershipUpdate; reason?: string },
): MembershipView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = findMembership(tx, input.organizationId, input.membershipId);
    const period = {
      workerId: current.workerId,
      exposureGroupId: current.exposureGroupId,
      fromDate: input.changes.fromDate ?? current.fromDate,
      toDate: input.changes.toDate === undefined ? current.toDate : input.changes.toDate,
    };
    if (period.toDate !== null && period.toDate < period.fromDate)
      throw fieldError(
        input.changes.toDate !== undefined ? 'toDate' : 'fromDate',
        `The end date (${period.toDate}) is before the start date (${period.fromDate})`,
      );
    const { before, after } = changedFields(current, { fromDate: period.fromDate, toDate: period.toDate });
    if (Object.keys(after).length === 0) return;
    const worker = findWorker(tx, input.organizationId, current.workerId);
    const group = findExposureGroup(tx, input.organizationId, current.exposureGroupId);
    checkNoOverlap(tx, period, { workerCode: worker.code, groupName: group.name }, current.id);
    tx.update(groupMemberships)
      .set({ fromDate: period.fromDate, toDate: period.toDate, updatedAt: now.toISOString() })
      .where(eq(groupMemberships.id, current.id))
      .run();
    const stranded = tx
      .select({ id: shiftResults.id, date: shiftResults.date })
      .from(shiftResults)
      .where(
        and(
          eq(shiftResults.workerId, current.workerId),
          eq(shiftResults.exposureGroupId, current.exposureGroupId),
          eq(shiftResults.status, 'valid'),
          sql`not exists (select 1 from ${groupMemberships} where ${qualified(groupMemberships.workerId)} = ${qualified(shiftResults.workerId)} and ${qualified(groupMemberships.exposureGroupId)} = ${qualified(shiftResults.exposureGroupId)} and ${coversDate(qualified(shiftResults.date))})`,
        ),
      )
      .orderBy(asc(shiftResults.date))
      .all();
    if (stranded.length > 0) {
      // Throwing rolls the update back.
      throw new Conflict(
        `${worker.code} has ${stranded.length} valid shift result(s) in "${group.name}" that the new dates would leave outside any membership (first on ${stranded[0].date}): void them or choose other dates`,
        { resultIds: stranded.map((row) => row.id) },
      );
    }
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'group_membership',
      entityId: current.id,
      action: after.toDate !== undefined && after.fromDate === undefined && period.toDate !== null ? 'ended' : 'updated',
      reason: input.reason,
      before,
      after,
      at: now,
    });
  });
  return membershipViews(db, eq(groupMemberships.id, input.membershipId), today(clock))[0];
}

/** Whether the worker is a member of the group on the date. */
export function isMemberOn(db: Tx, workerId: number, groupId: number, date: string): boolean {
  return (
    (db
      .select({ total: count() })
      .from(groupMemberships)
      .where(and(eq(groupMemberships.workerId, workerId), eq(groupMemberships.exposureGroupId, groupId), coversDate(date)))
      .get()?.total ?? 0) > 0
  );
}

/** The worker's periods in the group, in words, for error messages ("2023-01-09 – 2024-03-01"). */
export function periodsInWords(db: Tx, workerId: number, groupId: number): string {
  const periods = db
    .select({ fromDate: groupMemberships.fromDate, toDate: groupMemberships.toDate })
    .from(groupMemberships)
    .where(and(eq(groupMemberships.workerId, workerId), eq(groupMemberships.exposureGroupId, groupId)))
    .orderBy(asc(groupMemberships.fromDate))
    .all();
  if (periods.length === 0) return 'never a member';
  return `member ${periods.map((period) => `${period.fromDate} – ${period.toDate ?? 'open'}`).join(', ')}`;
}
