import { and, desc, eq, inArray, isNotNull, lte, ne } from 'drizzle-orm';
import { decisionRecords, type DecisionRecordRow } from '@schema/decision-records';
import { exposureGroups } from '@schema/exposure-groups';
import {
  notificationPreferences,
  notifications,
  notificationTypeInfo,
  notificationTypes,
  type NotificationPreferencesUpdate,
  type NotificationPreferencesView,
  type NotificationType,
} from '@schema/notifications';
import { memberships, organizations } from '@schema/organizations';
import type { Role } from '@schema/permissions';
import { users } from '@schema/users';
import { exposureCategoryDescription } from '@stats/exposure-category';
import type { ExposureCategory } from '@stats/types';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import type { Mailer, MailMessage } from '../email/mailer';
import {
  categoryChangedEmail,
  decisionApprovedEmail,
  decisionReturnedEmail,
  reviewDueDigestEmail,
  reviewDueEmail,
  type ReviewDueItem,
  stillStretchEmail,
  type NotificationEnvelope,
} from '../email/templates';
import { fieldError } from './changes';
import { addDays, today } from './dates';

/*
 * The one place that decides who is told what by e-mail (docs/decisions/021-notifications.md):
 * recipients by role per type, each person's preferences (every type on unless switched off),
 * one `notifications` row per message with a unique dedupe key, and sending only after the
 * change it reports has been committed. Nothing here ever throws to the caller: a failed send is
 * logged and kept in the row's `error`, and the user's action has already succeeded.
 */

/** What sending needs: the database, a mailer, the clock, a logger and the address links point at. */
export interface NotifierDeps {
  db: Db;
  mailer: Mailer;
  clock: Clock;
  logger: { error(object: object, message: string): void; info?(object: object, message: string): void };
  config: { appUrl: string };
}

interface Recipient {
  id: number;
  email: string;
  name: string;
}

/** One message to one person, before the preference check and the dedupe claim. */
interface PlannedNotification {
  type: NotificationType;
  organizationId: number;
  recipient: Recipient;
  entityType: string;
  entityId: string;
  dedupeKey: string;
  message: MailMessage;
}

/** Counts for the daily job and the tests: sent, already sent (dedupe), switched off, failed. */
export interface DeliveryCounts {
  sent: number;
  duplicates: number;
  switchedOff: number;
  failed: number;
}

const noCounts = (): DeliveryCounts => ({ sent: 0, duplicates: 0, switchedOff: 0, failed: 0 });

function addCounts(total: DeliveryCounts, more: DeliveryCounts): DeliveryCounts {
  return {
    sent: total.sent + more.sent,
    duplicates: total.duplicates + more.duplicates,
    switchedOff: total.switchedOff + more.switchedOff,
    failed: total.failed + more.failed,
  };
}

// ---------------------------------------------------------------- preferences

/** Whether a person receives a type in an organization: on unless they switched it off. */
export function wantsNotification(db: Db, userId: number, organizationId: number, type: NotificationType): boolean {
  const row = db
    .select({ enabled: notificationPreferences.enabled })
    .from(notificationPreferences)
    .where(and(eq(notificationPreferences.userId, userId), eq(notificationPreferences.organizationId, organizationId), eq(notificationPreferences.type, type)))
    .get();
  return row?.enabled ?? true;
}

function activeMemberships(db: Db, userId: number) {
  return db
    .select({ organizationId: organizations.id, organizationName: organizations.name, role: memberships.role })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(and(eq(memberships.userId, userId), eq(memberships.active, true)))
    .orderBy(organizations.name)
    .all();
}

/** Every type's setting for each organization the person is an active member of. */
export function getNotificationPreferences(db: Db, userId: number): NotificationPreferencesView {
  const stored = db.select().from(notificationPreferences).where(eq(notificationPreferences.userId, userId)).all();
  return {
    types: notificationTypes.map((type) => ({ type, ...notificationTypeInfo[type] })),
    organizations: activeMemberships(db, userId).map((membership) => {
      const preferences = Object.fromEntries(notificationTypes.map((type) => [type, true])) as Record<NotificationType, boolean>;
      for (const row of stored) if (row.organizationId === membership.organizationId) preferences[row.type] = row.enabled;
      return { ...membership, preferences };
    }),
  };
}

/**
 * Stores the person's choices (one transaction). An organization they are not an active member of
 * is a 400 naming the entry, so nobody can write preferences for an organization they cannot see.
 */
