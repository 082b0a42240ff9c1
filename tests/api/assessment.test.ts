/**
 * GET /api/orgs/:orgId/exposure-groups/:groupId/assessment (issue 7): the group's assessment from its
 * stored shift results. The figures are checked against `npm run -s assess --bayes` (PRODUCT.md
 * "Command-line contracts") run on the same data: the command's figures are themselves checked against
 * published examples, R and JAGS in tests/reference/. Demo data are invented (PRODUCT.md "Demo scenario").
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AssessGroupReport, AssessmentRefusalDetails, GroupAssessmentResponse } from '@schema/assessment';
import { exposureGroups } from '@schema/exposure-groups';
import { organizations } from '@schema/organizations';
import { shiftResults } from '@schema/shift-results';
import { main } from '../../backend/src/cli/assess';
import { createAssessmentEngine, getGroupAssessment, type AssessmentEngine } from '../../backend/src/services/assessment';
import { groupId } from '../helpers/org-data';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

const folder = mkdtempSync(path.join(os.tmpdir(), 'assessment-api-'));

/** Runs the assess command in-process on `results` (written as its CSV, in the API's order) and returns the group's report. */
function assessCommand(answer: GroupAssessmentResponse): AssessGroupReport {
  const name = answer.group.name;
  const csv = path.join(folder, `group-${answer.group.id}-${answer.data.dataHash.slice(0, 8)}.csv`);
  const groupsFile = path.join(folder, `groups-${answer.group.id}.json`);
  const rows = answer.data.results.map((result) => `"${name}",${result.nonDetect ? '<' : ''}${String(result.value)}`);
  writeFileSync(csv, ['group,value', ...rows].join('\n'));
  writeFileSync(
    groupsFile,
    JSON.stringify({ [name]: { oel: answer.group.oel, ...(answer.group.actionLevel === null ? {} : { actionLevel: answer.group.actionLevel }) } }),
  );
  let stdout = '';
  let stderr = '';
  const code = main(['--input', csv, '--groups', groupsFile, '--bayes', '--seed', String(answer.settings.seed)], {
    stdout: (text) => (stdout += text),
    stderr: (text) => (stderr += text),
  });
  expect(stderr).toBe('');
  expect(code).toBe(0);
  const document = JSON.parse(stdout) as { groups: AssessGroupReport[] };
  expect(document.groups).toHaveLength(1);
  return document.groups[0];
}

/** Every contract field, read from the API's full figures (not from its `report`), for comparison with the command. */
function contractFieldsOf(answer: GroupAssessmentResponse): Omit<AssessGroupReport, 'judgement' | 'method'> {
  const { classical, bayes } = answer;
  const interval = (summary: { median: number; lower: number; upper: number; q95: number }) => ({
    median: summary.median,
    lower: summary.lower,
    upper: summary.upper,
    q95: summary.q95,
  });
  return {
    group: answer.group.name,
    n: classical.n,
    nCensored: classical.nonDetects,
    error: null,
    gm: classical.gm,
    gsd: classical.gsd,
    am: classical.am,
    sd: classical.sd,
    p95: classical.p95,
    utl95_95: classical.utl95_95,
    exceedanceFraction: classical.exceedanceFraction,
    exceedanceFractionUcl95: classical.exceedanceFractionUcl95,
    amMvue: classical.amMvue,
    amUcl95: classical.amUcl95,
    shapiroWilk: classical.fitCheck.shapiroWilkLog && { w: classical.fitCheck.shapiroWilkLog.w, p: classical.fitCheck.shapiroWilkLog.p },
    en689: { ur: classical.en689.ur, ut: classical.en689.ut, result: classical.en689.result },
    categoryByP95: classical.categoryByP95,
    categoryByUtl: classical.categoryByUtl,
    bayes: bayes && {
      gm: interval(bayes.gm),
      gsd: interval(bayes.gsd),
      p95: interval(bayes.p95),
      exceedanceFraction: interval(bayes.exceedanceFraction!),
      categoryProbabilities: bayes.categoryProbabilities!,
    },
  };
}

