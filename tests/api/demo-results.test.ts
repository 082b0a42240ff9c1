import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { exposureGroups } from '@schema/exposure-groups';
import { organizations } from '@schema/organizations';
import { plannedPicks, samplingPlans } from '@schema/sampling-plans';
import { shiftResults } from '@schema/shift-results';
import { assessGroup } from '@stats/assess-group';
import { createFakeClock } from '../../backend/src/clock';
import type { Db } from '../../backend/src/db/client';
import { seedDemo } from '../../backend/src/db/seed-demo';
import { demoCampaigns } from '../../backend/src/db/seed-demo-results';
import { createTemporaryDatabase } from '../helpers/test-app';

describe('demo sampling plans and shift results', () => {
  let temporary: ReturnType<typeof createTemporaryDatabase>;
  let db: Db;
  beforeAll(async () => {
    temporary = createTemporaryDatabase();
    db = temporary.db;
    await seedDemo(db, { password: 'bellwether-demo', clock: createFakeClock() });
  });
  afterAll(() => temporary.close());

  const groupNamed = (slug: string, name: string) => {
    const organization = db.select().from(organizations).where(eq(organizations.slug, slug)).get()!;
    return db
      .select()
      .from(exposureGroups)
      .where(and(eq(exposureGroups.organizationId, organization.id), eq(exposureGroups.name, name)))
      .get()!;
  };
  const validValues = (groupId: number) =>
    db
      .select({ value: shiftResults.value, nonDetect: shiftResults.nonDetect })
      .from(shiftResults)
      .where(and(eq(shiftResults.exposureGroupId, groupId), eq(shiftResults.status, 'valid')))
      .all();

  const judged = Object.entries(demoCampaigns).flatMap(([slug, campaigns]) =>
    campaigns.filter((campaign) => campaign.expected !== 'too few results').map((campaign) => ({ slug, campaign })),
  );

  it.each(judged)('$campaign.group is judged $campaign.expected by the statistics engine', ({ slug, campaign }) => {
    const group = groupNamed(slug, campaign.group);
    const values = validValues(group.id);
    expect(values.length).toBeGreaterThanOrEqual(6);
    expect(assessGroup({ values, oel: group.oelValue }).judgement).toBe(campaign.expected);
  });

  it('shows every judgement at least once, across both organizations', () => {
    expect(new Set(judged.map(({ campaign }) => campaign.expected))).toEqual(new Set(['acceptable', 'uncertain', 'unacceptable']));
  });

  it('wood dust and silica groups include non-detects stored at their detection limit', () => {
    for (const [slug, name] of [
      ['ridgeback-timber', 'Head sawyer – wood dust'],
      ['slate-harbor', 'Cutter – respirable crystalline silica'],
    ] as const) {
      const group = groupNamed(slug, name);
      const nonDetects = db
        .select()
        .from(shiftResults)
        .where(and(eq(shiftResults.exposureGroupId, group.id), eq(shiftResults.nonDetect, true)))
        .all();
      expect(nonDetects.length, name).toBeGreaterThan(0);
      for (const result of nonDetects) expect(result.value).toBe(result.detectionLimit);
    }
  });

  it('noise groups are judged on a daily dose in % against 100 %, with the 50 % action level', () => {
    const group = groupNamed('ridgeback-timber', 'Saw filer – noise');
    expect(group).toMatchObject({ oelValue: 100, oelUnit: 'dose-percent', actionLevel: 50 });
  });

  it('each result sits on a worker-shift its plan picked, and progress is partial where the campaign is still running', () => {
    const group = groupNamed('ridgeback-timber', 'Head sawyer – noise');
    const plan = db.select().from(samplingPlans).where(eq(samplingPlans.exposureGroupId, group.id)).get()!;
    const picks = db.select().from(plannedPicks).where(eq(plannedPicks.samplingPlanId, plan.id)).all();
    const results = db.select().from(shiftResults).where(eq(shiftResults.exposureGroupId, group.id)).all();
    expect(picks).toHaveLength(10);
    expect(results).toHaveLength(8);
    const picked = new Set(picks.map((pick) => `${pick.workerId}|${pick.date}`));
    for (const result of results) expect(picked.has(`${result.workerId}|${result.date}`)).toBe(true);
    expect(group.dataVersion).toBe(8);
  });

  it('one planer-feeder wood-dust result is stored void with its reason, and the group keeps 9 valid results', () => {
    const group = groupNamed('ridgeback-timber', 'Planer feeder – wood dust');
    const results = db.select().from(shiftResults).where(eq(shiftResults.exposureGroupId, group.id)).all();
    const voided = results.filter((result) => result.status === 'void');
    expect(voided).toHaveLength(1);
    expect(voided[0].voidReason).toMatch(/Pump stopped/);
    expect(results.length - voided.length).toBe(9);
  });
});