export function updateNotificationPreferences(db: Db, clock: Clock, userId: number, update: NotificationPreferencesUpdate): NotificationPreferencesView {
  const member = new Set(activeMemberships(db, userId).map((membership) => membership.organizationId));
  update.organizations.forEach((entry, index) => {
    if (!member.has(entry.organizationId))
      throw fieldError(`organizations.${index}.organizationId`, `You are not a member of organization ${entry.organizationId}`);
  });
  const stamp = clock.now().toISOString();
  db.transaction((tx) => {
    for (const entry of update.organizations) {
      for (const [type, enabled] of Object.entries(entry.preferences) as Array<[NotificationType, boolean | undefined]>) {
        if (enabled === undefined) continue;
        tx.insert(notificationPreferences)
          .values({ userId, organizationId: entry.organizationId, type, enabled, updatedAt: stamp })
          .onConflictDoUpdate({
            target: [notificationPreferences.userId, notificationPreferences.organizationId, notificationPreferences.type],
            set: { enabled, updatedAt: stamp },
          })
          .run();
      }
    }
  });
  return getNotificationPreferences(db, userId);
}

// ---------------------------------------------------------------- recipients

function membersWithRoles(db: Db, organizationId: number, roles: readonly Role[]): Recipient[] {
  return db
    .select({ id: users.id, email: users.email, name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.organizationId, organizationId), eq(memberships.active, true), inArray(memberships.role, [...roles])))
    .orderBy(users.id)
    .all();
}

/** The person, if still an active member of the organization (a deactivated drafter is not written to). */
function activeMember(db: Db, organizationId: number, userId: number): Recipient | undefined {
  return db
    .select({ id: users.id, email: users.email, name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.organizationId, organizationId), eq(memberships.userId, userId), eq(memberships.active, true)))
    .get();
}

/** Each person once, in the order first named. */
function distinct(recipients: ReadonlyArray<Recipient | undefined>): Recipient[] {
  const seen = new Set<number>();
  const result: Recipient[] = [];
  for (const recipient of recipients) {
    if (!recipient || seen.has(recipient.id)) continue;
    seen.add(recipient.id);
    result.push(recipient);
  }
  return result;
}

function userName(db: Db, userId: number | null): string {
  if (userId === null) return 'Someone';
  return db.select({ name: users.name }).from(users).where(eq(users.id, userId)).get()?.name ?? 'Someone';
}

// ---------------------------------------------------------------- delivery

function errorText(error: unknown): string {
  return (error instanceof Error ? error.message : String(error)).slice(0, 1000);
}

/**
 * Claims the dedupe key: true when this call should send. A key already sent, or being sent, is
 * a duplicate; a key whose last attempt failed is tried again (that is what a retry is for).
 */
function claim(db: Db, planned: Omit<PlannedNotification, 'message'> & { subject: string }, stamp: string): number | undefined {
  const inserted = db
    .insert(notifications)
    .values({
      organizationId: planned.organizationId,
      type: planned.type,
      recipientUserId: planned.recipient.id,
      recipientEmail: planned.recipient.email,
      subject: planned.subject,
      entityType: planned.entityType,
      entityId: planned.entityId,
      dedupeKey: planned.dedupeKey,
      createdAt: stamp,
    })
    .onConflictDoNothing({ target: notifications.dedupeKey })
    .returning({ id: notifications.id })
    .get();
  if (inserted) return inserted.id;
  const existing = db.select().from(notifications).where(eq(notifications.dedupeKey, planned.dedupeKey)).get();
  if (!existing || existing.sentAt !== null || existing.error === null) return undefined;
  // The last attempt failed: take it over (clearing the error marks it as in flight).
  const retried = db
    .update(notifications)
    .set({ error: null })
    .where(and(eq(notifications.id, existing.id), isNotNull(notifications.error)))
    .returning({ id: notifications.id })
    .get();
  return retried?.id;
}

/** Checks preferences, claims each dedupe key, sends one by one and records the outcome. Never throws. */
async function deliver(deps: NotifierDeps, planned: readonly PlannedNotification[]): Promise<DeliveryCounts> {
  const counts = noCounts();
  for (const item of planned) {
    try {
      if (!wantsNotification(deps.db, item.recipient.id, item.organizationId, item.type)) {
        counts.switchedOff += 1;
        continue;
      }
      const rowId = claim(deps.db, { ...item, subject: item.message.subject }, deps.clock.now().toISOString());
      if (rowId === undefined) {
        counts.duplicates += 1;
        continue;
      }
      try {
        await deps.mailer.send(item.message);
        deps.db.update(notifications).set({ sentAt: deps.clock.now().toISOString(), error: null }).where(eq(notifications.id, rowId)).run();
        counts.sent += 1;
      } catch (error) {
        counts.failed += 1;
        deps.db
          .update(notifications)
          .set({ error: errorText(error) })
          .where(eq(notifications.id, rowId))
          .run();
        deps.logger.error({ err: error, type: item.type, dedupeKey: item.dedupeKey }, 'a notification e-mail could not be sent');
      }
    } catch (error) {
      counts.failed += 1;
      deps.logger.error({ err: error, type: item.type, dedupeKey: item.dedupeKey }, 'a notification could not be prepared');
    }
  }
  return counts;
}

