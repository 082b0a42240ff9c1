/**
 * E-mail notifications (PRODUCT.md capability 9; docs/decisions/021-notifications.md): each type reaches
 * the local SMTP capture with the right recipients, subject, text and HTML parts; a switched-off
 * preference suppresses it; the daily review-reminder job sends once per record and review date;
 * a failed send is kept with its error and retried once, never twice.
 */
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { DecisionRecordView } from '@schema/decision-records';
import { notifications, type NotificationPreferencesView } from '@schema/notifications';
import { generateNoiseDemoLog } from '@stats/noise-demo';
import { createFakeClock } from '../../backend/src/clock';
import { startCaptureServer, type CaptureServer, type CapturedMessage } from '../../backend/src/email/capture-server';
import { createSmtpMailer, type Mailer } from '../../backend/src/email/mailer';
import { cautionLine } from '../../backend/src/email/templates';
import { reviewReminderIntervalMs, runReviewReminders, scheduleReviewReminders } from '../../backend/src/jobs/review-reminders';
import { createAssessmentEngine, type AssessmentEngine } from '../../backend/src/services/assessment';
import { notifyStillStretch, type NotifierDeps } from '../../backend/src/services/notifications';
import { groupId, workerId } from '../helpers/org-data';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

const woodDustName = 'Head sawyer – wood dust';

