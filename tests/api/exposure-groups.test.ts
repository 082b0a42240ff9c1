import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { agentId, auditOf, groupId, siteId } from '../helpers/org-data';

describe('exposure groups', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  let base: string;
  let sawmill: number;
  let woodDust: number;
  let noise: number;
  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    hygienist = await context.signInAs('hygienist');
    base = `/api/orgs/${ridgeback}/exposure-groups`;
    sawmill = siteId(context.db, ridgeback, 'Ridgeback sawmill');
    woodDust = agentId(context.db, ridgeback, 'Inhalable wood dust');
    noise = agentId(context.db, ridgeback, 'Noise');
  });
  afterAll(() => context.close());

  const entryOf = async (agent: number, unit: string) => {
    const list = await hygienist.get(`/api/orgs/${ridgeback}/oel-entries?agentId=${agent}`);
    return list.body.items.find((entry: { unit: string }) => entry.unit === unit);
  };

  it('creates a group from an OEL list entry: the entry’s value, unit, source and averaging time are copied', async () => {
    const entry = await entryOf(woodDust, 'mg/m3');
    const answer = await hygienist.post(base, {
      siteId: sawmill,
      name: 'Edger operator – wood dust',
      processArea: 'Edger line',
      jobTitles: ['Edger operator'],
      tasks: 'Feeds cants; clears jams.',
      agentId: woodDust,
      oelEntryId: entry.id,
      actionLevel: 2.5,
      shiftHours: 10,
      exposureProfile: 'Open workstation.',
    });
    expect(answer.status).toBe(201);
    expect(answer.body).toMatchObject({
      name: 'Edger operator – wood dust',
      siteName: 'Ridgeback sawmill',
      agentName: 'Inhalable wood dust',
      agentKind: 'chemical',
      oelEntryId: entry.id,
      oelValue: entry.value,
      oelUnit: 'mg/m3',
      oelSource: entry.source,
      oelAveragingTime: '8h-twa',
      extendedShiftAdjustment: 'none',
      dataVersion: 0,
      resultsChangedAt: null,
      memberCount: 0,
      validResultCount: 0,
      effectiveOel: { value: entry.value, reductionFactor: 1, method: 'none' },
    });
    expect(auditOf(context.db, 'exposure_group', answer.body.id)[0]).toMatchObject({
      action: 'created',
      after: { oelEntryId: entry.id, oelValue: entry.value },
    });
  });

  it('a typed-in chemical OEL with the Brief & Scala adjustment gives the reduced limit for a 12-h shift', async () => {
    const answer = await hygienist.post(base, {
      siteId: sawmill,
      name: 'Night cleaner – wood dust',
      agentId: woodDust,
      oelValue: 2,
      oelUnit: 'mg/m3',
      oelSource: 'In-house limit (test data)',
      oelAveragingTime: '8h-twa',
      shiftHours: 12,
      extendedShiftAdjustment: 'brief-scala',
    });
    expect(answer.status).toBe(201);
    // Brief & Scala: (8/12)·(24−12)/16 = 0.5 (REFERENCES.md "Chemical units and long shifts").
    expect(answer.body.effectiveOel).toMatchObject({ method: 'brief-scala', baseValue: 2, unit: 'mg/m3' });
    expect(answer.body.effectiveOel.reductionFactor).toBeCloseTo(0.5, 12);
    expect(answer.body.effectiveOel.value).toBeCloseTo(1, 12);
    expect(answer.body.effectiveOel.statement).toMatch(/Brief & Scala \(1975\)/);
  });

  it('refuses, naming the field: no OEL at all, a noise group without criteria set, an action level at the OEL, an entry for another agent, Brief & Scala on noise', async () => {
    const common = { siteId: sawmill, agentId: woodDust, shiftHours: 8 };
    const noOel = await hygienist.post(base, { ...common, name: 'A' });
    expect(noOel.status).toBe(400);
    expect(noOel.body.error.fields.oelValue).toBe('Give the OEL value, unit, source and averaging time, or pick an entry from the OEL list');

    const noiseEntry = await entryOf(noise, 'dose-percent');
    const noCriteria = await hygienist.post(base, { ...common, agentId: noise, name: 'B', oelEntryId: noiseEntry.id });
    expect(noCriteria.body.error.fields).toEqual({ noiseCriteriaSet: 'Choose the noise criteria set the group is judged with' });

    const action = await hygienist.post(base, {
      ...common,
      agentId: noise,
      name: 'C',
      oelEntryId: noiseEntry.id,
      noiseCriteriaSet: 'nioshRel',
      actionLevel: 100,
    });
    expect(action.body.error.fields).toEqual({ actionLevel: 'The action level (100) must be below the OEL (100)' });

    const wrongEntry = await hygienist.post(base, { ...common, name: 'D', oelEntryId: noiseEntry.id });
    expect(wrongEntry.body.error.fields.oelEntryId).toMatch(/is for "Noise", not for the group's agent "Inhalable wood dust"/);

    const briefScala = await hygienist.post(base, {
      ...common,
      agentId: noise,
      name: 'E',
      oelEntryId: noiseEntry.id,
      noiseCriteriaSet: 'nioshRel',
      extendedShiftAdjustment: 'brief-scala',
    });
    expect(briefScala.body.error.fields).toEqual({ extendedShiftAdjustment: 'The Brief & Scala adjustment is for a chemical 8-hour TWA limit only' });

    const shift = await hygienist.post(base, { ...common, name: 'F', shiftHours: 30 });
    expect(shift.body.error.fields.shiftHours).toBe('A shift is at most 24 hours');

    const closedSite = await hygienist.post(`/api/orgs/${ridgeback}/sites`, { name: 'Closed yard' });
    await hygienist.post(`/api/orgs/${ridgeback}/sites/${closedSite.body.id}/archive`, {});
    const archivedSite = await hygienist.post(base, {
      ...common,
      name: 'H',
      siteId: closedSite.body.id,
      oelValue: 1,
      oelUnit: 'mg/m3',
      oelSource: 'x',
      oelAveragingTime: '8h-twa',
    });
    expect(archivedSite.body.error.fields).toEqual({ siteId: 'Site "Closed yard" is archived: bring it back first' });

    const foreignSite = siteId(context.db, slateHarbor, 'Fabrication shop');
    const site = await hygienist.post(base, {
      ...common,
      name: 'G',
      siteId: foreignSite,
      oelValue: 1,
      oelUnit: 'mg/m3',
      oelSource: 'x',
      oelAveragingTime: '8h-twa',
    });
    expect(site.body.error.fields).toEqual({ siteId: `No site ${foreignSite} in this organization` });
  });

  it('reads one group with its effective OEL and counts', async () => {
    const id = groupId(context.db, ridgeback, 'Edger operator – noise');
    const answer = await hygienist.get(`${base}/${id}`);
    expect(answer.status).toBe(200);
    expect(answer.body).toMatchObject({
      id,
      name: 'Edger operator – noise',
      noiseCriteriaSet: 'nioshRel',
      validResultCount: 7,
      effectiveOel: { value: 100, unit: 'dose-percent' },
    });
  });

  it('a duplicate name on the same site answers 409', async () => {
    const answer = await hygienist.post(base, {
      siteId: sawmill,
      name: 'Saw filer – noise',
      agentId: woodDust,
      oelValue: 1,
      oelUnit: 'mg/m3',
      oelSource: 'x',
      oelAveragingTime: '8h-twa',
    });
    expect(answer.status).toBe(409);
    expect(answer.body.error.message).toMatch(/already has an exposure group named "Saw filer – noise"/);
  });

  it('lists with site and agent filters, search, sort and pages, with member and result counts', async () => {
    const bySite = await hygienist.get(`${base}?siteId=${sawmill}&agentId=${noise}&sort=name`);
    expect(bySite.body.items.map((group: { name: string }) => group.name)).toEqual([
      'Edger operator – noise',
      'Head sawyer – noise',
      'Maintenance fitter – noise',
      'Saw filer – noise',
    ]);
    const headSawyer = bySite.body.items[1];
    expect(headSawyer).toMatchObject({ memberCount: 2, validResultCount: 8, voidResultCount: 0, oelUnit: 'dose-percent', actionLevel: 50 });
    const search = await hygienist.get(`${base}?q=infeed`);
    expect(search.body.items.map((group: { name: string }) => group.name).sort()).toEqual(['Planer feeder – noise', 'Planer feeder – wood dust']);
    const paged = await hygienist.get(`${base}?sort=-name&pageSize=3&page=2`);
    expect(paged.body).toMatchObject({ page: 2, pageSize: 3, pageCount: 4, total: 10 });
  });

  it('once a group has results its OEL unit cannot change (409), while other edits are audited', async () => {
    const id = groupId(context.db, ridgeback, 'Head sawyer – wood dust');
    const unit = await hygienist.patch(`${base}/${id}`, { oelUnit: 'ppm' });
    expect(unit.status).toBe(409);
    expect(unit.body.error.message).toMatch(/has 10 shift result\(s\) in mg\/m3: its agent and OEL unit cannot change/);
    const edit = await hygienist.patch(`${base}/${id}`, { tasks: 'Booth work; deck spells; clean-up.', oelValue: 4 });
    expect(edit.status).toBe(200);
    // Typing over the OEL unlinks the list entry it was copied from.
    expect(edit.body).toMatchObject({ tasks: 'Booth work; deck spells; clean-up.', oelValue: 4, oelEntryId: null });
    expect(auditOf(context.db, 'exposure_group', id).at(-1)).toMatchObject({
      action: 'updated',
      after: { tasks: 'Booth work; deck spells; clean-up.', oelValue: 4, oelEntryId: null },
    });
  });

  it('archives a group (its results stay) and brings it back', async () => {
    const id = groupId(context.db, ridgeback, 'Maintenance fitter – noise');
    const archived = await hygienist.post(`${base}/${id}/archive`, { reason: 'Merged into another group' });
    expect(archived.body.archived).toBe(true);
    expect((await hygienist.get(base)).body.items.map((group: { id: number }) => group.id)).not.toContain(id);
    expect((await hygienist.get(`${base}?archived=all`)).body.items.map((group: { id: number }) => group.id)).toContain(id);
    expect((await hygienist.post(`${base}/${id}/unarchive`, {})).body.archived).toBe(false);
  });

  it('another organization’s group answers 404 (get, overview, members, edit)', async () => {
    const foreign = groupId(context.db, slateHarbor, 'Cutter – noise');
    expect((await hygienist.get(`${base}/${foreign}`)).status).toBe(404);
    expect((await hygienist.get(`${base}/${foreign}/overview`)).status).toBe(404);
    expect((await hygienist.get(`${base}/${foreign}/members`)).status).toBe(404);
    expect((await hygienist.patch(`${base}/${foreign}`, { tasks: 'x' })).status).toBe(404);
  });

  it('a consultant reads groups but cannot create or archive them (403)', async () => {
    const consultant = await context.signInAs('consultant');
    expect((await consultant.get(base)).status).toBe(200);
    expect((await consultant.post(base, {})).status).toBe(403);
    const id = groupId(context.db, ridgeback, 'Saw filer – noise');
    expect((await consultant.post(`${base}/${id}/archive`, {})).status).toBe(403);
  });
});