/** Runs `plan` and delivers what it returns; a failure while planning is logged, never thrown. */
async function planAndDeliver(deps: NotifierDeps, what: string, plan: () => PlannedNotification[]): Promise<DeliveryCounts> {
  let planned: PlannedNotification[];
  try {
    planned = plan();
  } catch (error) {
    deps.logger.error({ err: error }, `the ${what} notifications could not be prepared`);
    return { ...noCounts(), failed: 1 };
  }
  return deliver(deps, planned);
}

// ---------------------------------------------------------------- the types

const recordEntity = 'decision_record';

interface RecordContext {
  record: DecisionRecordRow;
  groupName: string;
  organizationName: string;
}

function recordContext(db: Db, organizationId: number, recordId: number): RecordContext | undefined {
  const row = db
    .select({ record: decisionRecords, groupName: exposureGroups.name, organizationName: organizations.name })
    .from(decisionRecords)
    .innerJoin(exposureGroups, eq(exposureGroups.id, decisionRecords.exposureGroupId))
    .innerJoin(organizations, eq(organizations.id, decisionRecords.organizationId))
    .where(and(eq(decisionRecords.id, recordId), eq(decisionRecords.organizationId, organizationId)))
    .get();
  return row ?? undefined;
}

function envelope(deps: NotifierDeps, recipient: Recipient, organizationName: string, link: string): NotificationEnvelope {
  return {
    to: recipient.email,
    name: recipient.name,
    organizationName,
    link,
    settingsLink: settingsLink(deps),
  };
}

const settingsLink = (deps: NotifierDeps) => `${deps.config.appUrl}/account/notifications`;

const recordLink = (deps: NotifierDeps, organizationId: number, recordId: number) =>
  `${deps.config.appUrl}/orgs/${organizationId}/decision-records/${recordId}`;

/** The group's approved record before this one (now superseded), if any. */
function previousApproved(db: Db, record: DecisionRecordRow): Pick<DecisionRecordRow, 'id' | 'category'> | undefined {
  if (!record.approvedAt) return undefined;
  return db
    .select({ id: decisionRecords.id, category: decisionRecords.category })
    .from(decisionRecords)
    .where(
      and(
        eq(decisionRecords.exposureGroupId, record.exposureGroupId),
        ne(decisionRecords.id, record.id),
        inArray(decisionRecords.status, ['approved', 'superseded']),
        lte(decisionRecords.approvedAt, record.approvedAt),
      ),
    )
    .orderBy(desc(decisionRecords.approvedAt), desc(decisionRecords.id))
    .get();
}

/**
 * After an approval has committed: `decisionApproved` to the drafter and the managers, and
 * `categoryChanged` to managers and hygienists when the group's previous approved record had
 * another category.
 */
export function notifyDecisionApproved(deps: NotifierDeps, input: { organizationId: number; recordId: number }): Promise<DeliveryCounts> {
  return planAndDeliver(deps, 'approval', () => {
    const context = recordContext(deps.db, input.organizationId, input.recordId);
    if (!context || context.record.status !== 'approved') return [];
    const { record, groupName, organizationName } = context;
    const link = recordLink(deps, input.organizationId, record.id);
    const categoryText = exposureCategoryDescription(record.category as ExposureCategory);
    const approverName = userName(deps.db, record.approvedByUserId);
    const planned: PlannedNotification[] = distinct([
      activeMember(deps.db, input.organizationId, record.draftedByUserId),
      ...membersWithRoles(deps.db, input.organizationId, ['manager']),
    ]).map((recipient) => ({
      type: 'decisionApproved',
      organizationId: input.organizationId,
      recipient,
      entityType: recordEntity,
      entityId: String(record.id),
      dedupeKey: `decisionApproved:${recordEntity}:${record.id}:user:${recipient.id}`,
      message: decisionApprovedEmail({
        ...envelope(deps, recipient, organizationName, link),
        groupName,
        recordId: record.id,
        approverName,
        categoryText,
        reviewDate: record.reviewDate,
      }),
    }));
    const previous = previousApproved(deps.db, record);
    if (previous && previous.category !== record.category) {
      for (const recipient of membersWithRoles(deps.db, input.organizationId, ['manager', 'hygienist'])) {
        planned.push({
          type: 'categoryChanged',
          organizationId: input.organizationId,
          recipient,
          entityType: recordEntity,
          entityId: String(record.id),
          dedupeKey: `categoryChanged:${recordEntity}:${record.id}:user:${recipient.id}`,
          message: categoryChangedEmail({
            ...envelope(deps, recipient, organizationName, link),
            groupName,
            recordId: record.id,
            previousRecordId: previous.id,
            previousCategory: previous.category,
            category: record.category,
            categoryText,
          }),
        });
      }
    }
    return planned;
  });
}

