import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { auditOf, groupId, workerId } from '../helpers/org-data';

describe('workers', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  let base: string;
  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    hygienist = await context.signInAs('hygienist');
    base = `/api/orgs/${ridgeback}/workers`;
  });
  afterAll(() => context.close());

  it('creates a worker with a code, optional name and job title; the audit records that a name was set, never the name', async () => {
    const answer = await hygienist.post(base, { code: 'RT-100', name: 'Jamie Rowntree', jobTitle: 'Grader' });
    expect(answer.status).toBe(201);
    expect(answer.body).toMatchObject({ code: 'RT-100', name: 'Jamie Rowntree', jobTitle: 'Grader', archived: false, memberships: [] });
    const [event] = auditOf(context.db, 'worker', answer.body.id);
    expect(event.after).toEqual({ code: 'RT-100', jobTitle: 'Grader', nameRecorded: true });
    expect(JSON.stringify(event)).not.toContain('Rowntree');
    const noName = await hygienist.post(base, { code: 'RT-101' });
    expect(noName.body).toMatchObject({ code: 'RT-101', name: null, jobTitle: '' });
  });

  it('a code is unique in the organization, whatever its case (409); a malformed code answers 400 naming code', async () => {
    const clash = await hygienist.post(base, { code: 'rt-001' });
    expect(clash.status).toBe(409);
    expect(clash.body.error.message).toMatch(/Worker code "RT-001" is already used in this organization/);
    const bad = await hygienist.post(base, { code: 'RT 001!' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ code: 'Use letters, digits, dots, hyphens and underscores' });
  });

  it('the same code may exist in another organization', async () => {
    const slateAdmin = await context.signInAs('admin', 'slateHarbor');
    const answer = await slateAdmin.post(`/api/orgs/${slateHarbor}/workers`, { code: 'RT-100' });
    expect(answer.status).toBe(201);
  });

  it('lists with search, job-title and group filters, sort and pages; shows each worker’s current groups', async () => {
    const search = await hygienist.get(`${base}?q=okafor`);
    expect(search.body.items.map((worker: { code: string }) => worker.code)).toEqual(['RT-005']);
    expect(search.body.items[0].currentGroups.map((group: { name: string }) => group.name)).toEqual(['Planer feeder – noise', 'Planer feeder – wood dust']);
    const byTitle = await hygienist.get(`${base}?jobTitle=saw%20filer`);
    expect(byTitle.body.items.map((worker: { code: string }) => worker.code)).toEqual(['RT-006', 'RT-007']);
    const edger = groupId(context.db, ridgeback, 'Edger operator – noise');
    const membersThen = await hygienist.get(`${base}?groupId=${edger}&memberOn=2024-01-15`);
    expect(membersThen.body.items.map((worker: { code: string }) => worker.code)).toEqual(['RT-003', 'RT-004', 'RT-005']);
    const membersNow = await hygienist.get(`${base}?groupId=${edger}`);
    expect(membersNow.body.items.map((worker: { code: string }) => worker.code)).toEqual(['RT-003', 'RT-004']);
    const sorted = await hygienist.get(`${base}?sort=-code&pageSize=2`);
    expect(sorted.body.items.map((worker: { code: string }) => worker.code)).toEqual(['RT-101', 'RT-100']);
    const badDate = await hygienist.get(`${base}?memberOn=15/01/2024`);
    expect(badDate.body.error.fields).toEqual({ memberOn: 'Use a date written YYYY-MM-DD' });
  });

  it('edits and archives a worker; another organization’s worker answers 404', async () => {
    const id = workerId(context.db, ridgeback, 'RT-101');
    const edited = await hygienist.patch(`${base}/${id}`, { jobTitle: 'Yard hand' });
    expect(edited.body.jobTitle).toBe('Yard hand');
    const archived = await hygienist.post(`${base}/${id}/archive`, { reason: 'Left the company' });
    expect(archived.body.archived).toBe(true);
    expect(auditOf(context.db, 'worker', id).at(-1)).toMatchObject({ action: 'archived', reason: 'Left the company' });
    const foreign = workerId(context.db, slateHarbor, 'SH-001');
    expect((await hygienist.get(`${base}/${foreign}`)).status).toBe(404);
    expect((await hygienist.patch(`${base}/${foreign}`, { jobTitle: 'x' })).status).toBe(404);
  });

  it('a manager reads workers with names but cannot create them (403)', async () => {
    const manager = await context.signInAs('manager');
    const list = await manager.get(`${base}?q=RT-001`);
    expect(list.body.items[0]).toMatchObject({ code: 'RT-001', name: 'Alex Corran' });
    expect((await manager.post(base, { code: 'RT-200' })).status).toBe(403);
  });
});

