/**
 * The organization's register of decision records (GET /orgs/:orgId/decision-records): every record of an
 * organization, searched, filtered, sorted and paged on the server like the other lists (schema/list-query.ts).
 * Records come from the demo (two approved, one draft, one returned at Ridgeback Timber) plus three made here
 * through the API: drafted by the hygienist, approved by the analyst. Each filter is checked against the
 * same filter applied by hand to the whole unfiltered register, and against the records made here.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DecisionRecordListItem, DecisionRecordView } from '@schema/decision-records';
import type { ListPage } from '@schema/list-query';
import { groupId, siteId, workerId } from '../helpers/org-data';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

describe('the decision-record register', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  let analyst: SignedIn;
  let manager: SignedIn;
  let consultant: SignedIn;
  /** The wood-dust group's first approved record (review 2027-01-01), superseded by `woodDust`. */
  let supersededRecord: DecisionRecordView;
  /** Approved, review date 2025-04-01, then a new result: out of date. */
  let woodDust: DecisionRecordView;
  /** Approved, at the planing mill, review date 2027-06-01. */
  let forkliftRecord: DecisionRecordView;
  /** Every Ridgeback record, as the register lists them with no filter. */
  let everything: DecisionRecordListItem[];

  const registerUrl = (organization = ridgeback) => `/api/orgs/${organization}/decision-records`;

  async function register(who: SignedIn, query: string): Promise<ListPage<DecisionRecordListItem>> {
    const answer = await who.get(`${registerUrl()}?${query}`);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    return answer.body as ListPage<DecisionRecordListItem>;
  }

  /** Drafts on a group as the hygienist and approves as the analyst; the clock moves a minute after each step. */
  async function draftAndApprove(group: number, body: object): Promise<DecisionRecordView> {
    const drafted = await hygienist.post(`/api/orgs/${ridgeback}/exposure-groups/${group}/decision-records`, {
      rationale: 'Full-shift samples from the spring campaign.',
      ...body,
    });
    expect(drafted.status, JSON.stringify(drafted.body)).toBe(201);
    context.clock.advance(60_000);
    const approved = await analyst.post(`/api/orgs/${ridgeback}/decision-records/${(drafted.body as DecisionRecordView).id}/approve`);
    expect(approved.status, JSON.stringify(approved.body)).toBe(200);
    context.clock.advance(60_000);
    return approved.body as DecisionRecordView;
  }

  async function addResult(group: number, workerCode: string, value: number): Promise<void> {
    const added = await hygienist.post(`/api/orgs/${ridgeback}/shift-results`, {
      exposureGroupId: group,
      workerId: workerId(context.db, ridgeback, workerCode),
      date: '2025-02-11',
      value,
    });
    expect(added.status, JSON.stringify(added.body)).toBe(201);
  }

  const idsOf = (page: ListPage<DecisionRecordListItem>) => page.items.map((item) => item.id);
  /** Ids of the whole register that pass `keep`, in the register's default order. */
  const expectedIds = (keep: (item: DecisionRecordListItem) => boolean) => everything.filter(keep).map((item) => item.id);

  beforeAll(async () => {
    context = await createTestContext({ decisions: true });
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    [hygienist, analyst, manager, consultant] = await Promise.all([
      context.signInAs('hygienist'),
      context.signInAs('analyst'),
      context.signInAs('manager'),
      context.signInAs('consultant'),
    ]);
    context.clock.advance(60_000);
    const headSawyerDust = groupId(context.db, ridgeback, 'Head sawyer – wood dust');
    supersededRecord = await draftAndApprove(headSawyerDust, { category: 0, judgement: 'acceptable', reviewDate: '2027-01-01' });
    woodDust = await draftAndApprove(headSawyerDust, { category: 3, judgement: 'unacceptable', reviewDate: '2025-04-01' });
    await addResult(headSawyerDust, 'RT-001', 0.9);
    // The forklift group has two demo results; a third lets it be assessed.
    const forklift = groupId(context.db, ridgeback, 'Forklift driver – noise');
    await addResult(forklift, 'RT-014', 40);
    forkliftRecord = await draftAndApprove(forklift, { category: 1, judgement: 'acceptable', reviewDate: '2027-06-01' });
    everything = (await register(manager, 'pageSize=200')).items;
  }, 60_000);
  afterAll(async () => {
    await context.close();
  });

  it('lists every record of the organization, newest change first, with its site', async () => {
    // Four demo records at Ridgeback plus the three made here; Slate Harbor's record is not among them.
    expect(everything).toHaveLength(7);
    // The superseded record changed when its successor was approved (same minute): ties go by id.
    expect(everything.slice(0, 3).map((item) => item.id)).toEqual([forkliftRecord.id, supersededRecord.id, woodDust.id]);
    const first = everything[0]!;
    expect(first).toMatchObject({
      id: forkliftRecord.id,
      exposureGroupName: 'Forklift driver – noise',
      siteId: siteId(context.db, ridgeback, 'Ridgeback planing mill'),
      siteName: 'Ridgeback planing mill',
      status: 'approved',
      category: 1,
      judgement: 'acceptable',
      reviewDate: '2027-06-01',
      drafter: { id: hygienist.user.id },
      approver: { id: analyst.user.id },
      outOfDate: false,
    });
    const page = await register(manager, '');
    expect(page).toMatchObject({ total: 7, page: 1, pageSize: 50, pageCount: 1 });
    expect(idsOf(page)).toEqual(everything.map((item) => item.id));
  });

  it('filters by status, including superseded records', async () => {
    for (const status of ['draft', 'returned', 'approved', 'superseded'] as const) {
      const page = await register(manager, `status=${status}`);
      expect(idsOf(page), status).toEqual(expectedIds((item) => item.status === status));
      expect(page.total, status).toBe(page.items.length);
    }
    expect(idsOf(await register(manager, 'status=superseded'))).toEqual([supersededRecord.id]);
    expect((await register(manager, 'status=approved')).total).toBe(4);
  });

  it('filters by category and by judgement', async () => {
    const high = await register(manager, 'category=3');
    expect(idsOf(high)).toContain(woodDust.id);
    expect(idsOf(high)).toEqual(expectedIds((item) => item.category === 3));
    expect(idsOf(await register(manager, 'category=0'))).toEqual(expectedIds((item) => item.category === 0));
    const unacceptable = await register(manager, 'judgement=unacceptable');
    expect(idsOf(unacceptable)).toContain(woodDust.id);
    expect(idsOf(unacceptable)).toEqual(expectedIds((item) => item.judgement === 'unacceptable'));
    const combined = await register(manager, 'judgement=acceptable&category=1');
    expect(idsOf(combined)).toContain(forkliftRecord.id);
    expect(idsOf(combined)).toEqual(expectedIds((item) => item.judgement === 'acceptable' && item.category === 1));
  });

  it('filters by site', async () => {
    const planingMill = siteId(context.db, ridgeback, 'Ridgeback planing mill');
    const page = await register(manager, `siteId=${planingMill}`);
    // The returned demo record of the planer feeders and the forklift record.
    expect(page.total).toBe(2);
    expect(idsOf(page)).toEqual(expectedIds((item) => item.siteId === planingMill));
  });

  it('finds approved records whose results changed since (out of date), and the rest', async () => {
    expect(everything.find((item) => item.id === woodDust.id)!.outOfDate).toBe(true);
    expect(idsOf(await register(manager, 'outOfDate=true'))).toEqual([woodDust.id]);
    expect(idsOf(await register(manager, 'outOfDate=false'))).toEqual(expectedIds((item) => !item.outOfDate));
  });

  it('finds approved records due for review on or before a date', async () => {
    expect(idsOf(await register(manager, 'reviewBy=2025-04-01'))).toEqual([woodDust.id]);
    expect(idsOf(await register(manager, 'reviewBy=2025-03-31'))).toEqual([]);
    // The superseded wood-dust record (2027-01-01) is not due: only approved records count.
    const byMid2027 = await register(manager, 'reviewBy=2027-06-01');
    expect(idsOf(byMid2027)).toEqual(expectedIds((item) => item.status === 'approved' && item.reviewDate <= '2027-06-01'));
    expect(idsOf(byMid2027)).not.toContain(supersededRecord.id);
    expect(idsOf(byMid2027)).toContain(forkliftRecord.id);
  });

  it('searches the exposure group name and the site name', async () => {
    expect(idsOf(await register(manager, 'q=forklift'))).toEqual([forkliftRecord.id]);
    const woodDustGroups = await register(manager, `q=${encodeURIComponent('WOOD DUST')}`);
    expect(idsOf(woodDustGroups)).toEqual(expectedIds((item) => item.exposureGroupName.endsWith('wood dust')));
    expect(idsOf(woodDustGroups)).toEqual(expect.arrayContaining([supersededRecord.id, woodDust.id]));
    const bySite = await register(manager, `q=${encodeURIComponent('planing mill')}`);
    expect(idsOf(bySite)).toEqual(expectedIds((item) => item.siteName === 'Ridgeback planing mill'));
    expect(bySite.total).toBe(2);
    // The rationale is not searched.
    expect((await register(manager, 'q=spring campaign')).total).toBe(0);
  });

  it('sorts by review date, group name and category, both ways', async () => {
    const byReview = (await register(manager, 'sort=reviewDate')).items.map((item) => item.reviewDate);
    expect(byReview).toEqual([...byReview].sort());
    expect(byReview[0]).toBe('2025-04-01');
    const byReviewDescending = (await register(manager, 'sort=-reviewDate')).items.map((item) => item.reviewDate);
    expect(byReviewDescending).toEqual([...byReview].reverse());
    const byName = (await register(manager, 'sort=exposureGroupName')).items.map((item) => item.exposureGroupName);
    expect(byName).toEqual([...byName].sort());
    const byCategory = (await register(manager, 'sort=-category')).items.map((item) => item.category);
    expect(byCategory).toEqual([...byCategory].sort((a, b) => b - a));
    const byApproval = (await register(manager, 'sort=-approvedAt')).items;
    expect(byApproval[0]!.id).toBe(forkliftRecord.id);
  });

  it('pages with totals: every record once across the pages', async () => {
    const pages = await Promise.all([1, 2, 3].map((page) => register(manager, `pageSize=3&page=${page}`)));
    expect(pages.map((page) => page.items.length)).toEqual([3, 3, 1]);
    for (const page of pages) expect(page).toMatchObject({ total: 7, pageSize: 3, pageCount: 3 });
    expect(pages.flatMap(idsOf)).toEqual(everything.map((item) => item.id));
    expect((await register(manager, 'pageSize=3&page=4')).items).toEqual([]);
  });

  it('answers 400 naming the parameter for a bad category, status, flag, date or sort', async () => {
    const cases: Array<[string, string]> = [
      ['category=7', 'category'],
      ['category=', 'category'],
      ['status=closed', 'status'],
      ['judgement=fine', 'judgement'],
      ['outOfDate=yes', 'outOfDate'],
      ['reviewBy=2025-13-01', 'reviewBy'],
      ['sort=rationale', 'sort'],
      ['pageSize=0', 'pageSize'],
    ];
    for (const [query, field] of cases) {
      const answer = await manager.get(`${registerUrl()}?${query}`);
      expect(answer.status, query).toBe(400);
      expect(Object.keys(answer.body.error.fields), query).toEqual([field]);
    }
    expect((await manager.get(`${registerUrl()}?category=7`)).body.error.fields.category).toBe('Use a category from 0 to 4');
  });

  it('answers 404 for another organization and keeps each organization to its own records', async () => {
    expect((await manager.get(registerUrl(slateHarbor))).status).toBe(404);
    const slateAnalyst = await context.signInAs('analyst', 'slateHarbor');
    const slate = await slateAnalyst.get(registerUrl(slateHarbor));
    expect(slate.status).toBe(200);
    const slatePage = slate.body as ListPage<DecisionRecordListItem>;
    expect(slatePage.items.map((item) => item.exposureGroupName)).toEqual(['Installer – respirable crystalline silica']);
    expect(slatePage.items.some((item) => everything.some((mine) => mine.id === item.id))).toBe(false);
  });

  it('a consultant reads the same register as the manager', async () => {
    const asConsultant = await register(consultant, 'pageSize=200');
    expect(idsOf(asConsultant)).toEqual(everything.map((item) => item.id));
  });
});