/** After a return has committed: `decisionReturned` to the drafter with the reviewer's reason. */
export function notifyDecisionReturned(deps: NotifierDeps, input: { organizationId: number; recordId: number }): Promise<DeliveryCounts> {
  return planAndDeliver(deps, 'return', () => {
    const context = recordContext(deps.db, input.organizationId, input.recordId);
    if (!context || context.record.status !== 'returned') return [];
    const { record, groupName, organizationName } = context;
    const drafter = activeMember(deps.db, input.organizationId, record.draftedByUserId);
    if (!drafter) return [];
    return [
      {
        type: 'decisionReturned',
        organizationId: input.organizationId,
        recipient: drafter,
        entityType: recordEntity,
        entityId: String(record.id),
        // A draft can be returned more than once; each return is its own message.
        dedupeKey: `decisionReturned:${recordEntity}:${record.id}:${record.returnedAt}:user:${drafter.id}`,
        message: decisionReturnedEmail({
          ...envelope(deps, drafter, organizationName, recordLink(deps, input.organizationId, record.id)),
          groupName,
          recordId: record.id,
          reviewerName: userName(deps.db, record.returnedByUserId),
          reason: record.returnComment ?? '',
        }),
      },
    ];
  });
}

/**
 * After a noise log is stored whose wear check found a still stretch at least the organization's
 * still-time setting long: `stillStretch` to the person who uploaded it.
 */
export function notifyStillStretch(
  deps: NotifierDeps,
  input: {
    organizationId: number;
    organizationName: string;
    uploaderUserId: number;
    noiseLogId: number;
    fileName: string;
    workerCode: string;
    shiftDate: string;
    stretches: ReadonlyArray<{ startS: number; endS: number }>;
    stillMinutes: number;
  },
): Promise<DeliveryCounts> {
  return planAndDeliver(deps, 'still-stretch', () => {
    const uploader = activeMember(deps.db, input.organizationId, input.uploaderUserId);
    if (!uploader) return [];
    return [
      {
        type: 'stillStretch',
        organizationId: input.organizationId,
        recipient: uploader,
        entityType: 'noise_log',
        entityId: String(input.noiseLogId),
        dedupeKey: `stillStretch:noise_log:${input.noiseLogId}:user:${uploader.id}`,
        message: stillStretchEmail({
          to: uploader.email,
          name: uploader.name,
          organizationName: input.organizationName,
          fileName: input.fileName,
          workerCode: input.workerCode,
          shiftDate: input.shiftDate,
          stretches: input.stretches,
          stillMinutes: input.stillMinutes,
          link: `${deps.config.appUrl}/orgs/${input.organizationId}/noise-logs/${input.noiseLogId}`,
          settingsLink: settingsLink(deps),
        }),
      },
    ];
  });
}

/** How far ahead the daily job looks: approved records whose review date is this close (or past). */
export const reviewReminderDays = 30;

function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);
}

/**
 * The daily job's work: `reviewDue` for every current approved record (group not archived) whose
 * review date is at most `reviewReminderDays` days away — or already past — to the organization's
 * managers and hygienists. The dedupe key holds the record id and its review date, so each
 * person hears once per record and running the job again the same day (or the next) sends nothing new.
 * A person gets one e-mail per organization per run (a digest when several records are new to them).
 */