describe('worker names are never sent to a role without workerNames:read (consultants)', () => {
  let context: TestContext;
  let ridgeback: number;
  let consultant: SignedIn;
  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    consultant = await context.signInAs('consultant');
  });
  afterAll(() => context.close());

  /** Every demo worker name in Ridgeback, to look for in whole answers. */
  const names = [
    'Alex Corran',
    'Billie Tarrant',
    'Sam Okafor-Reid',
    'Kit Lindqvist',
    'Robin Achterberg',
    'Jesse Maranta',
    'Noor Haddley',
    'Frankie Dunmore',
    'Lee Varga',
  ];
  const expectNoNames = (body: unknown) => {
    const text = JSON.stringify(body);
    for (const name of names) expect(text).not.toContain(name);
  };

  it('lists and single workers come without the name key and with nameHidden', async () => {
    const list = await consultant.get(`/api/orgs/${ridgeback}/workers?pageSize=200`);
    expect(list.status).toBe(200);
    expect(list.body.items.length).toBe(16);
    for (const worker of list.body.items) {
      expect(worker).not.toHaveProperty('name');
      expect(worker.nameHidden).toBe(true);
    }
    expectNoNames(list.body);
    const one = await consultant.get(`/api/orgs/${ridgeback}/workers/${workerId(context.db, ridgeback, 'RT-001')}`);
    expect(one.body).toMatchObject({ code: 'RT-001', nameHidden: true });
    expect(one.body).not.toHaveProperty('name');
  });

  it('a search by name finds nothing and sorting by name is refused (400), so order cannot reveal names', async () => {
    const search = await consultant.get(`/api/orgs/${ridgeback}/workers?q=Corran`);
    expect(search.body.total).toBe(0);
    const sort = await consultant.get(`/api/orgs/${ridgeback}/workers?sort=name`);
    expect(sort.status).toBe(400);
    expect(sort.body.error.fields).toEqual({ sort: 'Sorting by name needs the permission to see worker names' });
  });

  it('group members, the group overview, plans, field sheets and results carry codes only', async () => {
    const group = groupId(context.db, ridgeback, 'Head sawyer – noise');
    const members = await consultant.get(`/api/orgs/${ridgeback}/exposure-groups/${group}/members`);
    expect(members.body.map((member: { worker: { code: string } }) => member.worker.code)).toEqual(['RT-001', 'RT-002']);
    expectNoNames(members.body);
    const overview = await consultant.get(`/api/orgs/${ridgeback}/exposure-groups/${group}/overview`);
    expect(overview.status).toBe(200);
    expect(overview.body.results.length).toBeGreaterThan(0);
    expectNoNames(overview.body);
    const planId = overview.body.currentPlan.id;
    expectNoNames((await consultant.get(`/api/orgs/${ridgeback}/sampling-plans/${planId}`)).body);
    const sheet = await consultant.get(`/api/orgs/${ridgeback}/sampling-plans/${planId}/field-sheet`);
    expect(sheet.status).toBe(200);
    expectNoNames(sheet.body);
    const results = await consultant.get(`/api/orgs/${ridgeback}/shift-results?pageSize=200`);
    expect(results.body.items.length).toBeGreaterThan(0);
    expectNoNames(results.body);
    const one = await consultant.get(`/api/orgs/${ridgeback}/shift-results/${results.body.items[0].id}`);
    expect(one.body.worker).toEqual({ id: expect.any(Number), code: expect.any(String), jobTitle: expect.any(String), nameHidden: true });
  });

  it('the same answers do carry names for a hygienist (the check above can fail)', async () => {
    const hygienist = await context.signInAs('hygienist');
    const group = groupId(context.db, ridgeback, 'Head sawyer – noise');
    const members = await hygienist.get(`/api/orgs/${ridgeback}/exposure-groups/${group}/members`);
    expect(JSON.stringify(members.body)).toContain('Alex Corran');
  });
});

