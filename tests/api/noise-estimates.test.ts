/**
 * ISO 9612 noise estimates through the API, as a hygienist: each strategy's flow, the figures and
 * the comparison with the values in force, permissions, refusals naming field and row, the audit.
 * The figures themselves are checked against ISO 9612:2009 Annexes E and F and a hand-worked
 * task-based example in tests/reference/iso9612.test.ts; here the API must return the same.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jobBasedEstimate } from '@stats/iso9612-job-based';
import { auditOf, groupId, workerId } from '../helpers/org-data';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

const rows = (levels: number[], extra: object = {}) => levels.map((laeqDb) => ({ laeqDb, ...extra }));

/** Task-based inputs in the spirit of ISO 9612 Annex D (not its values): three tasks, three measurements each. */
const taskBased = {
  title: 'Edger line, winter survey',
  strategy: 'task-based',
  instrument: 'class1-meter',
  tasks: [
    { name: 'Edging', hours: 4, durationUncertaintyHours: 0.5, measurements: rows([88.0, 89.5, 87.1], { durationMinutes: 15 }) },
    { name: 'Clearing jams', hours: 1.5, durationUncertaintyHours: 0.25, measurements: rows([92.3, 94.0, 91.2], { durationMinutes: 10 }) },
    { name: 'Break room', hours: 2, measurements: rows([70.2, 71.0, 69.5], { durationMinutes: 10 }) },
  ],
};

