import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { exposureGroups } from '@schema/exposure-groups';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { auditOf, groupId, resultCount, siteId, workerId } from '../helpers/org-data';

describe('shift results: manual entry, void and restore', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  let base: string;
  let woodDust: number;
  let rt001: number;
  const dataVersion = (id: number) => context.db.select().from(exposureGroups).where(eq(exposureGroups.id, id)).get()!.dataVersion;

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    hygienist = await context.signInAs('hygienist');
    base = `/api/orgs/${ridgeback}/shift-results`;
    woodDust = groupId(context.db, ridgeback, 'Head sawyer – wood dust');
    rt001 = workerId(context.db, ridgeback, 'RT-001');
  });
  afterAll(() => context.close());

  it('enters a result in the group’s unit: 201, audited, and the group’s data version moves', async () => {
    const version = dataVersion(woodDust);
    const answer = await hygienist.post(base, {
      exposureGroupId: woodDust,
      workerId: rt001,
      date: '2025-01-14',
      value: 0.82,
      sampleId: 'RB-25-0114-A',
      lab: 'Test lab',
      startTime: '07:02',
      endTime: '16:48',
    });
    expect(answer.status).toBe(201);
    expect(answer.body).toMatchObject({
      exposureGroupId: woodDust,
      exposureGroupName: 'Head sawyer – wood dust',
      agentName: 'Inhalable wood dust',
      worker: { id: rt001, code: 'RT-001', name: 'Alex Corran' },
      date: '2025-01-14',
      value: 0.82,
      unit: 'mg/m3',
      nonDetect: false,
      detectionLimit: null,
      source: 'entered',
      status: 'valid',
      sampledMinutes: 586,
      createdBy: { id: hygienist.user.id, name: 'Dana Whitlock' },
      voidedBy: null,
    });
    expect(answer.body.details.statement).toBe('Entered by hand as the shift result, 0.82 mg/m³.');
    expect(auditOf(context.db, 'shift_result', answer.body.id)[0]).toMatchObject({
      action: 'created',
      after: { value: 0.82, unit: 'mg/m3', source: 'entered' },
    });
    expect(dataVersion(woodDust)).toBe(version + 1);
    const group = await hygienist.get(`/api/orgs/${ridgeback}/exposure-groups/${woodDust}`);
    expect(group.body.resultsChangedAt).toBe('2025-03-03T08:00:00.000Z');
  });

  it('a non-detect is stored at its detection limit; without a limit it answers 400 naming detectionLimit', async () => {
    const answer = await hygienist.post(base, { exposureGroupId: woodDust, workerId: rt001, date: '2025-01-15', nonDetect: true, detectionLimit: 0.05 });
    expect(answer.status).toBe(201);
    expect(answer.body).toMatchObject({ value: 0.05, nonDetect: true, detectionLimit: 0.05 });
    expect(answer.body.details.statement).toBe('Entered by hand as a non-detect below 0.05 mg/m³.');
    const missing = await hygienist.post(base, { exposureGroupId: woodDust, workerId: rt001, date: '2025-01-16', nonDetect: true });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toEqual({ detectionLimit: 'A non-detect needs its detection limit (above 0)' });
  });

  it('refuses bad entries with a 400 naming the field', async () => {
    const entry = { exposureGroupId: woodDust, workerId: rt001, date: '2025-01-20', value: 1 };
    const zero = await hygienist.post(base, { ...entry, value: 0 });
    expect(zero.body.error.fields).toEqual({ value: 'Use a value above 0' });
    const negative = await hygienist.post(base, { ...entry, value: -0.4 });
    expect(negative.body.error.fields).toEqual({ value: 'Use a value above 0' });
    const noValue = await hygienist.post(base, { ...entry, value: undefined });
    expect(noValue.body.error.fields).toEqual({ value: 'Enter the value (above 0), or mark the result as a non-detect' });
    const future = await hygienist.post(base, { ...entry, date: '2025-03-05' });
    expect(future.body.error.fields).toEqual({ date: '2025-03-05 is in the future' });
    const outsider = await hygienist.post(base, { ...entry, workerId: workerId(context.db, ridgeback, 'RT-003') });
    expect(outsider.status).toBe(400);
    expect(outsider.body.error.fields).toEqual({ workerId: 'RT-003 is not a member of "Head sawyer – wood dust" on 2025-01-20 (never a member)' });
    const left = await hygienist.post(base, {
      exposureGroupId: groupId(context.db, ridgeback, 'Edger operator – noise'),
      workerId: workerId(context.db, ridgeback, 'RT-005'),
      date: '2024-06-03',
      value: 80,
    });
    expect(left.body.error.fields).toEqual({ workerId: 'RT-005 is not a member of "Edger operator – noise" on 2024-06-03 (member 2023-01-09 – 2024-03-01)' });
    const unit = await hygienist.post(base, { ...entry, unit: 'ppm' });
    expect(unit.body.error.fields).toEqual({
      unit: 'cannot convert ppm to mg/m³ for "Inhalable wood dust": the agent has no molecular weight (set it on the agent, or report in mg/m³)',
    });
    const times = await hygienist.post(base, { ...entry, startTime: '16:00', endTime: '07:00' });
    expect(times.body.error.fields.endTime).toMatch(/^the sample ends \(07:00\) before or when it starts \(16:00\)/);
    const minutes = await hygienist.post(base, { ...entry, startTime: '07:00', endTime: '15:00', sampledMinutes: 300 });
    expect(minutes.body.error.fields).toEqual({ sampledMinutes: '300 min does not match the start and end times (480 min)' });
    const date = await hygienist.post(base, { ...entry, date: '2025-02-30' });
    expect(date.body.error.fields).toEqual({ date: 'Use a date written YYYY-MM-DD' });
  });

  it('converts ppm to the group’s mg/m³ from the molecular weight (toluene 100 ppm = 376.9 mg/m³, REFERENCES.md)', async () => {
    const toluene = await hygienist.post(`/api/orgs/${ridgeback}/agents`, { name: 'Toluene', kind: 'chemical', casNumber: '108-88-3', molecularWeight: 92.14 });
    const group = await hygienist.post(`/api/orgs/${ridgeback}/exposure-groups`, {
      siteId: siteId(context.db, ridgeback, 'Ridgeback sawmill'),
      name: 'Saw filer – solvent',
      agentId: toluene.body.id,
      oelValue: 50,
      oelUnit: 'mg/m3',
      oelSource: 'In-house limit (test data)',
      oelAveragingTime: '8h-twa',
    });
    const rt006 = workerId(context.db, ridgeback, 'RT-006');
    await hygienist.post(`/api/orgs/${ridgeback}/group-memberships`, { workerId: rt006, exposureGroupId: group.body.id, fromDate: '2025-01-01' });
    const answer = await hygienist.post(base, { exposureGroupId: group.body.id, workerId: rt006, date: '2025-01-21', value: 100, unit: 'ppm' });
    expect(answer.status).toBe(201);
    // Half a unit in the last printed digit of 376.9: the reference value is rounded to 4 digits.
    expect(Math.abs(answer.body.value - 376.9)).toBeLessThanOrEqual(0.05);
    expect(answer.body).toMatchObject({ unit: 'mg/m3', reportedValue: 100, reportedUnit: 'ppm' });
    expect(answer.body.details.conversion).toEqual({
      from: 'ppm',
      to: 'mg/m3',
      molecularWeight: 92.14,
      molarVolumeLitres: 24.45,
      source: 'mg/m³ = ppm × MW / 24.45 at 25 °C and 760 torr (ACGIH)',
    });
    expect(answer.body.details.statement).toMatch(/^Entered by hand as the shift result, 100 ppm, converted to 376\.85\d* mg\/m³/);
  });

  it('a second valid result for the same worker-shift answers 409 naming the existing one', async () => {
    const answer = await hygienist.post(base, { exposureGroupId: woodDust, workerId: rt001, date: '2025-01-14', value: 0.5 });
    expect(answer.status).toBe(409);
    expect(answer.body.error.message).toMatch(
      /^RT-001 already has a valid result in "Head sawyer – wood dust" on 2025-01-14 \(result \d+\): void it first to record another$/,
    );
  });

  it('voids a result with a reason (kept, audited with the reason, data version moves), then restores it', async () => {
    const list = await hygienist.get(`${base}?groupId=${woodDust}&from=2025-01-14&to=2025-01-14`);
    const id = list.body.items[0].id;
    const version = dataVersion(woodDust);
    const noReason = await hygienist.post(`${base}/${id}/void`, {});
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields).toEqual({ reason: 'Give a reason' });
    const voided = await hygienist.post(`${base}/${id}/void`, { reason: 'Sampler dropped in the saw pit' });
    expect(voided.status).toBe(200);
    expect(voided.body).toMatchObject({
      status: 'void',
      voidReason: 'Sampler dropped in the saw pit',
      voidedAt: '2025-03-03T08:00:00.000Z',
      voidedBy: { name: 'Dana Whitlock' },
    });
    expect(dataVersion(woodDust)).toBe(version + 1);
    expect(auditOf(context.db, 'shift_result', id).at(-1)).toMatchObject({ action: 'voided', reason: 'Sampler dropped in the saw pit' });
    const again = await hygienist.post(`${base}/${id}/void`, { reason: 'twice' });
    expect(again.status).toBe(409);

    const replacement = await hygienist.post(base, { exposureGroupId: woodDust, workerId: rt001, date: '2025-01-14', value: 0.6 });
    expect(replacement.status).toBe(201);
    const blocked = await hygienist.post(`${base}/${id}/restore`, { reason: 'Found the pump log' });
    expect(blocked.status).toBe(409);
    expect(blocked.body.error.message).toBe(
      `Result ${replacement.body.id} is now the valid result for this worker and date: void it first to restore result ${id}`,
    );
    await hygienist.post(`${base}/${replacement.body.id}/void`, { reason: 'Entered in error' });
    const restored = await hygienist.post(`${base}/${id}/restore`, { reason: 'Found the pump log' });
    expect(restored.status).toBe(200);
    expect(restored.body).toMatchObject({ status: 'valid', voidReason: null, voidedBy: null });
    expect(auditOf(context.db, 'shift_result', id).at(-1)).toMatchObject({
      action: 'restored',
      reason: 'Found the pump log',
      before: { status: 'void', voidReason: 'Sampler dropped in the saw pit' },
    });
    expect(dataVersion(woodDust)).toBe(version + 4); // void, replacement, its void, restore
  });

  it('nothing is ever deleted: there is no DELETE route for results', async () => {
    const before = resultCount(context.db);
    const list = await hygienist.get(`${base}?pageSize=1`);
    const answer = await hygienist.delete(`${base}/${list.body.items[0].id}`);
    expect(answer.status).toBe(404);
    expect(resultCount(context.db)).toBe(before);
  });

  it('lists with filters (group, worker, status, source, non-detect, dates), sort and pages', async () => {
    const voided = await hygienist.get(`${base}?status=void`);
    expect(voided.body.items.every((result: { status: string }) => result.status === 'void')).toBe(true);
    expect(voided.body.total).toBe(2);
    const nonDetects = await hygienist.get(`${base}?groupId=${woodDust}&nonDetect=true`);
    expect(nonDetects.body.total).toBeGreaterThan(0);
    expect(nonDetects.body.items.every((result: { nonDetect: boolean }) => result.nonDetect)).toBe(true);
    const byWorker = await hygienist.get(`${base}?workerId=${rt001}&from=2025-01-01&sort=date`);
    expect(byWorker.body.items.map((result: { date: string }) => result.date)).toEqual(['2025-01-14', '2025-01-14', '2025-01-15']);
    const entered = await hygienist.get(`${base}?source=entered&q=RB-25-0114`);
    expect(entered.body.total).toBe(1);
    const sortedByValue = await hygienist.get(`${base}?groupId=${woodDust}&sort=-value&pageSize=2`);
    expect(sortedByValue.body.items[0].value).toBeGreaterThanOrEqual(sortedByValue.body.items[1].value);
    const bad = await hygienist.get(`${base}?status=deleted&from=2025-1-1`);
    expect(bad.body.error.fields).toEqual({ status: 'Use valid or void', from: 'Use a date written YYYY-MM-DD' });
  });

  it('another organization’s result, group or worker: 404 on the path, 400 naming the field in a body', async () => {
    const slateAdmin = await context.signInAs('admin', 'slateHarbor');
    const slateResults = await slateAdmin.get(`/api/orgs/${slateHarbor}/shift-results?pageSize=1`);
    const foreign = slateResults.body.items[0].id;
    expect((await hygienist.get(`${base}/${foreign}`)).status).toBe(404);
    expect((await hygienist.post(`${base}/${foreign}/void`, { reason: 'not mine' })).status).toBe(404);
    expect((await hygienist.post(`${base}/${foreign}/restore`, { reason: 'not mine' })).status).toBe(404);
    const foreignGroup = groupId(context.db, slateHarbor, 'Cutter – noise');
    const answer = await hygienist.post(base, { exposureGroupId: foreignGroup, workerId: rt001, date: '2025-01-20', value: 1 });
    expect(answer.body.error.fields).toEqual({ exposureGroupId: `No exposure group ${foreignGroup} in this organization` });
  });

  it('a manager reads results but cannot enter, void or restore them (403)', async () => {
    const manager = await context.signInAs('manager');
    expect((await manager.get(base)).status).toBe(200);
    expect((await manager.post(base, { exposureGroupId: woodDust, workerId: rt001, date: '2025-01-22', value: 1 })).status).toBe(403);
    const list = await manager.get(`${base}?pageSize=1`);
    expect((await manager.post(`${base}/${list.body.items[0].id}/void`, { reason: 'manager' })).status).toBe(403);
  });
});
