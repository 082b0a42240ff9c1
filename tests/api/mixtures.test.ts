import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { shiftResults } from '@schema/shift-results';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { agentId, auditOf, siteId } from '../helpers/org-data';

describe('mixtures: agents with similar effects and the additive index as the mixture group’s shift results', () => {
  let context: TestContext;
  let ridgeback: number;
  let hygienist: SignedIn;
  let manager: SignedIn;
  let base: string;
  let acetone: number;
  let butanone: number;
  let mixtureId: number;
  let mixtureGroup: number;
  let worker: number;

  async function post(path: string, body: object) {
    const answer = await hygienist.post(`${base}${path}`, body);
    expect(answer.status, `${path}: ${JSON.stringify(answer.body)}`).toBe(201);
    return answer.body;
  }

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    hygienist = await context.signInAs('hygienist');
    manager = await context.signInAs('manager');
    base = `/api/orgs/${ridgeback}`;
    const site = siteId(context.db, ridgeback, 'Ridgeback planing mill');
    acetone = (await post('/agents', { name: 'Solvent A (test)', kind: 'chemical' })).id;
    butanone = (await post('/agents', { name: 'Solvent B (test)', kind: 'chemical' })).id;
    const common = { siteId: site, oelSource: 'Test limit', oelAveragingTime: '8h-twa', oelUnit: 'ppm' };
    const groupA = (await post('/exposure-groups', { ...common, name: 'Finisher – solvent A', agentId: acetone, oelValue: 1000 })).id;
    const groupB = (await post('/exposure-groups', { ...common, name: 'Finisher – solvent B', agentId: butanone, oelValue: 200 })).id;
    worker = (await post('/workers', { code: 'RT-300', name: 'Test Finisher', jobTitle: 'Finisher' })).id;
    for (const group of [groupA, groupB]) await post('/group-memberships', { workerId: worker, exposureGroupId: group, fromDate: '2025-01-01', toDate: null });
    const results: Array<[number, string, number, boolean]> = [
      [groupA, '2025-02-03', 500, false],
      [groupB, '2025-02-03', 45, false],
      [groupA, '2025-02-04', 10, true],
      [groupB, '2025-02-04', 20, false],
      [groupA, '2025-02-05', 10, true],
      [groupB, '2025-02-05', 2, true],
      [groupA, '2025-02-06', 300, false],
      [groupA, '2025-02-07', 300, false],
      [groupB, '2025-02-07', 30, false],
    ];
    for (const [group, date, value, nonDetect] of results) {
      await post(
        '/shift-results',
        nonDetect
          ? { exposureGroupId: group, workerId: worker, date, nonDetect: true, detectionLimit: value }
          : { exposureGroupId: group, workerId: worker, date, value },
      );
    }
    // A fresh seeded database and several sign-ins: slow on a busy machine, so the set-up gets a minute.
  }, 60_000);
  afterAll(() => context.close());

  it('defines a mixture of two chemicals (201, audited as an agent of kind mixture)', async () => {
    const answer = await hygienist.post(`${base}/mixtures`, { name: 'Solvents A + B', componentAgentIds: [acetone, butanone] });
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    expect(answer.body).toMatchObject({
      name: 'Solvents A + B',
      components: [{ name: 'Solvent A (test)' }, { name: 'Solvent B (test)' }],
      groupCount: 0,
      validResultCount: 0,
    });
    mixtureId = answer.body.id;
    expect(auditOf(context.db, 'agent', mixtureId)[0]).toMatchObject({ action: 'created', after: { kind: 'mixture' } });
  });

  it('refuses one component, noise as a component, and a mixture typed in as an agent (400 naming the field)', async () => {
    const one = await hygienist.post(`${base}/mixtures`, { name: 'X', componentAgentIds: [acetone] });
    expect(one.body.error.fields).toEqual({ componentAgentIds: 'Choose at least 2 component agents' });
    const noise = await hygienist.post(`${base}/mixtures`, { name: 'X', componentAgentIds: [acetone, agentId(context.db, ridgeback, 'Noise')] });
    expect(noise.body.error.fields).toEqual({ componentAgentIds: '"Noise" is noise: a mixture\'s components are chemicals' });
    const typed = await hygienist.post(`${base}/agents`, { name: 'X', kind: 'mixture' });
    expect(typed.body.error.fields).toEqual({ kind: 'Define a mixture on the mixtures list (it needs its component agents)' });
  });

  it('a group for the mixture is judged against 1 (unit index); other units do not fit', async () => {
    const site = siteId(context.db, ridgeback, 'Ridgeback planing mill');
    const common = {
      siteId: site,
      name: 'Finisher – solvents A + B',
      agentId: mixtureId,
      oelValue: 1,
      oelSource: 'Additive mixture index, OSHA 29 CFR 1910.1000(d)(2)(i)',
      oelAveragingTime: '8h-twa',
    };
    const wrong = await hygienist.post(`${base}/exposure-groups`, { ...common, oelUnit: 'ppm' });
    expect(wrong.body.error.fields.oelUnit).toMatch(/ppm does not fit/);
    mixtureGroup = (await post('/exposure-groups', { ...common, oelUnit: 'index' })).id;
    await post('/group-memberships', { workerId: worker, exposureGroupId: mixtureGroup, fromDate: '2025-01-01', toDate: null });
  });

  it('previews what would be written: Σ Cᵢ/OELᵢ per worker-shift, the shift missing a component listed with it, nothing written', async () => {
    const answer = await manager.get(`${base}/exposure-groups/${mixtureGroup}/mixture-preview`);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    const rows = answer.body.rows as Array<{ date: string; index: number; nonDetect: boolean; lowerBound: number; flags: string[] }>;
    expect(rows.map((row) => row.date)).toEqual(['2025-02-03', '2025-02-04', '2025-02-05', '2025-02-07']);
    // Hand-worked: 500/1000 + 45/200 = 0.725; <10/1000 + 20/200 = 0.11 (lower 0.1); <10/1000 + <2/200 = <0.02; 300/1000 + 30/200 = 0.45.
    const expected = [0.725, 0.11, 0.02, 0.45];
    rows.forEach((row, position) => expect(Math.abs(row.index - expected[position]!) / expected[position]!).toBeLessThan(1e-12));
    expect(rows[1]).toMatchObject({ nonDetect: false });
    expect(Math.abs(rows[1]!.lowerBound - 0.1)).toBeLessThan(1e-12);
    expect(rows[1]!.flags[0]).toMatch(/1 of 2 components were non-detects, counted at their detection limit; with them at 0 the index would be 0.1/);
    expect(rows[2]).toMatchObject({ nonDetect: true });
    expect(answer.body.skipped).toEqual([
      {
        workerCode: 'RT-300',
        date: '2025-02-06',
        reason: 'no valid result for Solvent B (test) on this shift: the index needs every component',
        missing: ['Solvent B (test)'],
      },
    ]);
    expect(answer.body.source).toMatch(/1910\.1000\(d\)\(2\)\(i\)/);
    expect(context.db.select().from(shiftResults).where(eq(shiftResults.exposureGroupId, mixtureGroup)).all()).toEqual([]);
  });

  it('a manager may preview but not compute (403)', async () => {
    expect((await manager.post(`${base}/exposure-groups/${mixtureGroup}/mixture-results`, {})).status).toBe(403);
  });

  it('computes the results (source mixture, OEL 1) and recomputing voids the earlier ones with the reason "recomputed"', async () => {
    const first = await hygienist.post(`${base}/exposure-groups/${mixtureGroup}/mixture-results`, {});
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect(first.body).toMatchObject({ written: 4, voided: 0 });
    const stored = context.db.select().from(shiftResults).where(eq(shiftResults.exposureGroupId, mixtureGroup)).all();
    expect(stored.map((row) => [row.date, row.source, row.unit, row.nonDetect, row.status])).toEqual([
      ['2025-02-03', 'mixture', 'index', false, 'valid'],
      ['2025-02-04', 'mixture', 'index', false, 'valid'],
      ['2025-02-05', 'mixture', 'index', true, 'valid'],
      ['2025-02-07', 'mixture', 'index', false, 'valid'],
    ]);
    expect(stored[0]!.details!.mixture!.components.map((part) => part.ratio)).toEqual([0.5, 0.225]);
    expect(stored[0]!.details!.statement).toMatch(
      /^Mixture index Em = Σ Cᵢ\/OELᵢ = 500\/1000 ppm \(Solvent A \(test\)\) \+ 45\/200 ppm \(Solvent B \(test\)\) = 0.725/,
    );
    const again = await hygienist.post(`${base}/exposure-groups/${mixtureGroup}/mixture-results`, {});
    expect(again.body).toMatchObject({ written: 4, voided: 4 });
    const voided = context.db
      .select()
      .from(shiftResults)
      .where(and(eq(shiftResults.exposureGroupId, mixtureGroup), eq(shiftResults.status, 'void')))
      .all();
    expect(voided.map((row) => row.voidReason)).toEqual(['recomputed', 'recomputed', 'recomputed', 'recomputed']);
    expect(auditOf(context.db, 'shift_result', voided[0]!.id).at(-1)).toMatchObject({ action: 'voided', reason: 'recomputed' });
  });

  it('the mixture results feed the group statistics at OEL 1', async () => {
    const answer = await manager.get(`${base}/exposure-groups/${mixtureGroup}/assessment`);
    expect(answer.status, JSON.stringify(answer.body.error ?? '')).toBe(200);
    expect(answer.body.group).toMatchObject({ oel: 1, oelUnit: 'index' });
    expect(answer.body.data.results).toHaveLength(4);
  });

  it('the components cannot change while valid mixture results exist (409); computing for a non-mixture group answers 422', async () => {
    const third = (await post('/agents', { name: 'Solvent C (test)', kind: 'chemical' })).id;
    const change = await hygienist.patch(`${base}/mixtures/${mixtureId}`, { componentAgentIds: [acetone, butanone, third] });
    expect(change.status).toBe(409);
    expect(change.body.error.message).toBe(
      '"Solvents A + B" has 4 valid mixture result(s) computed from its components: void them before changing the components',
    );
    const notMixture = await hygienist.post(`${base}/exposure-groups/1/mixture-results`, {});
    expect(notMixture.status).toBe(422);
    expect(notMixture.body.error.message).toMatch(/is not a mixture group/);
  });
});
