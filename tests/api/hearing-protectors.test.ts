import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { agentId, auditOf, groupId, siteId } from '../helpers/org-data';

type Estimate = { method: string; levelAtEarDb?: number; verdict?: string; source: string; unavailable: string | null; assumptions?: string[] };

describe('hearing protectors: the organization list, protectors in use and adequacy by method', () => {
  let context: TestContext;
  let ridgeback: number;
  let hygienist: SignedIn;
  let manager: SignedIn;
  let admin: SignedIn;
  let base: string;
  let noiseGroup: number;
  let protectorId: number;

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    hygienist = await context.signInAs('hygienist');
    manager = await context.signInAs('manager');
    admin = await context.signInAs('admin');
    base = `/api/orgs/${ridgeback}`;
    const created = await hygienist.post(`${base}/exposure-groups`, {
      siteId: siteId(context.db, ridgeback, 'Ridgeback sawmill'),
      name: 'Trimmer operator – noise',
      agentId: agentId(context.db, ridgeback, 'Noise'),
      oelValue: 90,
      oelUnit: 'dBA',
      oelSource: 'Test limit',
      oelAveragingTime: '8h-twa',
      noiseCriteriaSet: 'oshaPel',
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    noiseGroup = created.body.id;
    // A fresh seeded database and several sign-ins: slow on a busy machine, so the set-up gets a minute.
  }, 60_000);
  afterAll(() => context.close());

  it('a hygienist adds a protector with NRR, SNR and H/M/L (201, audited)', async () => {
    const answer = await hygienist.post(`${base}/hearing-protectors`, { name: 'Test earmuff A', type: 'earmuff', nrr: 29, snr: 30, h: 32, m: 24, l: 16 });
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    expect(answer.body).toMatchObject({
      name: 'Test earmuff A',
      type: 'earmuff',
      nrr: 29,
      snr: 30,
      h: 32,
      m: 24,
      l: 16,
      archived: false,
      warnings: [],
      groupCount: 0,
    });
    protectorId = answer.body.id;
    expect(auditOf(context.db, 'hearing_protector', protectorId)[0]).toMatchObject({ action: 'created', after: { nrr: 29, type: 'earmuff' } });
  });

  it('refuses ratings out of range, an unknown type and a partial H/M/L, naming each field (400)', async () => {
    const nrr = await hygienist.post(`${base}/hearing-protectors`, { name: 'Bad', type: 'earmuff', nrr: 290 });
    expect(nrr.status).toBe(400);
    expect(nrr.body.error.fields).toEqual({ nrr: 'The NRR must be from 0 to 45 dB' });
    const snr = await hygienist.post(`${base}/hearing-protectors`, { name: 'Bad', type: 'earmuff', snr: -3, h: 60, m: 20, l: 10 });
    expect(snr.body.error.fields).toMatchObject({ snr: 'The SNR must be from 0 to 50 dB', h: 'H must be from 0 to 50 dB' });
    const type = await hygienist.post(`${base}/hearing-protectors`, { name: 'Bad', type: 'helmet', nrr: 20 });
    expect(type.body.error.fields.type).toMatch(/^Use one of earmuff, formable-earplug/);
    const hml = await hygienist.post(`${base}/hearing-protectors`, { name: 'Bad', type: 'earmuff', h: 30 });
    expect(hml.body.error.fields).toEqual({
      m: 'Give H, M and L together (the HML method needs all three)',
      l: 'Give H, M and L together (the HML method needs all three)',
    });
    const none = await hygienist.post(`${base}/hearing-protectors`, { name: 'Bad', type: 'earmuff' });
    expect(none.body.error.fields).toEqual({ nrr: 'Give at least one rating: the NRR, the SNR, or H, M and L' });
  });

  it('warns, without refusing, when H ≥ M ≥ L does not hold', async () => {
    const answer = await hygienist.post(`${base}/hearing-protectors`, { name: 'Odd plug', type: 'premolded-earplug', h: 20, m: 25, l: 15 });
    expect(answer.status).toBe(201);
    expect(answer.body.warnings).toEqual(['H (20 dB) is below M (25 dB): usually H ≥ M ≥ L — check the data sheet']);
  });

  it('a manager reads the list but may not add a protector (403)', async () => {
    const list = await manager.get(`${base}/hearing-protectors`);
    expect(list.status).toBe(200);
    expect(list.body.map((protector: { name: string }) => protector.name)).toEqual(['Line earmuff', 'Odd plug', 'Test earmuff A', 'Yard foam plug']);
    expect((await manager.post(`${base}/hearing-protectors`, { name: 'X', type: 'earmuff', nrr: 20 })).status).toBe(403);
  });

  it('puts a protector in use in a noise group (201, audited); twice answers 409; a chemical group answers 422', async () => {
    const added = await hygienist.post(`${base}/exposure-groups/${noiseGroup}/protectors`, { protectorId });
    expect(added.status).toBe(201);
    expect(added.body.map((protector: { name: string }) => protector.name)).toEqual(['Test earmuff A']);
    expect(auditOf(context.db, 'exposure_group', noiseGroup).at(-1)).toMatchObject({ action: 'protector_added', after: { protectorId } });
    const again = await hygienist.post(`${base}/exposure-groups/${noiseGroup}/protectors`, { protectorId });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe('"Test earmuff A" is already in use in "Trimmer operator – noise"');
    const dust = groupId(context.db, ridgeback, 'Head sawyer – wood dust');
    const chemical = await hygienist.post(`${base}/exposure-groups/${dust}/protectors`, { protectorId });
    expect(chemical.status).toBe(422);
    expect(chemical.body.error.message).toMatch(/is not a noise group/);
    const unknown = await hygienist.post(`${base}/exposure-groups/${noiseGroup}/protectors`, { protectorId: 99999 });
    expect(unknown.body.error.fields).toEqual({ protectorId: 'No hearing protector 99999 in this organization' });
  });

  it('with a typed 100 dB(A) every method gives its level at the ear, source and verdict (hand-worked: OSHA 89/78, NIOSH 85.25, SNR 72, HML 76)', async () => {
    const answer = await manager.get(`${base}/exposure-groups/${noiseGroup}/protector-adequacy?level=typed&la=100`);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    expect(answer.body.level).toMatchObject({ source: 'typed', laDb: 100, lcDb: null, assumedCMinusADb: 2 });
    expect(answer.body.bands).toMatchObject({ actionLevelDb: 85, acceptableMarginDb: 5, goodMarginDb: 10, overProtectionMarginDb: 15 });
    const estimates: Estimate[] = answer.body.protectors[0].estimates;
    const byMethod = Object.fromEntries(estimates.map((estimate) => [estimate.method, estimate]));
    // OSHA App. B with 50 % derating: 100 − (29 − 7)/2 = 89 > 85 → not enough.
    expect(byMethod['osha-derated']).toMatchObject({ levelAtEarDb: 89, verdict: 'not-enough' });
    expect(byMethod['osha-derated']!.source).toMatch(/1910\.95 Appendix B/);
    // Un-derated: 100 − 22 = 78, within 80–75 → good.
    expect(byMethod['osha-appendix-b']).toMatchObject({ levelAtEarDb: 78, verdict: 'good' });
    // NIOSH earmuff: 29 × 0.75 = 21.75; 100 − (21.75 − 7) = 85.25 > 85 → not enough.
    expect(byMethod['niosh-derated']).toMatchObject({ levelAtEarDb: 85.25, verdict: 'not-enough' });
    // EN 458 SNR with the assumed LC = LA + 2: 102 − 30 = 72 (70–75) → acceptable.
    expect(byMethod['en458-snr']).toMatchObject({ levelAtEarDb: 72, verdict: 'acceptable' });
    expect(byMethod['en458-snr']!.assumptions![0]).toMatch(/LC = LA \+ 2 dB was assumed/);
    // HML at LC − LA = 2: PNR = M = 24; 100 − 24 = 76 → good.
    expect(byMethod['en458-hml']).toMatchObject({ levelAtEarDb: 76, verdict: 'good' });
    expect(answer.body.cautions.join(' ')).toMatch(/OSHA gives no credit for hearing protectors/);
  });

  it('flags over-protection: a typed 82 dB(A) with LC 84 under the earmuff gives 54 dB(A) by SNR', async () => {
    const answer = await manager.get(`${base}/exposure-groups/${noiseGroup}/protector-adequacy?level=typed&la=82&lc=84`);
    const snr = (answer.body.protectors[0].estimates as Estimate[]).find((estimate) => estimate.method === 'en458-snr')!;
    expect(snr).toMatchObject({ levelAtEarDb: 54, verdict: 'over-protection', assumptions: [] });
  });

  it('an earplug and an earmuff in use are also judged worn together: the higher-rated one’s estimate less 5 dB (hand-worked: 82 and 69 dB(A))', async () => {
    const plug = await hygienist.post(`${base}/hearing-protectors`, { name: 'Test foam plug', type: 'formable-earplug', nrr: 33 });
    expect(plug.status, JSON.stringify(plug.body)).toBe(201);
    expect((await hygienist.post(`${base}/exposure-groups/${noiseGroup}/protectors`, { protectorId: plug.body.id })).status).toBe(201);
    const answer = await manager.get(`${base}/exposure-groups/${noiseGroup}/protector-adequacy?level=typed&la=100`);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    expect(answer.body.combinations).toHaveLength(1);
    const [pair] = answer.body.combinations as Array<{ plug: { name: string }; muff: { name: string }; estimates: Estimate[] }>;
    expect([pair!.plug.name, pair!.muff.name]).toEqual(['Test foam plug', 'Test earmuff A']);
    const byMethod = Object.fromEntries(pair!.estimates.map((estimate) => [estimate.method, estimate]));
    // Higher NRR 33: derated 100 − (33 − 7)/2 − 5 = 82 (80–85) → acceptable; without derating 100 − 26 − 5 = 69 (< 70) → over-protection.
    expect(byMethod['osha-dual-derated']).toMatchObject({ levelAtEarDb: 82, verdict: 'acceptable' });
    expect(byMethod['osha-dual-appendix-b']).toMatchObject({ levelAtEarDb: 69, verdict: 'over-protection' });
    expect(byMethod['osha-dual-derated']!.source).toMatch(/less 5 dB/);
    // NIOSH and EN 458 have no combining rule: they say so rather than guess.
    expect(byMethod['niosh-derated']!.unavailable).toMatch(/use a rating measured on the combination/);
    expect(byMethod['en458-snr']!.unavailable).toMatch(/use a rating measured on the combination/);
    // Two earmuffs or one protector alone make no pair.
    expect((await hygienist.delete(`${base}/exposure-groups/${noiseGroup}/protectors/${plug.body.id}`)).status).toBe(200);
    expect((await manager.get(`${base}/exposure-groups/${noiseGroup}/protector-adequacy?level=typed&la=100`)).body.combinations).toEqual([]);
  });

  it('the verdict thresholds are organization settings: an admin changes them, a hygienist may not (403), bad margins answer 400', async () => {
    expect((await hygienist.put(`${base}/protector-settings`, {})).status).toBe(403);
    const defaults = await admin.get(`${base}/protector-settings`);
    expect(defaults.body).toEqual({
      protectorActionLevelDb: 85,
      protectorAcceptableMarginDb: 5,
      protectorGoodMarginDb: 10,
      protectorOverProtectionMarginDb: 15,
    });
    const bad = await admin.put(`${base}/protector-settings`, { ...defaults.body, protectorGoodMarginDb: 4 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ protectorGoodMarginDb: 'The "good" margin must be larger than the "acceptable" margin' });
    const changed = await admin.put(`${base}/protector-settings`, { ...defaults.body, protectorActionLevelDb: 80 });
    expect(changed.body.protectorActionLevelDb).toBe(80);
    expect(auditOf(context.db, 'organization', ridgeback).at(-1)).toMatchObject({
      action: 'protector_settings_changed',
      before: { protectorActionLevelDb: 85 },
      after: { protectorActionLevelDb: 80 },
    });
    const answer = await manager.get(`${base}/exposure-groups/${noiseGroup}/protector-adequacy?level=typed&la=100`);
    // 78 dB(A) against Lact 80: within (75, 80] → acceptable.
    expect((answer.body.protectors[0].estimates as Estimate[]).find((estimate) => estimate.method === 'osha-appendix-b')).toMatchObject({
      levelAtEarDb: 78,
      verdict: 'acceptable',
    });
    await admin.put(`${base}/protector-settings`, defaults.body);
  });

  it('with the group’s 95th percentile: refused (422) below 3 results; for a dose group it is turned into a TWA by the group’s criteria set', async () => {
    const few = await manager.get(`${base}/exposure-groups/${noiseGroup}/protector-adequacy?level=p95`);
    expect(few.status).toBe(422);
    expect(few.body.error.message).toBe('"Trimmer operator – noise" has 0 valid shift results: the 95th percentile needs at least 3 — type a level instead');
    const sawyer = groupId(context.db, ridgeback, 'Head sawyer – noise');
    const answer = await manager.get(`${base}/exposure-groups/${sawyer}/protector-adequacy`);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    expect(answer.body.level.source).toBe('p95');
    // The same P95 as the assessment's classical view, as a TWA by the NIOSH set: 10·log10(D/100) + 85 (NIOSH 98-126).
    const assessment = await manager.get(`${base}/exposure-groups/${sawyer}/assessment`);
    expect(assessment.status).toBe(200);
    const expected = 10 * Math.log10(assessment.body.classical.p95 / 100) + 85;
    expect(Math.abs(answer.body.level.laDb - expected)).toBeLessThan(1e-9);
    expect(answer.body.level.statement).toMatch(/95th percentile of \d+ valid shift results/);
    expect(answer.body.protectors.map((row: { protector: { name: string } }) => row.protector.name)).toEqual(['Line earmuff', 'Yard foam plug']);
  });

  it('a typed level without LA answers 400 naming la', async () => {
    const answer = await manager.get(`${base}/exposure-groups/${noiseGroup}/protector-adequacy?level=typed`);
    expect(answer.status).toBe(400);
    expect(answer.body.error.fields).toEqual({ la: 'Enter the A-weighted level LA (dB)' });
  });

  it('takes a protector off the group (audited) and archives it', async () => {
    const removed = await hygienist.delete(`${base}/exposure-groups/${noiseGroup}/protectors/${protectorId}`);
    expect(removed.status).toBe(200);
    expect(removed.body).toEqual([]);
    expect(auditOf(context.db, 'exposure_group', noiseGroup).at(-1)).toMatchObject({ action: 'protector_removed', before: { protectorId } });
    const archived = await hygienist.post(`${base}/hearing-protectors/${protectorId}/archive`, { reason: 'Replaced' });
    expect(archived.body.archived).toBe(true);
    const reassign = await hygienist.post(`${base}/exposure-groups/${noiseGroup}/protectors`, { protectorId });
    expect(reassign.body.error.fields.protectorId).toMatch(/is archived/);
  });
});