describe('group assessment API', () => {
  let context: TestContext;
  let engine: AssessmentEngine;
  let ridgeback: number;
  let slateHarbor: number;
  let analyst: SignedIn;
  const url = (group: number, query = '', organization = ridgeback) => `/api/orgs/${organization}/exposure-groups/${group}/assessment${query}`;

  beforeAll(async () => {
    engine = createAssessmentEngine();
    context = await createTestContext({ assessmentEngine: engine });
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    analyst = await context.signInAs('analyst');
  });
  afterAll(async () => {
    await context.close();
    await engine.close();
    rmSync(folder, { recursive: true, force: true });
  });

  it.each([
    ['Head sawyer – noise', 'complete data'],
    ['Head sawyer – wood dust', 'non-detects'],
  ])('the figures of %s (%s) equal `npm run -s assess --bayes` on the same results, field by field', async (name) => {
    const answer = await analyst.get(url(groupId(context.db, ridgeback, name)));
    expect(answer.status).toBe(200);
    const body = answer.body as GroupAssessmentResponse;
    expect(body.data.results.length).toBeGreaterThanOrEqual(8);
    const command = assessCommand(body);
    // Same functions, same inputs, same seed: the numbers must be identical, not merely close.
    expect(contractFieldsOf(body)).toEqual({ ...command, judgement: undefined, method: undefined });
    expect(body.report).toEqual(command);
    expect(body.classical.judgement).toBe(command.judgement);
    expect(body.classical.fit.method).toBe(command.method);
  });

  it('answers with the group, the results used, a data hash, every part of the assessment and the cautions', async () => {
    const group = groupId(context.db, ridgeback, 'Head sawyer – wood dust');
    const answer = await analyst.get(url(group));
    expect(answer.status).toBe(200);
    const body = answer.body as GroupAssessmentResponse;
    expect(body.group).toMatchObject({ id: group, name: 'Head sawyer – wood dust', oelUnit: 'mg/m3', agent: { kind: 'chemical' } });
    expect(body.data.dataHash).toMatch(/^[0-9a-f]{64}$/);
    expect(body.data.excludedIds).toEqual([]);
    const first = body.data.results[0];
    expect(first).toEqual({
      id: expect.any(Number),
      workerCode: expect.stringMatching(/^RT-/),
      date: expect.stringMatching(/^\d{4}-\d{2}-\d{2}$/),
      value: expect.any(Number),
      nonDetect: expect.any(Boolean),
      source: expect.any(String),
    });
    expect(body.data.results.some((result) => result.nonDetect)).toBe(true);
    // Classical view: fit check on logs and raw values, plot with its fitted line, limits, EN 689, sentence, methods.
    expect(body.classical.fitCheck.shapiroWilkLog).toEqual({ w: expect.any(Number), p: expect.any(Number) });
    expect(body.classical.fitCheck.shapiroWilkRaw).toEqual({ w: expect.any(Number), p: expect.any(Number) });
    expect(body.classical.probabilityPlot.points).toHaveLength(body.data.results.length);
    expect(body.classical.probabilityPlot.line.slope).toBeCloseTo(Math.log(body.classical.gsd), 12);
    expect(body.classical.exceedanceFractionLcl95).toBeLessThanOrEqual(body.classical.exceedanceFraction);
    expect(body.classical.amLcl95).toBeLessThanOrEqual(body.classical.amUcl95);
    expect(body.classical.managerSentence.length).toBeGreaterThan(20);
    expect(body.classical.methods.some((method) => /non-detects/i.test(method))).toBe(true);
    // Bayesian view with diagnostics and the prior recorded; P(P95 > OEL) is the top category's probability.
    expect(body.bayes!.prior.name).toBe('reference');
    expect(body.bayes!.probabilityP95AboveOel).toBe(body.bayes!.categoryProbabilities![4]);
    expect(body.bayes!.diagnostics.rHat.mu).toBeLessThan(1.01);
    expect(body.bayes!.diagnostics.warnings).toEqual([]);
    expect(body.bayes!.unacceptableThreshold).toBe(0.3);
    // Planner: k = 1..12; this group is already settled (acceptable), so no more shifts are recommended.
    expect(body.planner!.forecasts.map((forecast) => forecast.additional)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
    expect(body.classical.judgement).toBe('acceptable');
    expect(body.planner!.currentJudgement).toBe('acceptable');
    expect(body.planner!.recommendedAdditional).toBe(0);
    expect(body.planner!.statement).toMatch(/already settled/);
    expect(body.betweenWorker === null ? body.unavailable.betweenWorker : body.betweenWorker.workers).toBeTruthy();
    expect(body.engineVersion).toEqual({ application: expect.stringMatching(/^\d+\.\d+\.\d+/), statistics: expect.stringMatching(/^\d+\.\d+\.\d+/) });
    expect(body.cautions).toContain('Statistics support and never replace the judgement of a qualified hygienist.');
    expect(body.hearingConservation).toBeNull();
  });

  it('a noise group carries the hearing conservation trigger with its action level', async () => {
    const answer = await analyst.get(url(groupId(context.db, ridgeback, 'Edger operator – noise')));
    expect(answer.status).toBe(200);
    const body = answer.body as GroupAssessmentResponse;
    expect(body.hearingConservation).toMatchObject({ actionLevel: 50, unit: 'dose-percent' });
    expect(body.hearingConservation!.statement).toMatch(/Hearing conservation trigger \(action level\): 50 % dose/);
    expect(body.hearingConservation!.statement).toMatch(/85 dB\(A\)/);
    const atOrAbove = body.data.results.filter((result) => result.value >= 50).length;
    expect(body.hearingConservation!.resultsAtOrAboveActionLevel).toBe(atOrAbove);
  });

  it('what-if: leaving the highest result out changes the figures and leaves the stored results untouched', async () => {
    const group = groupId(context.db, ridgeback, 'Head sawyer – noise');
    const storedBefore = context.db.select().from(shiftResults).where(eq(shiftResults.exposureGroupId, group)).all();
    const versionBefore = context.db.select().from(exposureGroups).where(eq(exposureGroups.id, group)).get()!.dataVersion;
    const baseline = (await analyst.get(url(group))).body as GroupAssessmentResponse;
    const highest = baseline.data.results.reduce((a, b) => (b.value > a.value ? b : a));
    // An uncertain group: the planner forecasts how many more shifts would settle it, and says it is a forecast.
    expect(baseline.classical.judgement).toBe('uncertain');
    expect(baseline.planner!.statement).toMatch(/this is a forecast from the current data, not a promise/);

    const answer = await analyst.get(url(group, `?exclude=${highest.id}`));
    expect(answer.status).toBe(200);
    const whatIf = answer.body as GroupAssessmentResponse;
    expect(whatIf.data.excludedIds).toEqual([highest.id]);
    expect(whatIf.data.excluded.map((result) => result.id)).toEqual([highest.id]);
    expect(whatIf.data.results).toHaveLength(baseline.data.results.length - 1);
    expect(whatIf.classical.n).toBe(baseline.classical.n - 1);
    expect(whatIf.classical.p95).toBeLessThan(baseline.classical.p95);
    expect(whatIf.bayes!.p95.median).toBeLessThan(baseline.bayes!.p95.median);
    expect(whatIf.data.dataHash).not.toBe(baseline.data.dataHash);

    expect(context.db.select().from(shiftResults).where(eq(shiftResults.exposureGroupId, group)).all()).toEqual(storedBefore);
    expect(context.db.select().from(exposureGroups).where(eq(exposureGroups.id, group)).get()!.dataVersion).toBe(versionBefore);
  });

  it('an exclusion that is not a valid result of the group is refused with 400 naming "exclude"', async () => {
    const group = groupId(context.db, ridgeback, 'Head sawyer – noise');
    const answer = await analyst.get(url(group, '?exclude=999999'));
    expect(answer.status).toBe(400);
    expect(answer.body.error.fields).toEqual({ exclude: 'result 999999 is not a valid result of this group' });
    const garbled = await analyst.get(url(group, '?exclude=4;5'));
    expect(garbled.status).toBe(400);
    expect(garbled.body.error.fields.exclude).toMatch(/separated by commas/);
    const prior = await analyst.get(url(group, '?prior=flat'));
    expect(prior.status).toBe(400);
    expect(prior.body.error.fields.prior).toMatch(/reference, gsd-informative/);
  });

  it('another organization’s group is not found (404), through either organization’s address', async () => {
    const otherGroup = groupId(context.db, slateHarbor, 'Cutter – respirable crystalline silica');
    const viaOwn = await analyst.get(url(otherGroup));
    expect(viaOwn.status).toBe(404);
    expect(viaOwn.body.error.message).toBe(`No exposure group ${otherGroup} in this organization`);
    const viaOther = await analyst.get(url(otherGroup, '', slateHarbor));
    expect(viaOther.status).toBe(404);
  });

  it('a group with fewer than 3 results answers 422 naming the rule, with descriptive figures of what there is', async () => {
    const group = groupId(context.db, ridgeback, 'Forklift driver – noise');
    const answer = await analyst.get(url(group));
    expect(answer.status).toBe(422);
    expect(answer.body.error.code).toBe('unprocessable');
    expect(answer.body.error.message).toBe('"Forklift driver – noise" cannot be assessed: at least 3 results are needed (rule: fewer than 3 results), got 2');
    const details = answer.body.error.details as AssessmentRefusalDetails;
    expect(details.rule).toBe('at least 3 results are needed (rule: fewer than 3 results), got 2');
    expect(details.data.results).toHaveLength(2);
    expect(details.descriptive).toMatchObject({ n: 2, nonDetects: 0 });
    expect(details.descriptive!.maximum).toBe(Math.max(...details.data.results.map((result) => result.value)));
    expect(details.hearingConservation).toMatchObject({ actionLevel: 50 });
    expect(details.cautions.length).toBeGreaterThanOrEqual(2);
  });

  it('leaving out results until fewer than 3 remain answers 422, and the stored group still assesses', async () => {
    const group = groupId(context.db, ridgeback, 'Saw filer – noise');
    const baseline = (await analyst.get(url(group))).body as GroupAssessmentResponse;
    const leaveOut = baseline.data.results.slice(2).map((result) => result.id);
    const answer = await analyst.get(url(group, `?exclude=${leaveOut.join(',')}`));
    expect(answer.status).toBe(422);
    expect(answer.body.error.details.rule).toMatch(/rule: fewer than 3 results/);
    expect(answer.body.error.details.data.excludedIds).toEqual([...leaveOut].sort((a, b) => a - b));
    expect((await analyst.get(url(group))).status).toBe(200);
  });

  it('a manager reads the assessment but may not run what-if variations (403)', async () => {
    const manager = await context.signInAs('manager');
    const group = groupId(context.db, ridgeback, 'Saw filer – noise');
    const read = await manager.get(url(group));
    expect(read.status).toBe(200);
    const baseline = read.body as GroupAssessmentResponse;
    const whatIf = await manager.get(url(group, `?exclude=${baseline.data.results[0].id}`));
    expect(whatIf.status).toBe(403);
    expect((await manager.get(url(group, '?prior=gsd-informative'))).status).toBe(403);
  });

  it('the informative GSD prior is used and recorded when asked for, and the organization’s Bayesian threshold applies', async () => {
    const group = groupId(context.db, ridgeback, 'Planer feeder – wood dust');
    context.db
      .update(organizations)
      .set({ settings: { bayesUnacceptableThreshold: 0.5 } })
      .where(eq(organizations.id, ridgeback))
      .run();
    try {
      const answer = await analyst.get(url(group, '?prior=gsd-informative'));
      expect(answer.status).toBe(200);
      const body = answer.body as GroupAssessmentResponse;
      expect(body.settings).toMatchObject({ prior: 'gsd-informative', unacceptableThreshold: 0.5, unacceptableThresholdSource: 'organization' });
      expect(body.bayes!.prior.name).toBe('informative-gsd');
      expect(body.bayes!.unacceptableThreshold).toBe(0.5);
      // The command line has only the reference prior, so the contract's Bayesian part is left empty here.
      expect(body.report.bayes).toBeNull();
    } finally {
      context.db.update(organizations).set({ settings: {} }).where(eq(organizations.id, ridgeback)).run();
    }
  });

  it('the cache returns the same figures object for the same data and settings, and says so', async () => {
    const group = groupId(context.db, ridgeback, 'Edger operator – noise');
    const input = { organizationId: ridgeback, groupId: group, exclude: [], prior: 'reference' as const };
    const first = await getGroupAssessment(context.db, context.clock, engine, input);
    const second = await getGroupAssessment(context.db, context.clock, engine, input);
    expect(second.classical).toBe(first.classical);
    expect(second.bayes).toBe(first.bayes);
    expect(second.planner).toBe(first.planner);
    expect(second.computation.cached).toBe(true);
    const overHttp = (await analyst.get(url(group))).body as GroupAssessmentResponse;
    expect(overHttp.computation.cached).toBe(true);
    expect(overHttp.data.dataHash).toBe(first.data.dataHash);
    // Another prior is other settings: another entry.
    const other = await getGroupAssessment(context.db, context.clock, engine, { ...input, prior: 'gsd-informative' });
    expect(other.data.dataHash).not.toBe(first.data.dataHash);
    expect(other.classical).not.toBe(first.classical);
  });

  it('health answers while a Bayesian computation runs in the worker threads', async () => {
    const group = groupId(context.db, slateHarbor, 'Cutter – respirable crystalline silica');
    const slateAnalyst = await context.signInAs('analyst', 'slateHarbor');
    const baseline = (await slateAnalyst.get(url(group, '', slateHarbor))).body as GroupAssessmentResponse;
    // New data (one result left out) is not in the cache, so the Bayesian view and the planner must run.
    let assessmentDone = false;
    const pending = slateAnalyst.get(url(group, `?exclude=${baseline.data.results[1].id}`, slateHarbor)).then((answer) => {
      assessmentDone = true;
      return answer;
    });
    // Wait until both threads are busy: the classical part is done and the Bayesian view and planner run.
    const deadline = Date.now() + 20_000;
    while (engine.pool.activity().running < 2 && !assessmentDone && Date.now() < deadline) await new Promise((wait) => setTimeout(wait, 2));
    expect(engine.pool.activity().running).toBe(2);
    const health = await (await context.client()).get('/api/health');
    expect(health.status).toBe(200);
    expect(health.body).toMatchObject({ ok: true });
    expect(assessmentDone).toBe(false);
    expect(engine.pool.activity().running).toBeGreaterThanOrEqual(1);
    const answer = await pending;
    expect(answer.status).toBe(200);
    expect(answer.body.computation.cached).toBe(false);
  });
});