export async function sendReviewReminders(deps: NotifierDeps): Promise<DeliveryCounts & { records: number }> {
  let due: Array<{ record: DecisionRecordRow; groupName: string; organizationName: string }>;
  const day = today(deps.clock);
  try {
    due = deps.db
      .select({ record: decisionRecords, groupName: exposureGroups.name, organizationName: organizations.name })
      .from(decisionRecords)
      .innerJoin(exposureGroups, eq(exposureGroups.id, decisionRecords.exposureGroupId))
      .innerJoin(organizations, eq(organizations.id, decisionRecords.organizationId))
      .where(and(eq(decisionRecords.status, 'approved'), eq(exposureGroups.archived, false), lte(decisionRecords.reviewDate, addDays(day, reviewReminderDays))))
      .orderBy(decisionRecords.organizationId, decisionRecords.reviewDate, decisionRecords.id)
      .all();
  } catch (error) {
    deps.logger.error({ err: error }, 'the review reminders could not be read');
    return { ...noCounts(), failed: 1, records: 0 };
  }
  const byOrganization = new Map<number, typeof due>();
  for (const entry of due) {
    const list = byOrganization.get(entry.record.organizationId);
    if (list) list.push(entry);
    else byOrganization.set(entry.record.organizationId, [entry]);
  }
  let total = noCounts();
  for (const [organizationId, entries] of byOrganization) {
    let recipients: Recipient[];
    try {
      recipients = membersWithRoles(deps.db, organizationId, ['manager', 'hygienist']);
    } catch (error) {
      deps.logger.error({ err: error, organizationId }, 'the review-reminder recipients could not be read');
      total = addCounts(total, { ...noCounts(), failed: 1 });
      continue;
    }
    const items = entries.map(({ record, groupName, organizationName }) => ({
      record,
      organizationName,
      item: {
        groupName,
        recordId: record.id,
        reviewDate: record.reviewDate,
        daysLeft: daysBetween(day, record.reviewDate),
        categoryText: exposureCategoryDescription(record.category as ExposureCategory),
      },
    }));
    for (const recipient of recipients) total = addCounts(total, await remindOnePerson(deps, organizationId, recipient, items));
  }
  return { ...total, records: due.length };
}

/**
 * One person's reminders in one organization: claims a dedupe key per record (so each record and
 * review date is reminded once per person, as before) and sends what is new as one e-mail — the single
 * record's message, or a digest listing them all — so a first run over hundreds of overdue records
 * sends one message per person, not hundreds. Every claimed row gets the e-mail's subject and outcome.
 * Counts: `sent`/`failed` are e-mails; `duplicates`/`switchedOff` are record reminders. Never throws.
 */
async function remindOnePerson(
  deps: NotifierDeps,
  organizationId: number,
  recipient: Recipient,
  items: ReadonlyArray<{ record: DecisionRecordRow; organizationName: string; item: ReviewDueItem }>,
): Promise<DeliveryCounts> {
  const counts = noCounts();
  let claimed: Array<{ rowId: number; item: ReviewDueItem }>;
  let message: MailMessage;
  try {
    if (!wantsNotification(deps.db, recipient.id, organizationId, 'reviewDue')) return { ...counts, switchedOff: items.length };
    const organizationName = items[0]!.organizationName;
    const stamp = deps.clock.now().toISOString();
    claimed = deps.db.transaction(() =>
      items.flatMap(({ record, item }) => {
        const rowId = claim(
          deps.db,
          {
            type: 'reviewDue',
            organizationId,
            recipient,
            entityType: recordEntity,
            entityId: String(record.id),
            dedupeKey: `reviewDue:${recordEntity}:${record.id}:${record.reviewDate}:user:${recipient.id}`,
            subject: `Review due: ${item.groupName}`,
          },
          stamp,
        );
        if (rowId === undefined) {
          counts.duplicates += 1;
          return [];
        }
        return [{ rowId, item }];
      }),
    );
    if (claimed.length === 0) return counts;
    message =
      claimed.length === 1
        ? reviewDueEmail({ ...envelope(deps, recipient, organizationName, recordLink(deps, organizationId, claimed[0]!.item.recordId)), ...claimed[0]!.item })
        : reviewDueDigestEmail({
            ...envelope(deps, recipient, organizationName, `${deps.config.appUrl}/orgs/${organizationId}`),
            items: claimed.map(({ item }) => item),
          });
  } catch (error) {
    deps.logger.error({ err: error, organizationId, recipient: recipient.id }, 'the review reminders could not be prepared');
    return { ...counts, failed: counts.failed + 1 };
  }
  const rowIds = claimed.map(({ rowId }) => rowId);
  try {
    await deps.mailer.send(message);
    deps.db
      .update(notifications)
      .set({ subject: message.subject, sentAt: deps.clock.now().toISOString(), error: null })
      .where(inArray(notifications.id, rowIds))
      .run();
    counts.sent += 1;
  } catch (error) {
    counts.failed += 1;
    deps.db
      .update(notifications)
      .set({ subject: message.subject, error: errorText(error) })
      .where(inArray(notifications.id, rowIds))
      .run();
    deps.logger.error({ err: error, type: 'reviewDue', recipient: recipient.id }, 'a review-reminder e-mail could not be sent');
  }
  return counts;
}
