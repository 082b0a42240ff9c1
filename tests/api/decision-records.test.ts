/**
 * Decision records (issue 7, PRODUCT.md capability 6 and "Who uses it"): a hygienist drafts, an analyst who
 * did not draft approves or returns with a comment, approval freezes the data (hash), versions, settings and
 * figures, approved records never change, later data marks them out of date, managers acknowledge once.
 * The review-date interval is EN 689:2018's reassessment guidance by GM/OEL (REFERENCES.md, from memory).
 */
import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GroupAssessmentResponse } from '@schema/assessment';
import { decisionRecords, type DecisionRecordView, type GroupDecisions } from '@schema/decision-records';
import { organizations } from '@schema/organizations';
import { canonicalJson, createAssessmentEngine, type AssessmentEngine } from '../../backend/src/services/assessment';
import { addMonths, reviewIntervalOf } from '../../backend/src/services/decision-records';
import { auditOf, groupId, workerId } from '../helpers/org-data';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

describe('decision records', () => {
  let engine: AssessmentEngine;
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  let analyst: SignedIn;
  let manager: SignedIn;
  let admin: SignedIn;
  let consultant: SignedIn;
  let woodDust: number;

  const groupUrl = (group: number, organization = ridgeback) => `/api/orgs/${organization}/exposure-groups/${group}/decision-records`;
  const recordUrl = (record: number, organization = ridgeback) => `/api/orgs/${organization}/decision-records/${record}`;

  /** A new draft on the wood-dust group by `who` (the group has no seeded records). */
  async function draft(who: SignedIn, body: object = {}): Promise<DecisionRecordView> {
    const answer = await who.post(groupUrl(woodDust), {
      rationale: 'Ten full-shift samples over the autumn campaign.',
      actions: 'Keep the booth doors shut.',
      ...body,
    });
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    return answer.body as DecisionRecordView;
  }

  /** Approves any open record of the wood-dust group so each test starts from "no open draft". */
  async function closeOpenDrafts(): Promise<void> {
    const list = (await analyst.get(groupUrl(woodDust))).body as GroupDecisions;
    for (const record of list.records.filter((row) => row.status === 'draft' || row.status === 'returned')) {
      if (record.status === 'returned') await (record.drafter.id === hygienist.user.id ? hygienist : admin).post(`${recordUrl(record.id)}/resubmit`);
      const approver = record.drafter.id === analyst.user.id ? admin : analyst;
      const answer = await approver.post(`${recordUrl(record.id)}/approve`);
      expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    }
  }

  beforeAll(async () => {
    engine = createAssessmentEngine();
    context = await createTestContext({ assessmentEngine: engine });
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    [hygienist, analyst, manager, admin, consultant] = await Promise.all([
      context.signInAs('hygienist'),
      context.signInAs('analyst'),
      context.signInAs('manager'),
      context.signInAs('admin'),
      context.signInAs('consultant'),
    ]);
    woodDust = groupId(context.db, ridgeback, 'Head sawyer – wood dust');
  });
  afterAll(async () => {
    await context.close();
    await engine.close();
  });

  it('review intervals follow EN 689 by GM/OEL (36/24/18/12 months, from memory) unless the organization sets one', () => {
    // REFERENCES.md "EN 689:2018": < 0.1 OELV 36 months, < 0.25 24, < 0.5 18, else 12 (from memory).
    expect(reviewIntervalOf(undefined, 0.05, 1).months).toBe(36);
    expect(reviewIntervalOf(undefined, 0.2, 1).months).toBe(24);
    expect(reviewIntervalOf(undefined, 0.3, 1).months).toBe(18);
    expect(reviewIntervalOf(undefined, 0.6, 1).months).toBe(12);
    expect(reviewIntervalOf(6, 0.05, 1)).toEqual({ months: 6, source: 'Organization setting: review every 6 months' });
    // Calendar months, clamped to the month's last day (common practice).
    expect(addMonths('2025-03-03', 24)).toBe('2027-03-03');
    expect(addMonths('2024-01-31', 1)).toBe('2024-02-29');
  });

  it('a draft takes its category, judgement and review date from the assessment, with the exclusions and the EN 689 source', async () => {
    const assessment = (await analyst.get(`/api/orgs/${ridgeback}/exposure-groups/${woodDust}/assessment`)).body as GroupAssessmentResponse;
    const record = await draft(hygienist);
    expect(record).toMatchObject({
      status: 'draft',
      category: assessment.classical.categoryByP95,
      judgement: assessment.classical.judgement,
      drafter: { id: hygienist.user.id, name: 'Dana Whitlock' },
      approver: null,
      figures: null,
      dataHash: null,
      outOfDate: false,
    });
    const months = reviewIntervalOf(undefined, assessment.classical.gm, assessment.group.oel).months;
    // The fake clock stands at 2025-03-03.
    expect(record.reviewDate).toBe(addMonths('2025-03-03', months));
    expect(record.reviewDateSource).toMatch(/^EN 689:2018 reassessment guidance \(from memory\): GM is .* % of the OEL → \d+ months$/);
    expect(auditOf(context.db, 'decision_record', record.id).map((event) => event.action)).toEqual(['drafted']);
    await closeOpenDrafts();
  });

  it('the drafter cannot approve their own draft (403 with the reason), even as an admin who may approve', async () => {
    const record = await draft(admin);
    const answer = await admin.post(`${recordUrl(record.id)}/approve`);
    expect(answer.status).toBe(403);
    expect(answer.body.error.message).toBe('You drafted this record: another analyst must approve it');
    const stored = (await admin.get(recordUrl(record.id))).body as DecisionRecordView;
    expect(stored.status).toBe('draft');
    await closeOpenDrafts();
  });

  it('approval freezes the exact results used, the SHA-256 of their canonical JSON, versions, settings and figures', async () => {
    const assessmentBefore = (await analyst.get(`/api/orgs/${ridgeback}/exposure-groups/${woodDust}/assessment`)).body as GroupAssessmentResponse;
    const outlier = [...assessmentBefore.data.results].sort((a, b) => b.value - a.value)[0];
    const record = await draft(hygienist, { exclusions: [{ resultId: outlier.id, reason: 'Sample tube cracked at the lab' }] });
    expect(record.exclusions).toEqual([{ resultId: outlier.id, reason: 'Sample tube cracked at the lab' }]);
    const answer = await analyst.post(`${recordUrl(record.id)}/approve`);
    expect(answer.status).toBe(200);
    const approved = answer.body as DecisionRecordView;
    const whatIf = (await analyst.get(`/api/orgs/${ridgeback}/exposure-groups/${woodDust}/assessment?exclude=${outlier.id}`)).body as GroupAssessmentResponse;
    expect(approved).toMatchObject({
      status: 'approved',
      approver: { id: analyst.user.id, name: 'Jordan Ames' },
      dataVersionAtApproval: whatIf.group.dataVersion,
    });
    expect(approved.frozenInputs!.results.map((result) => result.id)).toEqual(whatIf.data.results.map((result) => result.id));
    expect(approved.frozenInputs!.excluded).toEqual([
      {
        id: outlier.id,
        workerCode: outlier.workerCode,
        date: outlier.date,
        value: outlier.value,
        nonDetect: outlier.nonDetect,
        reason: 'Sample tube cracked at the lab',
      },
    ]);
    // The hash is the assessment's: SHA-256 of the canonical JSON of the values used, the OEL, action level and settings.
    const document = {
      values: whatIf.data.results.map((result) => ({ workerCode: result.workerCode, date: result.date, value: result.value, nonDetect: result.nonDetect })),
      oel: whatIf.group.oel,
      actionLevel: whatIf.group.actionLevel,
      settings: whatIf.settings,
    };
    expect(approved.dataHash).toBe(createHash('sha256').update(canonicalJson(document), 'utf8').digest('hex'));
    expect(approved.figures!.classical).toEqual(whatIf.classical);
    expect(approved.figures!.report).toEqual(whatIf.report);
    expect(approved.engineVersion).toEqual(whatIf.engineVersion);
    expect(approved.settings).toEqual(whatIf.settings);
    expect(approved.method).toBe(whatIf.classical.fit.method);
    expect(approved.cautions.join(' ')).toContain('never replace the judgement of a qualified hygienist');
    // The record's cautions and the frozen assessment's are merged without saying the same sentence twice.
    expect(approved.cautions.filter((caution) => caution.startsWith('Statistics support and never replace'))).toHaveLength(1);
    expect(approved.cautions.filter((caution) => caution.startsWith('Limits, sampling duties'))).toHaveLength(1);
  });

  it('an approved record is immutable: the API answers 409 and SQLite refuses a raw UPDATE or DELETE', async () => {
    const current = ((await analyst.get(groupUrl(woodDust))).body as GroupDecisions).records.find((record) => record.status === 'approved')!;
    const edit = await hygienist.patch(recordUrl(current.id), { rationale: 'Changed afterwards' });
    expect(edit.status).toBe(409);
    expect(edit.body.error.message).toBe(`Decision record ${current.id} is approved and cannot be changed (edit); draft a new record instead`);
    const again = await admin.post(`${recordUrl(current.id)}/approve`);
    expect(again.status).toBe(409);
    const returned = await analyst.post(`${recordUrl(current.id)}/return`, { comment: 'Too late' });
    expect(returned.status).toBe(409);

    const sqlite = context.db.$client;
    expect(() => sqlite.prepare('UPDATE decision_records SET category = 0 WHERE id = ?').run(current.id)).toThrow(
      'decision_records: an approved decision record cannot be changed',
    );
    expect(() => sqlite.prepare("UPDATE decision_records SET figures = '{}' WHERE id = ?").run(current.id)).toThrow('cannot be changed');
    expect(() => sqlite.prepare("UPDATE decision_records SET status = 'draft' WHERE id = ?").run(current.id)).toThrow('cannot be changed');
    expect(() => sqlite.prepare('DELETE FROM decision_records WHERE id = ?').run(current.id)).toThrow('decision_records: a decision record cannot be deleted');
    const row = context.db.select().from(decisionRecords).where(eq(decisionRecords.id, current.id)).get()!;
    expect(row.status).toBe('approved');
    expect(row.rationale).not.toBe('Changed afterwards');
  });

  it('a new result after approval marks the record out of date and the API offers a new draft', async () => {
    await closeOpenDrafts();
    const before = (await manager.get(groupUrl(woodDust))).body as GroupDecisions;
    const current = before.records.find((record) => record.status === 'approved')!;
    expect(current.outOfDate).toBe(false);
    expect(before.offerNewDraft).toBe(false);

    const added = await hygienist.post(`/api/orgs/${ridgeback}/shift-results`, {
      exposureGroupId: woodDust,
      workerId: workerId(context.db, ridgeback, 'RT-001'),
      date: '2025-02-11',
      value: 0.9,
    });
    expect(added.status, JSON.stringify(added.body)).toBe(201);

    const after = (await manager.get(groupUrl(woodDust))).body as GroupDecisions;
    const stale = after.records.find((record) => record.id === current.id)!;
    expect(stale.outOfDate).toBe(true);
    expect(after.offerNewDraft).toBe(true);
    expect(after.offerReason).toBe(`Results changed after decision record ${current.id} was approved: it is out of date. Draft a new record.`);
    const full = (await manager.get(recordUrl(current.id))).body as DecisionRecordView;
    // The frozen figures stay as approved.
    expect(full.figures!.classical.n).toBe(full.frozenInputs!.results.length);
    expect(full.groupDataVersion).toBeGreaterThan(full.dataVersionAtApproval!);
  });

  it('returned → edited → resubmitted → approved, with the return comment required and kept', async () => {
    await closeOpenDrafts();
    const record = await draft(hygienist, { category: 2, judgement: 'uncertain' });
    const missing = await analyst.post(`${recordUrl(record.id)}/return`, { comment: '  ' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toEqual({ comment: 'Say what must change before approval' });

    const returned = await analyst.post(`${recordUrl(record.id)}/return`, { comment: 'Say why the outlier stays in.' });
    expect(returned.status).toBe(200);
    expect(returned.body).toMatchObject({ status: 'returned', returnComment: 'Say why the outlier stays in.', returnedBy: { id: analyst.user.id } });
    const early = await analyst.post(`${recordUrl(record.id)}/approve`);
    expect(early.status).toBe(409);

    const stranger = await admin.patch(recordUrl(record.id), { rationale: 'Not mine' });
    expect(stranger.status).toBe(403);
    const edited = await hygienist.patch(recordUrl(record.id), { rationale: 'The highest result is within the spread of the others; it stays.' });
    expect(edited.status).toBe(200);
    const resubmitted = await hygienist.post(`${recordUrl(record.id)}/resubmit`);
    expect(resubmitted.body.status).toBe('draft');
    const approved = await analyst.post(`${recordUrl(record.id)}/approve`);
    expect(approved.status).toBe(200);
    expect(approved.body).toMatchObject({
      status: 'approved',
      category: 2,
      judgement: 'uncertain',
      rationale: 'The highest result is within the spread of the others; it stays.',
    });
    expect(auditOf(context.db, 'decision_record', record.id).map((event) => event.action)).toEqual([
      'drafted',
      'returned',
      'edited',
      'resubmitted',
      'approved',
    ]);
  });

  it('history lists what changed between consecutive approved records; the older one is superseded', async () => {
    await closeOpenDrafts();
    const list = (await manager.get(groupUrl(woodDust))).body as GroupDecisions;
    const approved = list.records.filter((record) => record.status === 'approved');
    expect(approved).toHaveLength(1);
    expect(list.records.filter((record) => record.status === 'superseded').length).toBeGreaterThanOrEqual(2);
    const newest = list.history[0];
    expect(newest.toId).toBe(approved[0].id);
    // The previous approval left one result out and had fewer results; the newest has the added result too.
    const fields = Object.fromEntries(newest.changes.map((change) => [change.field, change]));
    expect(fields.n).toBeDefined();
    expect(Number(fields.n.after)).toBeGreaterThan(Number(fields.n.before));
    expect(fields.p95.before).not.toBe(fields.p95.after);
    expect(fields.dataHash).toBeDefined();
    const superseded = list.records.find((record) => record.id === newest.fromId)!;
    expect(superseded.status).toBe('superseded');
  });

  it('a manager acknowledges an approved record once; a second time is refused (409); it is audited', async () => {
    const current = ((await manager.get(groupUrl(woodDust))).body as GroupDecisions).records.find((record) => record.status === 'approved')!;
    const first = await manager.post(`${recordUrl(current.id)}/acknowledge`);
    expect(first.status).toBe(200);
    expect(first.body.acknowledgedBy).toEqual([{ id: manager.user.id, name: 'Casey Brandt', at: '2025-03-03T08:00:00.000Z' }]);
    const second = await manager.post(`${recordUrl(current.id)}/acknowledge`);
    expect(second.status).toBe(409);
    expect(second.body.error.message).toBe(`You already acknowledged decision record ${current.id} on 2025-03-03`);
    expect(auditOf(context.db, 'decision_record', current.id).filter((event) => event.action === 'acknowledged')).toHaveLength(1);
    expect(() => context.db.$client.prepare('DELETE FROM decision_acknowledgements').run()).toThrow('cannot be deleted');
  });

  it('roles without the permission are refused (403): manager drafting, hygienist approving, analyst acknowledging', async () => {
    const current = ((await manager.get(groupUrl(woodDust))).body as GroupDecisions).records.find((record) => record.status === 'approved')!;
    expect((await manager.post(groupUrl(woodDust), { rationale: 'x' })).status).toBe(403);
    expect((await hygienist.post(`${recordUrl(current.id)}/approve`)).status).toBe(403);
    expect((await analyst.post(`${recordUrl(current.id)}/acknowledge`)).status).toBe(403);
    expect((await consultant.post(`${recordUrl(current.id)}/return`, { comment: 'x' })).status).toBe(403);
    // Consultants comment.
    const comment = await consultant.post(`${recordUrl(current.id)}/comments`, { body: 'Agreed; see the evidence pack.' });
    expect(comment.status).toBe(201);
    expect(comment.body.comments.at(-1)).toMatchObject({ author: { name: 'Taylor Fenwick' }, body: 'Agreed; see the evidence pack.' });
  });

  it('another organization’s record and group are not found (404), even for its consultant through the wrong address', async () => {
    const current = ((await manager.get(groupUrl(woodDust))).body as GroupDecisions).records.find((record) => record.status === 'approved')!;
    const slateAdmin = await context.signInAs('admin', 'slateHarbor');
    expect((await slateAdmin.get(recordUrl(current.id, slateHarbor))).status).toBe(404);
    expect((await slateAdmin.get(groupUrl(woodDust, slateHarbor))).status).toBe(404);
    expect((await consultant.get(recordUrl(current.id, slateHarbor))).status).toBe(404);
    expect((await slateAdmin.get(recordUrl(current.id))).status).toBe(404);
  });

  it('a draft with bad input is refused with the field named; a second open draft is refused (409)', async () => {
    const bad = await hygienist.post(groupUrl(woodDust), { rationale: '', category: 7, exclusions: [{ resultId: 999999, reason: '' }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toMatchObject({
      rationale: 'Write the rationale',
      category: 'Use a category from 0 to 4',
      'exclusions.0.reason': 'Say why this result is left out',
    });
    const unknown = await hygienist.post(groupUrl(woodDust), { rationale: 'x', exclusions: [{ resultId: 999999, reason: 'typo' }] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields).toEqual({ exclusions: 'result 999999 is not a valid result of this group' });
    await draft(hygienist);
    const second = await hygienist.post(groupUrl(woodDust), { rationale: 'again' });
    expect(second.status).toBe(409);
    await closeOpenDrafts();
  });

  it('the organization’s reviewIntervalMonths setting replaces the EN 689 proposal', async () => {
    context.db
      .update(organizations)
      .set({ settings: { reviewIntervalMonths: 6 } })
      .where(eq(organizations.id, ridgeback))
      .run();
    const proposal = await hygienist.get(`${groupUrl(woodDust)}/proposal`);
    expect(proposal.status).toBe(200);
    expect(proposal.body).toMatchObject({ reviewDate: '2025-09-03', reviewDateSource: 'Organization setting: review every 6 months', reviewIntervalMonths: 6 });
    context.db.update(organizations).set({ settings: {} }).where(eq(organizations.id, ridgeback)).run();
  });
});