describe('notification e-mails', () => {
  let engine: AssessmentEngine;
  let context: TestContext;
  let ridgeback: number;
  let hygienist: SignedIn;
  let analyst: SignedIn;
  let manager: SignedIn;
  let admin: SignedIn;
  let woodDust: number;
  let ownCapture: CaptureServer;
  let ownMailer: Mailer;
  const silentLogger = {
    errors: [] as string[],
    error(_object: object, message: string) {
      this.errors.push(message);
    },
    info() {},
  };

  const groupUrl = () => `/api/orgs/${ridgeback}/exposure-groups/${woodDust}/decision-records`;
  const recordUrl = (record: number) => `/api/orgs/${ridgeback}/decision-records/${record}`;
  const rowsFor = (type: string, entityId: number | string) =>
    context.db
      .select()
      .from(notifications)
      .where(and(eq(notifications.type, type as never), eq(notifications.entityId, String(entityId))))
      .orderBy(notifications.id)
      .all();
  const mailTo = (who: SignedIn, subjectPart: string) => context.mailbox.waitFor((mail) => mail.to === who.user.email && mail.subject.includes(subjectPart));
  const mailsWith = (subjectPart: string): CapturedMessage[] => context.mailbox.list().filter((mail) => mail.subject.includes(subjectPart));

  async function draft(body: object, url = groupUrl()): Promise<DecisionRecordView> {
    const answer = await hygienist.post(url, { rationale: 'Ten full-shift samples over the autumn campaign.', reviewDate: '2025-03-20', ...body });
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    return answer.body as DecisionRecordView;
  }
  async function approve(record: number): Promise<void> {
    const answer = await analyst.post(`${recordUrl(record)}/approve`);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
  }

  beforeAll(async () => {
    engine = createAssessmentEngine();
    context = await createTestContext({ assessmentEngine: engine });
    ridgeback = context.organizationId('ridgeback');
    [hygienist, analyst, manager, admin] = await Promise.all([
      context.signInAs('hygienist'),
      context.signInAs('analyst'),
      context.signInAs('manager'),
      context.signInAs('admin'),
    ]);
    woodDust = groupId(context.db, ridgeback, woodDustName);
    ownCapture = await startCaptureServer({ now: context.clock.now });
    ownMailer = createSmtpMailer(ownCapture.smtpUrl, 'Bellwether <no-reply@bellwether.test>');
  });
  afterAll(async () => {
    ownMailer.close();
    await ownCapture.close();
    await context.close();
    await engine.close();
  });

  it('every preference is on by default, per organization, and a person can only change their own organizations', async () => {
    const answer = await manager.get('/api/me/notification-preferences');
    expect(answer.status).toBe(200);
    const view = answer.body as NotificationPreferencesView;
    expect(view.types.map((type) => type.type)).toEqual(['decisionApproved', 'decisionReturned', 'categoryChanged', 'stillStretch', 'reviewDue']);
    expect(view.organizations).toEqual([
      {
        organizationId: ridgeback,
        organizationName: 'Ridgeback Timber Co.',
        role: 'manager',
        preferences: { decisionApproved: true, decisionReturned: true, categoryChanged: true, stillStretch: true, reviewDue: true },
      },
    ]);
    const foreign = await manager.put('/api/me/notification-preferences', {
      organizations: [{ organizationId: context.organizationId('slateHarbor'), preferences: { reviewDue: false } }],
    });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.fields).toEqual({ 'organizations.0.organizationId': expect.stringContaining('not a member') });
    const unknownType = await manager.put('/api/me/notification-preferences', {
      organizations: [{ organizationId: ridgeback, preferences: { everything: false } }],
    });
    expect(unknownType.status).toBe(400);
    const anonymous = await (await context.client()).get('/api/me/notification-preferences');
    expect(anonymous.status).toBe(401);
  });

  it('a returned draft e-mails its drafter, and only them, with the reviewer’s reason in both parts', async () => {
    const record = await draft({ category: 2 });
    const reason = 'Add the winter campaign results & check RT-011’s pump log before approval.';
    const answer = await analyst.post(`${recordUrl(record.id)}/return`, { comment: reason });
    expect(answer.status).toBe(200);
    const message = await mailTo(hygienist, 'returned');
    expect(message.subject).toBe(`Decision record ${record.id} returned for changes: ${woodDustName}`);
    expect(message.text).toContain('Jordan Ames returned your draft');
    expect(message.text).toContain(reason);
    // HTML-escaped in the HTML part (the reason is user input).
    expect(message.html).toContain('results &amp; check RT-011’s pump log');
    expect(message.html).toContain(`http://bellwether.test/orgs/${ridgeback}/decision-records/${record.id}`);
    expect(message.text).toContain('http://bellwether.test/account/notifications');
    expect(rowsFor('decisionReturned', record.id).map((row) => [row.recipientEmail, row.sentAt !== null, row.error])).toEqual([
      [hygienist.user.email, true, null],
    ]);
    expect(mailsWith(`Decision record ${record.id} returned`)).toHaveLength(1);
    // Resubmitted for the next test.
    expect((await hygienist.post(`${recordUrl(record.id)}/resubmit`)).status).toBe(200);
  });

  it('an approval e-mails the drafter and the managers with the category and the caution, and no category change on a first record', async () => {
    const open = (await analyst.get(groupUrl())).body.records.find((row: { status: string }) => row.status === 'draft');
    await approve(open.id);
    const toDrafter = await mailTo(hygienist, `Decision record ${open.id} approved`);
    const toManager = await mailTo(manager, `Decision record ${open.id} approved`);
    for (const message of [toDrafter, toManager]) {
      expect(message.subject).toBe(`Decision record ${open.id} approved: ${woodDustName}`);
      expect(message.text).toContain('Jordan Ames approved decision record');
      expect(message.text).toContain('Category 2: the 95th percentile is above 10 % and at most 50 % of the OEL.');
      expect(message.text).toContain('The next review is due by 2025-03-20.');
      expect(message.text).toContain(cautionLine);
      expect(message.html).toContain(cautionLine);
      expect(message.html).toContain(`/decision-records/${open.id}`);
    }
    expect(toManager.text).toContain('Hello Casey Brandt,');
    expect(rowsFor('decisionApproved', open.id).map((row) => row.recipientEmail)).toEqual([hygienist.user.email, manager.user.email]);
    expect(rowsFor('categoryChanged', open.id)).toEqual([]);
  });

  it('approving a record in another category tells managers and hygienists the old and new category', async () => {
    const record = await draft({ category: 3 });
    await approve(record.id);
    const subject = `Exposure category up from 2 to 3: ${woodDustName}`;
    const toManager = await mailTo(manager, subject);
    const toHygienist = await mailTo(hygienist, subject);
    expect(toManager.text).toContain(`puts the exposure group "${woodDustName}" in Ridgeback Timber Co. in category 3`);
    expect(toManager.text).toContain('had category 2');
    expect(toManager.text).toContain('Category 3: the 95th percentile is above 50 % and at most 100 % of the OEL.');
    expect(toHygienist.html).toContain(cautionLine);
    expect(
      rowsFor('categoryChanged', record.id)
        .map((row) => row.recipientEmail)
        .sort(),
    ).toEqual([hygienist.user.email, manager.user.email].sort());
    // The analyst and the admin are neither drafter, manager nor hygienist.
    expect(
      mailsWith(subject)
        .map((mail) => mail.to)
        .sort(),
    ).toEqual([hygienist.user.email, manager.user.email].sort());
  });

  it('a manager who switched off approvals is not e-mailed while the drafter still is', async () => {
    const saved = await manager.put('/api/me/notification-preferences', {
      organizations: [{ organizationId: ridgeback, preferences: { decisionApproved: false } }],
    });
    expect(saved.status).toBe(200);
    expect((saved.body as NotificationPreferencesView).organizations[0]!.preferences).toMatchObject({ decisionApproved: false, reviewDue: true });
    const record = await draft({ category: 3 });
    await approve(record.id);
    await mailTo(hygienist, `Decision record ${record.id} approved`);
    expect(rowsFor('decisionApproved', record.id).map((row) => row.recipientEmail)).toEqual([hygienist.user.email]);
    expect(mailsWith(`Decision record ${record.id} approved`).map((mail) => mail.to)).toEqual([hygienist.user.email]);
    // Same category as the record it replaces: no category e-mail.
    expect(rowsFor('categoryChanged', record.id)).toEqual([]);
  });

  it('a noise log with a still stretch e-mails its uploader unless they switched it off', async () => {
    const forklift = groupId(context.db, ridgeback, 'Forklift driver – noise');
    const driver = workerId(context.db, ridgeback, 'RT-014');
    const upload = (fileName: string, shiftDate: string) => {
      const demo = generateNoiseDemoLog({ seed: 7, hours: 1, benchMinutes: 16, knockCount: 2 });
      let call = hygienist.agent.post(`/api/orgs/${ridgeback}/noise-logs`).set('X-CSRF-Token', hygienist.csrfToken);
      for (const [key, value] of Object.entries({ exposureGroupId: forklift, workerId: driver, shiftDate, instrument: 'RT-DOS-07' }))
        call = call.field(key, String(value));
      return call.attach('file', Buffer.from(demo.text, 'utf8'), { filename: fileName, contentType: 'text/csv' });
    };
    const first = await upload('bench-one.csv', '2025-03-05');
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    const message = await mailTo(hygienist, 'bench-one.csv');
    expect(message.subject).toBe('Noise log bench-one.csv: the meter was still for 15 min or more');
    expect(message.text).toContain('worker RT-014, shift of 2025-03-05');
    expect(message.text).toContain('Hearing conservation requirements come from the local regulations');
    expect(message.text).toContain('http://bellwether.test/account/notifications');
    expect(message.html).toContain(`/orgs/${ridgeback}/noise-logs/${first.body.id}`);
    expect(rowsFor('stillStretch', first.body.id).map((row) => row.recipientEmail)).toEqual([hygienist.user.email]);

    const off = await hygienist.put('/api/me/notification-preferences', {
      organizations: [{ organizationId: ridgeback, preferences: { stillStretch: false } }],
    });
    expect(off.status).toBe(200);
    const second = await upload('bench-two.csv', '2025-03-06');
    expect(second.status).toBe(201);
    expect(second.body.stillStretchNotice).toBe(true);
    expect(rowsFor('stillStretch', second.body.id)).toEqual([]);
    expect(mailsWith('bench-two.csv')).toEqual([]);
  });

  it('the daily job reminds managers and hygienists of a review date within 30 days, once, and not a later one', async () => {
    const current = (await analyst.get(groupUrl())).body.records.find((row: { status: string }) => row.status === 'approved') as { id: number };
    const jobDeps = (now: string): NotifierDeps => ({
      db: context.db,
      mailer: ownMailer,
      clock: createFakeClock(now),
      logger: silentLogger,
      config: context.config,
    });

    // 2025-02-01: the review date (2025-03-20) is 47 days away, beyond the 30-day window.
    expect(await runReviewReminders(jobDeps('2025-02-01T06:00:00.000Z'))).toEqual({ records: 0, sent: 0, duplicates: 0, switchedOff: 0, failed: 0 });
    expect(ownCapture.outbox.list()).toEqual([]);

    // 2025-03-03 (the test clock): 17 days away; only the current approved record counts, not the superseded ones.
    const first = await runReviewReminders(jobDeps('2025-03-03T06:00:00.000Z'));
    expect(first).toEqual({ records: 1, sent: 2, duplicates: 0, switchedOff: 0, failed: 0 });
    const reminders = ownCapture.outbox.list();
    expect(reminders.map((mail) => mail.to).sort()).toEqual([hygienist.user.email, manager.user.email].sort());
    for (const message of reminders) {
      expect(message.subject).toBe(`Review due by 2025-03-20: ${woodDustName}`);
      expect(message.text).toContain(
        `decision record ${current.id} for the exposure group "${woodDustName}" in Ridgeback Timber Co. is due for review in 17 days, on 2025-03-20`,
      );
      expect(message.text).toContain(cautionLine);
      expect(message.html).toContain(`/decision-records/${current.id}`);
    }
    expect(rowsFor('reviewDue', current.id).map((row) => row.dedupeKey)).toEqual(
      expect.arrayContaining([`reviewDue:decision_record:${current.id}:2025-03-20:user:${manager.user.id}`]),
    );

    // The same day again, and the next day: nothing new.
    expect(await runReviewReminders(jobDeps('2025-03-03T18:00:00.000Z'))).toEqual({ records: 1, sent: 0, duplicates: 2, switchedOff: 0, failed: 0 });
    expect(await runReviewReminders(jobDeps('2025-03-04T06:00:00.000Z'))).toMatchObject({ sent: 0, duplicates: 2 });
    expect(ownCapture.outbox.list()).toHaveLength(2);
  });

  it('a failed send is kept with its error and logged, a retry sends it once, and a third call sends nothing', async () => {
    const failing: Mailer = { send: () => Promise.reject(new Error('connect ECONNREFUSED 127.0.0.1:2525')), close: () => undefined };
    const input = {
      organizationId: ridgeback,
      organizationName: 'Ridgeback Timber Co.',
      uploaderUserId: admin.user.id,
      noiseLogId: 987_654,
      fileName: 'retry.csv',
      workerCode: 'RT-014',
      shiftDate: '2025-03-02',
      stretches: [{ startS: 600, endS: 1620 }],
      stillMinutes: 15,
    };
    const deps = (mailer: Mailer): NotifierDeps => ({ db: context.db, mailer, clock: context.clock, logger: silentLogger, config: context.config });
    const errorsBefore = silentLogger.errors.length;

    await expect(notifyStillStretch(deps(failing), input)).resolves.toEqual({ sent: 0, duplicates: 0, switchedOff: 0, failed: 1 });
    expect(rowsFor('stillStretch', 987_654)).toEqual([
      expect.objectContaining({ recipientEmail: admin.user.email, sentAt: null, error: 'connect ECONNREFUSED 127.0.0.1:2525' }),
    ]);
    expect(silentLogger.errors.slice(errorsBefore)).toEqual(['a notification e-mail could not be sent']);

    await expect(notifyStillStretch(deps(ownMailer), input)).resolves.toEqual({ sent: 1, duplicates: 0, switchedOff: 0, failed: 0 });
    expect(rowsFor('stillStretch', 987_654)).toEqual([expect.objectContaining({ sentAt: context.clock.now().toISOString(), error: null })]);
    await expect(notifyStillStretch(deps(ownMailer), input)).resolves.toEqual({ sent: 0, duplicates: 1, switchedOff: 0, failed: 0 });
    expect(ownCapture.outbox.list().filter((mail) => mail.subject.includes('retry.csv'))).toHaveLength(1);
  });

  it('the server’s schedule runs the job at start and every 24 hours, and not after it is stopped', async () => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
    try {
      const runs: object[] = [];
      const logger = { error: silentLogger.error.bind(silentLogger), info: (object: object) => void runs.push(object) };
      const schedule = scheduleReviewReminders({ db: context.db, mailer: ownMailer, clock: context.clock, logger, config: context.config });
      await vi.waitFor(() => expect(runs).toHaveLength(1));
      // Everything due was sent by the previous test: this run finds it and sends nothing new.
      expect(runs[0]).toMatchObject({ job: 'review-reminders', records: 1, sent: 0, duplicates: 2 });
      vi.advanceTimersByTime(reviewReminderIntervalMs);
      await vi.waitFor(() => expect(runs).toHaveLength(2));
      schedule.stop();
      vi.advanceTimersByTime(3 * reviewReminderIntervalMs);
      await new Promise((resolve) => setImmediate(resolve));
      expect(runs).toHaveLength(2);
    } finally {
      vi.useRealTimers();
    }
  });
  it('a run with several newly due records sends each person one digest per organization, and each record stays reminded once', async () => {
    // Two more groups get approved records due on 2025-03-25 and 2025-04-01; the wood-dust record (2025-03-20) was reminded already.
    const newlyDue = [];
    for (const [name, reviewDate] of [
      ['Edger operator – noise', '2025-03-25'],
      ['Saw filer – noise', '2025-04-01'],
    ] as const) {
      const group = groupId(context.db, ridgeback, name);
      const record = await draft({ category: 2, reviewDate }, `/api/orgs/${ridgeback}/exposure-groups/${group}/decision-records`);
      await approve(record.id);
      newlyDue.push({ name, id: record.id, reviewDate });
    }
    const jobDeps: NotifierDeps = {
      db: context.db,
      mailer: ownMailer,
      clock: createFakeClock('2025-03-10T06:00:00.000Z'),
      logger: silentLogger,
      config: context.config,
    };
    const before = ownCapture.outbox.list().length;
    const reviewRows = () => context.db.$client.prepare(`SELECT COUNT(*) FROM notifications WHERE type = 'reviewDue'`).pluck().get() as number;
    const rowsBefore = reviewRows();
    const counts = await runReviewReminders(jobDeps);
    expect(counts).toMatchObject({ records: 3, failed: 0, duplicates: 2 });
    // The outbox lists newest first.
    const sent = ownCapture.outbox.list().slice(0, ownCapture.outbox.list().length - before);
    expect(sent).toHaveLength(counts.sent);
    const toRidgeback = sent.filter((mail) => mail.subject.includes('Ridgeback Timber Co.'));
    expect(toRidgeback.map((mail) => mail.to).sort()).toEqual([hygienist.user.email, manager.user.email].sort());
    for (const message of toRidgeback) {
      expect(message.subject).toBe('Reviews due: 2 exposure groups in Ridgeback Timber Co.');
      expect(message.text).toContain(`Edger operator – noise (decision record ${newlyDue[0]!.id}): review in 15 days, on 2025-03-25.`);
      expect(message.text).toContain(`Saw filer – noise (decision record ${newlyDue[1]!.id}): review in 22 days, on 2025-04-01.`);
      expect(message.text).not.toContain(woodDustName);
      expect(message.text).toContain(cautionLine);
      expect(message.html).toContain(`/orgs/${ridgeback}"`);
    }
    // One row per record and person, all carrying the digest's subject and sending time.
    for (const record of newlyDue) {
      expect(
        rowsFor('reviewDue', record.id)
          .map((row) => [row.recipientEmail, row.subject, row.sentAt])
          .sort(),
      ).toEqual(
        [hygienist.user.email, manager.user.email]
          .sort()
          .map((email) => [email, 'Reviews due: 2 exposure groups in Ridgeback Timber Co.', '2025-03-10T06:00:00.000Z']),
      );
    }
    // Again the same day: nothing new for anybody.
    const claimedFirst = reviewRows() - rowsBefore;
    expect(await runReviewReminders(jobDeps)).toEqual({
      records: counts.records,
      sent: 0,
      failed: 0,
      switchedOff: 0,
      duplicates: counts.duplicates + claimedFirst,
    });
    expect(ownCapture.outbox.list().length).toBe(before + sent.length);
  });
});