describe('noise estimates (ISO 9612)', () => {
  let context: TestContext;
  let ridgeback: number;
  let hygienist: SignedIn;
  let manager: SignedIn;
  let outsider: SignedIn;
  let edger: number;
  let groupPath: string;
  const estimatePath = (id: number) => `/api/orgs/${ridgeback}/noise-estimates/${id}`;
  let taskEstimateId: number;

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    hygienist = await context.signInAs('hygienist');
    manager = await context.signInAs('manager');
    outsider = await context.signInAs('hygienist', 'slateHarbor');
    edger = groupId(context.db, ridgeback, 'Edger operator – noise');
    groupPath = `/api/orgs/${ridgeback}/exposure-groups/${edger}/noise-estimates`;
  }, 60_000); // seeding the demo (noise logs included) takes seconds on a shared machine
  afterAll(() => context.close());

  it('a hygienist creates a task-based estimate and gets LEX,8h, U, the budget per task and the comparison with the NIOSH values the group uses', async () => {
    const answer = await hygienist.post(groupPath, taskBased);
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    taskEstimateId = answer.body.id;
    expect(answer.body).toMatchObject({
      strategy: 'task-based',
      instrument: 'class1-meter',
      effectiveHours: null,
      groupName: 'Edger operator – noise',
      figuresError: null,
      createdBy: hygienist.user.name,
    });
    const figures = answer.body.figures;
    // The same inputs with u2 = 1.5 give 88.3719 dB and U 2.393 (reference test); LEX,8h does not depend on u2.
    expect(figures.lex8h).toBeCloseTo(88.37188599106968, 9);
    expect(figures.effectiveHours).toBe(7.5);
    expect(figures.expandedUncertainty).toBeCloseTo(1.65 * figures.combinedUncertainty, 12);
    expect(figures.expandedUncertaintyWithoutDuration).toBeLessThan(figures.expandedUncertainty);
    expect(figures.budget.map((line: { label: string }) => line.label)).toContain("Task 'Edging': spread of the measurements (u1a)");
    expect(figures.budget.map((line: { label: string }) => line.label)).toContain("Task 'Clearing jams': duration (u1b, hours)");
    expect(figures.tasks.map((task: { name: string }) => task.name)).toEqual(['Edging', 'Clearing jams', 'Break room']);
    expect(figures.criteria.label).toMatch(/NIOSH REL/);
    const rel = figures.comparisons.find((comparison: { label: string }) => /NIOSH recommended exposure limit/.test(comparison.label));
    expect(rel).toMatchObject({ valueDb: 85, lexPlusUAbove: true, lexAbove: true });
    expect(rel.sentence).toBe(
      `LEX,8h + U = ${(Math.round((figures.lex8h + figures.expandedUncertainty) * 10) / 10).toFixed(1)} dB(A) is above the NIOSH recommended exposure limit (hearing conservation trigger) 85 dB(A)`,
    );
    // The group's own action level, 50 % dose under NIOSH (85 dBA, 3 dB), is 82 dB(A).
    expect(figures.comparisons.find((comparison: { label: string }) => comparison.label.startsWith('group action level'))).toMatchObject({
      valueDb: 82,
      kind: 'action',
    });
    expect(auditOf(context.db, 'noise_estimate', taskEstimateId)[0]).toMatchObject({
      action: 'created',
      after: { strategy: 'task-based', title: 'Edger line, winter survey' },
    });
  });

  it('lists the group’s estimates for any member who may read, and shows one by id', async () => {
    const list = await manager.get(groupPath);
    expect(list.status).toBe(200);
    expect(list.body.map((estimate: { id: number }) => estimate.id)).toContain(taskEstimateId);
    const one = await manager.get(estimatePath(taskEstimateId));
    expect(one.status).toBe(200);
    expect(one.body.tasks[0].measurements).toHaveLength(3);
  });

  it('a job-based estimate returns the Table 1 check and the same figures as the engine', async () => {
    const levels = [88.1, 86.1, 89.7, 86.5, 91.1, 86.7];
    const answer = await hygienist.post(groupPath, {
      strategy: 'job-based',
      instrument: 'dosimeter',
      effectiveHours: 7.5,
      groupSize: 12,
      measurements: rows(levels, { durationMinutes: 60 }),
    });
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    const engine = jobBasedEstimate({ samples: rows(levels, { durationMinutes: 60 }), effectiveHours: 7.5, instrument: 'dosimeter', groupSize: 12 });
    expect(answer.body.figures.lex8h).toBe(engine.lex8h);
    expect(answer.body.figures.expandedUncertainty).toBe(engine.expandedUncertainty);
    expect(answer.body.figures).toMatchObject({ cumulativeHours: 6, minimumCumulativeHours: 8.5 });
    expect(answer.body.figures.warnings).toContain(
      'The samples add up to 6.00 h, below the ISO 9612 Table 1 minimum of 8.5 h for a group of 12: take more samples',
    );
  });

  it('a full-day estimate takes a worker and date per day', async () => {
    const worker = workerId(context.db, ridgeback, 'RT-003');
    const answer = await hygienist.post(groupPath, {
      strategy: 'full-day',
      instrument: 'dosimeter',
      effectiveHours: 9.25,
      measurements: [88.0, 91.9, 87.6, 90.4, 89.0, 88.4].map((laeqDb, index) => ({ laeqDb, measuredOn: `2025-02-0${index + 3}`, workerId: worker })),
    });
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    expect(answer.body.measurements[0]).toMatchObject({ measuredOn: '2025-02-03', workerId: worker });
    expect(Math.abs(answer.body.figures.lex8h - 90.1)).toBeLessThan(0.05); // ISO 9612:2009 Annex F via transcription
  });

  it('refuses a task with 2 measurements and a negative duration, naming the task and the field', async () => {
    const answer = await hygienist.post(groupPath, {
      strategy: 'task-based',
      instrument: 'dosimeter',
      tasks: [
        { name: 'Edging', hours: -1, measurements: rows([88, 89]) },
        { name: 'Sorting', hours: 2, measurements: rows([80, 81, 82]) },
      ],
    });
    expect(answer.status).toBe(400);
    expect(answer.body.error.fields).toMatchObject({
      'tasks.0.hours': "Task 'Edging': use a duration above 0 hours",
      'tasks.0.measurements': "Task 'Edging' has 2 measurements; ISO 9612 task-based needs at least 3",
    });
    expect(answer.body.error.message).toMatch(/tasks\.0\.measurements: Task 'Edging' has 2 measurements/);
  });

  it('refuses a bad row naming the row, fewer than 5 job-based samples, a missing Te and nG', async () => {
    const badRow = await hygienist.post(groupPath, {
      strategy: 'task-based',
      instrument: 'dosimeter',
      tasks: [{ name: 'Edging', hours: 4, measurements: [{ laeqDb: 88 }, { laeqDb: 250 }, { laeqDb: 89, durationMinutes: -5 }] }],
    });
    expect(badRow.status).toBe(400);
    expect(badRow.body.error.fields).toMatchObject({
      'tasks.0.measurements.1.laeqDb': "Task 'Edging', measurement 2: use an LAeq between 0 and 200 dB",
      'tasks.0.measurements.2.durationMinutes': "Task 'Edging', measurement 3: use a duration above 0 minutes",
    });
    const fewSamples = await hygienist.post(groupPath, { strategy: 'job-based', instrument: 'dosimeter', measurements: rows([85, 86, 87, 88]) });
    expect(fewSamples.status).toBe(400);
    expect(fewSamples.body.error.fields).toMatchObject({
      measurements: '4 samples given; ISO 9612 job-based needs at least 5',
      effectiveHours: 'Enter the effective day Te in hours',
      groupSize: 'Enter the number of workers in the group (nG, for ISO 9612 Table 1)',
    });
    const notNumber = await hygienist.post(groupPath, {
      strategy: 'full-day',
      instrument: 'dosimeter',
      effectiveHours: 8,
      measurements: [{ laeqDb: 'loud' }, { laeqDb: 88 }, { laeqDb: 89 }],
    });
    expect(notNumber.status).toBe(400);
    expect(notNumber.body.error.fields['measurements.0.laeqDb']).toBe('Enter the LAeq in dB');
  });

  it('refuses another organization’s worker on a row, and an estimate on a group that is not about noise', async () => {
    const slateWorker = workerId(context.db, context.organizationId('slateHarbor'), 'SH-001');
    const answer = await hygienist.post(groupPath, {
      strategy: 'full-day',
      instrument: 'dosimeter',
      effectiveHours: 8,
      measurements: [{ laeqDb: 88, workerId: slateWorker }, { laeqDb: 88 }, { laeqDb: 89 }],
    });
    expect(answer.status).toBe(400);
    expect(answer.body.error.fields['measurements.0.workerId']).toMatch(/No worker \d+ in this organization/);
    const dust = groupId(context.db, ridgeback, 'Head sawyer – wood dust');
    const dustAnswer = await hygienist.post(`/api/orgs/${ridgeback}/exposure-groups/${dust}/noise-estimates`, {
      strategy: 'full-day',
      instrument: 'dosimeter',
      effectiveHours: 8,
      measurements: rows([88, 89, 90]),
    });
    expect(dustAnswer.status).toBe(400);
    expect(dustAnswer.body.error.message).toMatch(/is not a noise group/);
  });

  it('offers the group’s accepted noise-log days with the reviewed LAeq of each log, to start a full-day estimate', async () => {
    const fitters = groupId(context.db, ridgeback, 'Maintenance fitter – noise');
    const answer = await manager.get(`/api/orgs/${ridgeback}/exposure-groups/${fitters}/noise-log-days`);
    expect(answer.status).toBe(200);
    // The demo accepts the logs of RT-009 (5 Feb 2025) and RT-010 (6 Feb 2025) into this group.
    expect(answer.body.map((day: { measuredOn: string; workerCode: string }) => `${day.workerCode}@${day.measuredOn}`)).toEqual([
      'RT-009@2025-02-05',
      'RT-010@2025-02-06',
    ]);
    for (const day of answer.body as Array<{ noiseLogId: number; laeqDb: number }>) {
      const log = await manager.get(`/api/orgs/${ridgeback}/noise-logs/${day.noiseLogId}`);
      expect(day.laeqDb).toBe(log.body.figures.reviewed.iso.laeq);
    }
    const edgerDays = await manager.get(`/api/orgs/${ridgeback}/exposure-groups/${edger}/noise-log-days`);
    expect(edgerDays.body).toEqual([]); // the edger log is not accepted in the demo
  });

  it('a manager may read but not write; another organization gets 404', async () => {
    expect((await manager.post(groupPath, taskBased)).status).toBe(403);
    expect((await manager.put(estimatePath(taskEstimateId), taskBased)).status).toBe(403);
    expect((await outsider.get(`/api/orgs/${context.organizationId('slateHarbor')}/noise-estimates/${taskEstimateId}`)).status).toBe(404);
  });

  it('replacing an estimate’s inputs recomputes the figures and the audit keeps before and after; archiving hides it from the list', async () => {
    const changed = { ...taskBased, tasks: [...taskBased.tasks.slice(0, 2), { name: 'Sorting', hours: 2, measurements: rows([80, 81, 82]) }] };
    const answer = await hygienist.put(estimatePath(taskEstimateId), changed);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    expect(answer.body.tasks.map((task: { name: string }) => task.name)).toEqual(['Edging', 'Clearing jams', 'Sorting']);
    const events = auditOf(context.db, 'noise_estimate', taskEstimateId);
    expect(events.at(-1)).toMatchObject({ action: 'updated' });
    expect(JSON.stringify(events.at(-1)!.before)).toMatch(/Break room/);
    expect(JSON.stringify(events.at(-1)!.after)).toMatch(/Sorting/);
    const bad = await hygienist.put(estimatePath(taskEstimateId), { ...taskBased, tasks: [{ name: 'Edging', hours: 4, measurements: [] }] });
    expect(bad.status).toBe(400);
    // Nothing half-written: the refused replacement left the estimate as it was.
    expect((await hygienist.get(estimatePath(taskEstimateId))).body.tasks).toHaveLength(3);
    const archived = await hygienist.post(`${estimatePath(taskEstimateId)}/archive`, { archived: true });
    expect(archived.body.archived).toBe(true);
    const list = await hygienist.get(groupPath);
    expect(list.body.map((estimate: { id: number }) => estimate.id)).not.toContain(taskEstimateId);
    const all = await hygienist.get(`${groupPath}?archived=include`);
    expect(all.body.map((estimate: { id: number }) => estimate.id)).toContain(taskEstimateId);
    expect(auditOf(context.db, 'noise_estimate', taskEstimateId).at(-1)).toMatchObject({ action: 'archived' });
  });
});
