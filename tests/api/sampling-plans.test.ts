import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { auditOf, groupId } from '../helpers/org-data';

interface Pick {
  position: number;
  date: string;
  weekday: string;
  worker: { id: number; code: string };
  done: boolean;
}
const shiftsOf = (picks: Pick[]) => picks.map((pick) => `${pick.worker.code}@${pick.date}`);

describe('sampling plans', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  let group: number;
  let plansPath: string;
  const planPath = (id: number) => `/api/orgs/${ridgeback}/sampling-plans/${id}`;
  // Monday 6 to Friday 31 January 2025: 20 working days; RT-008, RT-009 and RT-010 are members.
  const window = { startDate: '2025-01-06', endDate: '2025-01-31' };
  let firstPlan: { id: number; seed: number; picks: Pick[] };

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    hygienist = await context.signInAs('hygienist');
    group = groupId(context.db, ridgeback, 'Maintenance fitter – noise');
    plansPath = `/api/orgs/${ridgeback}/exposure-groups/${group}/sampling-plans`;
  });
  afterAll(() => context.close());

  it('creates a plan with the default target of 6, a stored seed, and 6 weekday picks among the members; guidance cites EN 689 and the trade’s 6–10', async () => {
    const answer = await hygienist.post(plansPath, { ...window, title: 'Winter 2025' });
    expect(answer.status).toBe(201);
    firstPlan = answer.body;
    expect(answer.body).toMatchObject({
      exposureGroupId: group,
      exposureGroupName: 'Maintenance fitter – noise',
      targetCount: 6,
      includeWeekends: false,
      draw: 1,
      availableShifts: 60,
      warnings: [],
    });
    expect(answer.body.seed).toBeGreaterThanOrEqual(1);
    expect(answer.body.picks).toHaveLength(6);
    for (const pick of answer.body.picks as Pick[]) {
      expect(['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday']).toContain(pick.weekday);
      expect(['RT-008', 'RT-009', 'RT-010']).toContain(pick.worker.code);
      expect(pick.date >= window.startDate && pick.date <= window.endDate).toBe(true);
    }
    expect(new Set(shiftsOf(answer.body.picks)).size).toBe(6);
    expect(answer.body.progress).toEqual({
      targetCount: 6,
      picked: 6,
      done: 0,
      remaining: 6,
      percentOfTarget: 0,
      validResultsInWindow: 0,
      unplannedResultsInWindow: 0,
    });
    expect(answer.body.guidance.text).toMatch(/EN 689:2018 applies its statistical test from 6 results/);
    expect(answer.body.guidance.text).toMatch(/6 to 10 shifts per group/);
    expect(answer.body.guidance.sources.map((source: { citation: string }) => source.citation).join(' ')).toMatch(
      /AIHA, A Strategy for Assessing and Managing Occupational Exposures/,
    );
    expect(auditOf(context.db, 'sampling_plan', answer.body.id)[0]).toMatchObject({
      action: 'created',
      after: { seed: answer.body.seed, targetCount: 6, availableShifts: 60 },
    });
  });

  it('the same seed and window draw the same worker-shifts', async () => {
    const again = await hygienist.post(plansPath, { ...window, seed: firstPlan.seed });
    expect(again.status).toBe(201);
    expect(shiftsOf(again.body.picks)).toEqual(shiftsOf(firstPlan.picks));
    const other = await hygienist.post(plansPath, { ...window, seed: firstPlan.seed === 1 ? 2 : firstPlan.seed - 1 });
    expect(shiftsOf(other.body.picks)).not.toEqual(shiftsOf(firstPlan.picks));
    await hygienist.post(`${planPath(again.body.id)}/archive`, {});
    await hygienist.post(`${planPath(other.body.id)}/archive`, {});
  });

  it('raising the target redraws with the same seed and keeps the earlier picks as the first ones drawn', async () => {
    const answer = await hygienist.patch(planPath(firstPlan.id), { targetCount: 8 });
    expect(answer.status).toBe(200);
    expect(answer.body).toMatchObject({ seed: firstPlan.seed, draw: 2, targetCount: 8 });
    expect(answer.body.picks).toHaveLength(8);
    const firstSix = (answer.body.picks as Pick[]).filter((pick) => pick.position <= 6);
    expect(shiftsOf(firstSix).sort()).toEqual(shiftsOf(firstPlan.picks).sort());
    expect(auditOf(context.db, 'sampling_plan', firstPlan.id).at(-1)).toMatchObject({
      action: 'updated_and_redrawn',
      before: { targetCount: 6, draw: 1 },
      after: { targetCount: 8, draw: 2 },
    });
  });

  it('a redraw makes a new seed, new picks and an audit event with both seeds and the reason', async () => {
    const answer = await hygienist.post(`${planPath(firstPlan.id)}/redraw`, { reason: 'Two picked fitters on leave' });
    expect(answer.status).toBe(200);
    expect(answer.body.seed).not.toBe(firstPlan.seed);
    expect(answer.body.draw).toBe(3);
    expect(answer.body.picks).toHaveLength(8);
    expect(auditOf(context.db, 'sampling_plan', firstPlan.id).at(-1)).toMatchObject({
      action: 'redrawn',
      reason: 'Two picked fitters on leave',
      before: { seed: firstPlan.seed, draw: 2 },
      after: { seed: answer.body.seed, draw: 3 },
    });
    const same = await hygienist.post(`${planPath(firstPlan.id)}/redraw`, { seed: answer.body.seed });
    expect(same.status).toBe(409);
    expect(same.body.error.message).toBe(`The plan already uses seed ${answer.body.seed}: a redraw needs a different seed`);
  });

  it('progress counts a pick as done once a valid result exists for that worker and date, and notes results off the plan', async () => {
    const plan = (await hygienist.get(planPath(firstPlan.id))).body;
    const pick: Pick = plan.picks[0];
    const entered = await hygienist.post(`/api/orgs/${ridgeback}/shift-results`, {
      exposureGroupId: group,
      workerId: pick.worker.id,
      date: pick.date,
      value: 64,
    });
    expect(entered.status, JSON.stringify(entered.body)).toBe(201);
    const pickedShifts = new Set(shiftsOf(plan.picks));
    const offPlan = ['2025-01-06', '2025-01-07', '2025-01-08']
      .map((date) => ({ date, code: 'RT-009' }))
      .find((shift) => !pickedShifts.has(`${shift.code}@${shift.date}`))!;
    const rt009 = (await hygienist.get(`/api/orgs/${ridgeback}/workers?q=RT-009`)).body.items[0].id;
    expect(
      (await hygienist.post(`/api/orgs/${ridgeback}/shift-results`, { exposureGroupId: group, workerId: rt009, date: offPlan.date, value: 40 })).status,
    ).toBe(201);
    const after = (await hygienist.get(planPath(firstPlan.id))).body;
    expect(after.progress).toMatchObject({
      targetCount: 8,
      picked: 8,
      done: 1,
      remaining: 7,
      percentOfTarget: 12,
      validResultsInWindow: 2,
      unplannedResultsInWindow: 1,
    });
    expect(after.picks.find((item: Pick) => item.position === pick.position)).toMatchObject({ done: true, resultId: entered.body.id });
  });

  it('weekends are left out unless asked for; a window with too few worker-shifts picks them all and says so', async () => {
    const weekend = { startDate: '2025-01-11', endDate: '2025-01-12' };
    const without = await hygienist.post(plansPath, weekend);
    expect(without.body).toMatchObject({ availableShifts: 0, picks: [] });
    expect(without.body.warnings[0]).toMatch(/no members on the plan's working days from 2025-01-11 to 2025-01-12/);
    const withWeekends = await hygienist.post(plansPath, { ...weekend, includeWeekends: true });
    expect(withWeekends.body.availableShifts).toBe(6);
    expect(withWeekends.body.picks).toHaveLength(6);
    expect(new Set((withWeekends.body.picks as Pick[]).map((pick) => pick.weekday))).toEqual(new Set(['Saturday', 'Sunday']));
    const short = await hygienist.post(plansPath, { startDate: '2025-01-06', endDate: '2025-01-06', targetCount: 5 });
    expect(short.body.picks).toHaveLength(3);
    expect(short.body.warnings).toEqual([
      'Only 3 worker-shifts are available from 2025-01-06 to 2025-01-06; the plan picks all of them, 2 short of the target.',
      'Fewer than 6 results allow only the preliminary test of EN 689:2018, not its statistical test.',
    ]);
  });

  it('lists a group’s plans with progress, archived ones on request', async () => {
    const inUse = await hygienist.get(plansPath);
    expect(inUse.status).toBe(200);
    expect(inUse.body.every((plan: { archived: boolean }) => !plan.archived)).toBe(true);
    const all = await hygienist.get(`${plansPath}?archived=all`);
    expect(all.body.length).toBe(inUse.body.length + 2);
  });

  it('the field sheet holds the group, the limit, the picks in date order with weekdays, the blanks to fill and the cautions', async () => {
    const answer = await hygienist.get(`${planPath(firstPlan.id)}/field-sheet`);
    expect(answer.status).toBe(200);
    expect(answer.body).toMatchObject({
      organization: { name: 'Ridgeback Timber Co.' },
      site: { name: 'Ridgeback sawmill' },
      group: { name: 'Maintenance fitter – noise', shiftHours: 10, actionLevel: 50, oel: { value: 100, unit: 'dose-percent' } },
      agent: { name: 'Noise', kind: 'noise' },
      plan: { id: firstPlan.id, startDate: '2025-01-06', endDate: '2025-01-31', targetCount: 8 },
    });
    const dates = answer.body.rows.map((row: Pick) => row.date);
    expect(dates).toEqual([...dates].sort());
    expect(answer.body.rows[0]).toHaveProperty('weekday');
    expect(answer.body.fieldsToRecord).toContain('Calibration before (dB)');
    expect(answer.body.cautions[0]).toMatch(/never replace the judgement of a qualified hygienist/);
  });

  it('the sampling guidance is readable by every role, with its sources marked read or from memory', async () => {
    const consultant = await context.signInAs('consultant');
    const answer = await consultant.get(`/api/orgs/${ridgeback}/sampling-guidance`);
    expect(answer.status).toBe(200);
    expect(answer.body.defaultTargetCount).toBe(6);
    expect(answer.body.sources.map((source: { status: string }) => source.status)).toEqual(['read', 'from memory', 'from memory', 'from memory']);
  });

  it('bad plans answer 400 naming the field', async () => {
    const order = await hygienist.post(plansPath, { startDate: '2025-02-01', endDate: '2025-01-01' });
    expect(order.status).toBe(400);
    expect(order.body.error.fields).toEqual({ endDate: 'The end date is before the start date' });
    const target = await hygienist.post(plansPath, { ...window, targetCount: 0 });
    expect(target.body.error.fields).toEqual({ targetCount: 'Plan at least 1 shift' });
    const seed = await hygienist.post(plansPath, { ...window, seed: 0 });
    expect(seed.body.error.fields).toEqual({ seed: 'Use a seed from 1' });
    const long = await hygienist.post(plansPath, { startDate: '2023-01-01', endDate: '2025-06-01' });
    expect(long.body.error.fields).toEqual({ endDate: 'A plan spans at most 730 days' });
    const date = await hygienist.post(plansPath, { startDate: '2025-02-30', endDate: '2025-03-01' });
    expect(date.body.error.fields, JSON.stringify(date.body)).toEqual({ startDate: 'Use a date written YYYY-MM-DD' });
  });

  it('an archived group cannot be planned (409)', async () => {
    const archivedGroup = groupId(context.db, ridgeback, 'Planer feeder – noise');
    await hygienist.post(`/api/orgs/${ridgeback}/exposure-groups/${archivedGroup}/archive`, {});
    const answer = await hygienist.post(`/api/orgs/${ridgeback}/exposure-groups/${archivedGroup}/sampling-plans`, window);
    expect(answer.status).toBe(409);
    expect(answer.body.error.message).toBe('Exposure group "Planer feeder – noise" is archived: bring it back before planning it');
    await hygienist.post(`/api/orgs/${ridgeback}/exposure-groups/${archivedGroup}/unarchive`, {});
  });

  it('another organization’s plan or group answers 404', async () => {
    const slateAdmin = await context.signInAs('admin', 'slateHarbor');
    const slateGroup = groupId(context.db, slateHarbor, 'Cutter – noise');
    const slatePlans = await slateAdmin.get(`/api/orgs/${slateHarbor}/exposure-groups/${slateGroup}/sampling-plans`);
    const foreignPlan = slatePlans.body[0].id;
    expect((await hygienist.get(planPath(foreignPlan))).status).toBe(404);
    expect((await hygienist.get(`${planPath(foreignPlan)}/field-sheet`)).status).toBe(404);
    expect((await hygienist.post(`${planPath(foreignPlan)}/redraw`, {})).status).toBe(404);
    expect((await hygienist.patch(planPath(foreignPlan), { notes: 'x' })).status).toBe(404);
    expect((await hygienist.post(`/api/orgs/${ridgeback}/exposure-groups/${slateGroup}/sampling-plans`, window)).status).toBe(404);
  });

  it('a manager reads plans but cannot create or redraw them; a consultant neither (403)', async () => {
    const manager = await context.signInAs('manager');
    expect((await manager.get(planPath(firstPlan.id))).status).toBe(200);
    expect((await manager.post(plansPath, window)).status).toBe(403);
    const consultant = await context.signInAs('consultant');
    expect((await consultant.post(`${planPath(firstPlan.id)}/redraw`, {})).status).toBe(403);
  });
});