describe('the group overview (one answer for the group page)', () => {
  let context: TestContext;
  let ridgeback: number;
  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
  });
  afterAll(() => context.close());

  it('returns definition, members over time, the current plan with progress, and results with counts', async () => {
    const manager = await context.signInAs('manager');
    const id = groupId(context.db, ridgeback, 'Planer feeder – wood dust');
    const answer = await manager.get(`/api/orgs/${ridgeback}/exposure-groups/${id}/overview`);
    expect(answer.status).toBe(200);
    const body = answer.body;
    expect(body.group).toMatchObject({ id, name: 'Planer feeder – wood dust', oelValue: 5, oelUnit: 'mg/m3', dataVersion: 10 });
    expect(body.site).toMatchObject({ name: 'Ridgeback planing mill' });
    expect(body.agent).toMatchObject({ name: 'Inhalable wood dust', kind: 'chemical', molecularWeight: null });
    expect(body.oelEntry).toMatchObject({ value: 5, unit: 'mg/m3' });
    expect(body.members.map((member: { worker: { code: string } }) => member.worker.code)).toEqual(['RT-005', 'RT-011', 'RT-012', 'RT-013']);
    expect(body.members[0]).toMatchObject({ fromDate: '2024-03-04', toDate: null, current: true, worker: { name: 'Sam Okafor-Reid' } });
    expect(body.currentPlan).toMatchObject({ targetCount: 10, title: 'Autumn 2024 campaign', progress: { targetCount: 10, picked: 10 } });
    // 10 results were drawn on the 10 picks; one is void, so 9 picks are done.
    expect(body.currentPlan.progress.done).toBe(9);
    expect(body.currentPlan.picks).toHaveLength(10);
    expect(body.results).toHaveLength(10);
    expect(body.counts).toMatchObject({ total: 10, valid: 9, void: 1 });
    expect(body.counts.nonDetect + body.counts.detected).toBe(9);
    expect(body.guidance.text).toMatch(/EN 689:2018/);
    expect(body.cautions[0]).toBe('Statistics support and never replace the judgement of a qualified hygienist.');
  });

  it('a noise group’s overview shows the hearing conservation trigger', async () => {
    const analyst = await context.signInAs('analyst');
    const id = groupId(context.db, ridgeback, 'Edger operator – noise');
    const answer = await analyst.get(`/api/orgs/${ridgeback}/exposure-groups/${id}/overview`);
    expect(answer.body.cautions).toContain('Hearing conservation trigger (action level): 50 % dose.');
  });
});