describe('group membership over time', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  const path = () => `/api/orgs/${ridgeback}/group-memberships`;
  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    hygienist = await context.signInAs('hygienist');
  });
  afterAll(() => context.close());

  it('adds a worker to a group from a date (201, audited), and the worker shows it', async () => {
    const worker = workerId(context.db, ridgeback, 'RT-014');
    const group = groupId(context.db, ridgeback, 'Planer feeder – noise');
    const answer = await hygienist.post(path(), { workerId: worker, exposureGroupId: group, fromDate: '2025-01-06', toDate: null });
    expect(answer.status).toBe(201);
    expect(answer.body).toMatchObject({
      workerId: worker,
      exposureGroupId: group,
      fromDate: '2025-01-06',
      toDate: null,
      groupName: 'Planer feeder – noise',
      current: true,
    });
    expect(auditOf(context.db, 'group_membership', answer.body.id)[0]).toMatchObject({ action: 'created', after: { fromDate: '2025-01-06', toDate: null } });
    const shown = await hygienist.get(`/api/orgs/${ridgeback}/workers/${worker}`);
    expect(shown.body.memberships.map((membership: { groupName: string }) => membership.groupName)).toContain('Planer feeder – noise');
  });

  it('an overlapping period for the same worker and group answers 409 naming the period it clashes with', async () => {
    const worker = workerId(context.db, ridgeback, 'RT-014');
    const group = groupId(context.db, ridgeback, 'Planer feeder – noise');
    const answer = await hygienist.post(path(), { workerId: worker, exposureGroupId: group, fromDate: '2024-12-01', toDate: '2025-01-10' });
    expect(answer.status).toBe(409);
    expect(answer.body.error.message).toMatch(
      /^RT-014 is already a member of "Planer feeder – noise" from 2025-01-06 \(open-ended\) \(membership \d+\), which overlaps from 2024-12-01 to 2025-01-10: end or change that membership first, or choose other dates$/,
    );
    const before = await hygienist.post(path(), { workerId: worker, exposureGroupId: group, fromDate: '2024-12-01', toDate: '2025-01-05' });
    expect(before.status).toBe(201);
  });

  it('ends a membership on a date; an end before the start answers 400 naming toDate', async () => {
    const worker = workerId(context.db, ridgeback, 'RT-014');
    const detail = await hygienist.get(`/api/orgs/${ridgeback}/workers/${worker}`);
    const open = detail.body.memberships.find((membership: { fromDate: string }) => membership.fromDate === '2025-01-06');
    const ended = await hygienist.post(`${path()}/${open.id}/end`, { toDate: '2025-02-28' });
    expect(ended.status).toBe(200);
    expect(ended.body).toMatchObject({ toDate: '2025-02-28', current: false });
    expect(auditOf(context.db, 'group_membership', open.id).at(-1)).toMatchObject({ action: 'ended', after: { toDate: '2025-02-28' } });
    const early = await hygienist.post(`${path()}/${open.id}/end`, { toDate: '2024-12-31' });
    expect(early.status).toBe(400);
    expect(early.body.error.fields).toEqual({ toDate: 'The end date (2024-12-31) is before the start date (2025-01-06)' });
    const badDate = await hygienist.post(`${path()}/${open.id}/end`, { toDate: '28/02/2025' });
    expect(badDate.body.error.fields).toEqual({ toDate: 'Use a date written YYYY-MM-DD' });
  });

  it('corrects a membership’s start date (PATCH), audited with before and after', async () => {
    const worker = workerId(context.db, ridgeback, 'RT-014');
    const detail = await hygienist.get(`/api/orgs/${ridgeback}/workers/${worker}`);
    const december = detail.body.memberships.find((membership: { fromDate: string }) => membership.fromDate === '2024-12-01');
    const answer = await hygienist.patch(`${path()}/${december.id}`, { fromDate: '2024-12-02' });
    expect(answer.status).toBe(200);
    expect(answer.body).toMatchObject({ fromDate: '2024-12-02', toDate: '2025-01-05' });
    expect(auditOf(context.db, 'group_membership', december.id).at(-1)).toMatchObject({
      action: 'updated',
      before: { fromDate: '2024-12-01' },
      after: { fromDate: '2024-12-02' },
    });
    const empty = await hygienist.patch(`${path()}/${december.id}`, {});
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('Check the request body: Give fromDate or toDate');
  });

  it('moving a membership’s dates so a valid result falls outside every membership is refused (409)', async () => {
    const group = groupId(context.db, ridgeback, 'Saw filer – noise');
    const members = await hygienist.get(`/api/orgs/${ridgeback}/exposure-groups/${group}/members`);
    const rt006 = members.body.find((member: { worker: { code: string } }) => member.worker.code === 'RT-006');
    const answer = await hygienist.patch(`${path()}/${rt006.id}`, { toDate: '2024-08-30' });
    expect(answer.status).toBe(409);
    expect(answer.body.error.message).toMatch(
      /^RT-006 has \d+ valid shift result\(s\) in "Saw filer – noise" that the new dates would leave outside any membership/,
    );
    const unchanged = await hygienist.get(`/api/orgs/${ridgeback}/exposure-groups/${group}/members`);
    expect(unchanged.body.find((member: { id: number }) => member.id === rt006.id).toDate).toBeNull();
  });

  it('another organization’s worker or group in the body answers 400 naming the field; its membership id answers 404', async () => {
    const foreignWorker = workerId(context.db, slateHarbor, 'SH-001');
    const group = groupId(context.db, ridgeback, 'Planer feeder – noise');
    const answer = await hygienist.post(path(), { workerId: foreignWorker, exposureGroupId: group, fromDate: '2025-01-06' });
    expect(answer.status).toBe(400);
    expect(answer.body.error.fields).toEqual({ workerId: `No worker ${foreignWorker} in this organization` });
    const slateAdmin = await context.signInAs('admin', 'slateHarbor');
    const slateWorker = await slateAdmin.get(`/api/orgs/${slateHarbor}/workers/${foreignWorker}`);
    const foreignMembership = slateWorker.body.memberships[0].id;
    expect((await hygienist.patch(`${path()}/${foreignMembership}`, { toDate: '2025-01-01' })).status).toBe(404);
    expect((await hygienist.post(`${path()}/${foreignMembership}/end`, { toDate: '2025-01-01' })).status).toBe(404);
  });

  it('an analyst cannot add memberships (403)', async () => {
    const analyst = await context.signInAs('analyst');
    expect((await analyst.post(path(), {})).status).toBe(403);
  });
});
