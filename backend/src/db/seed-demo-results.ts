import { and, eq } from 'drizzle-orm';
import { agents } from '@schema/agents';
import { exposureGroups } from '@schema/exposure-groups';
import { plannedPicks, samplingPlans } from '@schema/sampling-plans';
import { shiftResults } from '@schema/shift-results';
import { groupMemberships, workers } from '@schema/workers';
import { createRandom } from '@stats/random';
import { audit, type Tx } from '../services/changes';
import { candidateShifts, drawShifts } from '../services/sampling-draw';

/*
 * Demo sampling plans and shift results (PRODUCT.md "Demo scenario"; every number invented).
 * Each group's results are lognormal draws, GM × GSD^z with z standard normal, from a fixed seed
 * (stats/random.ts), taken on the worker-shifts its plan picked; a value below the demo detection
 * limit becomes a non-detect at that limit. The parameters put the groups in each judgement:
 * acceptable, uncertain and unacceptable (checked by tests/api/demo-results.test.ts with the
 * statistics engine).
 */

/** The demo campaign window: weekdays in autumn 2024. */
const window = { startDate: '2024-09-02', endDate: '2024-11-29' };

interface DemoCampaign {
  group: string;
  /** Seed of the plan's draw and (plus 1) of the values. */
  seed: number;
  targetCount: number;
  /** How many of the picks have a result (progress). */
  measured: number;
  geometricMean: number;
  geometricStandardDeviation: number;
  /** Values below this are non-detects at this limit (chemicals only). */
  detectionLimit?: number;
  /** Digits kept (noise dose to 0.1 %, concentrations to 3 significant digits). */
  decimals?: number;
  /** Position (1-based, in date order) of a result to store as void, with the reason. */
  voided?: { position: number; reason: string };
  expected: 'acceptable' | 'uncertain' | 'unacceptable' | 'too few results';
}

/** Campaigns by organization slug. Noise in % dose against 100 %; dusts in mg/m³. */
export const demoCampaigns: Record<string, DemoCampaign[]> = {
  'ridgeback-timber': [
    {
      group: 'Saw filer – noise',
      seed: 240_901,
      targetCount: 8,
      measured: 8,
      geometricMean: 12,
      geometricStandardDeviation: 1.7,
      decimals: 1,
      expected: 'acceptable',
    },
    {
      group: 'Head sawyer – noise',
      seed: 241_002,
      targetCount: 10,
      measured: 8,
      geometricMean: 30,
      geometricStandardDeviation: 1.9,
      decimals: 1,
      expected: 'uncertain',
    },
    {
      group: 'Edger operator – noise',
      seed: 240_903,
      targetCount: 8,
      measured: 7,
      geometricMean: 140,
      geometricStandardDeviation: 1.6,
      decimals: 1,
      expected: 'unacceptable',
    },
    {
      group: 'Forklift driver – noise',
      seed: 240_904,
      targetCount: 6,
      measured: 2,
      geometricMean: 45,
      geometricStandardDeviation: 1.8,
      decimals: 1,
      expected: 'too few results',
    },
    {
      group: 'Head sawyer – wood dust',
      seed: 240_905,
      targetCount: 10,
      measured: 10,
      geometricMean: 0.35,
      geometricStandardDeviation: 1.9,
      detectionLimit: 0.2,
      expected: 'acceptable',
    },
    {
      group: 'Planer feeder – wood dust',
      seed: 240_906,
      targetCount: 10,
      measured: 10,
      geometricMean: 1.6,
      geometricStandardDeviation: 1.8,
      detectionLimit: 0.2,
      voided: { position: 4, reason: 'Pump stopped after 3 h (flow fault found at the post-calibration); not a full-shift sample' },
      expected: 'uncertain',
    },
  ],
  'slate-harbor': [
    {
      group: 'Polisher – respirable crystalline silica',
      seed: 240_911,
      targetCount: 8,
      measured: 8,
      geometricMean: 0.004,
      geometricStandardDeviation: 1.8,
      detectionLimit: 0.002,
      expected: 'acceptable',
    },
    {
      group: 'Cutter – respirable crystalline silica',
      seed: 241_402,
      targetCount: 8,
      measured: 8,
      geometricMean: 0.012,
      geometricStandardDeviation: 2.0,
      detectionLimit: 0.005,
      expected: 'uncertain',
    },
    {
      group: 'Installer – respirable crystalline silica',
      seed: 240_913,
      targetCount: 6,
      measured: 6,
      geometricMean: 0.06,
      geometricStandardDeviation: 2.2,
      detectionLimit: 0.005,
      expected: 'unacceptable',
    },
    {
      group: 'Cutter – noise',
      seed: 240_914,
      targetCount: 6,
      measured: 4,
      geometricMean: 70,
      geometricStandardDeviation: 1.5,
      decimals: 1,
      expected: 'too few results',
    },
  ],
};

function rounded(value: number, decimals: number | undefined): number {
  if (decimals !== undefined) return Math.round(value * 10 ** decimals) / 10 ** decimals;
  return Number(value.toPrecision(3));
}

/**
 * Adds the demo plans and results for one organization, inside the seed's transaction. Returns
 * how many plans and results were written.
 */
export function seedDemoPlansAndResults(tx: Tx, input: { organizationId: number; slug: string; now: Date }): { plans: number; results: number } {
  const stamp = input.now.toISOString();
  let resultCount = 0;
  const campaigns = demoCampaigns[input.slug] ?? [];
  for (const campaign of campaigns) {
    const group = tx
      .select()
      .from(exposureGroups)
      .where(and(eq(exposureGroups.organizationId, input.organizationId), eq(exposureGroups.name, campaign.group)))
      .get();
    if (!group) throw new Error(`Demo campaign: no group "${campaign.group}"`);
    const agent = tx.select().from(agents).where(eq(agents.id, group.agentId)).get()!;
    const periods = tx
      .select({ workerId: groupMemberships.workerId, workerCode: workers.code, fromDate: groupMemberships.fromDate, toDate: groupMemberships.toDate })
      .from(groupMemberships)
      .innerJoin(workers, eq(workers.id, groupMemberships.workerId))
      .where(eq(groupMemberships.exposureGroupId, group.id))
      .all();
    const candidates = candidateShifts(periods, { ...window, includeWeekends: false });
    const picks = drawShifts(candidates, campaign.targetCount, campaign.seed);
    const plan = tx
      .insert(samplingPlans)
      .values({
        organizationId: input.organizationId,
        exposureGroupId: group.id,
        title: 'Autumn 2024 campaign',
        targetCount: campaign.targetCount,
        ...window,
        seed: campaign.seed,
        availableShifts: candidates.length,
        notes: 'Demo plan (invented).',
        createdAt: stamp,
        updatedAt: stamp,
      })
      .returning()
      .get();
    for (const pick of picks) {
      tx.insert(plannedPicks)
        .values({ organizationId: input.organizationId, samplingPlanId: plan.id, draw: 1, workerId: pick.workerId, date: pick.date, position: pick.position })
        .run();
    }
    const random = createRandom(campaign.seed + 1);
    const logGsd = Math.log(campaign.geometricStandardDeviation);
    const measured = picks.slice(0, campaign.measured);
    measured.forEach((pick, index) => {
      const drawn = campaign.geometricMean * Math.exp(logGsd * random.normal());
      const limit = campaign.detectionLimit;
      const nonDetect = limit !== undefined && drawn < limit;
      const value = nonDetect ? limit : rounded(drawn, campaign.decimals);
      const voided = campaign.voided?.position === index + 1;
      const row = tx
        .insert(shiftResults)
        .values({
          organizationId: input.organizationId,
          exposureGroupId: group.id,
          workerId: pick.workerId,
          agentId: agent.id,
          date: pick.date,
          value,
          unit: group.oelUnit,
          nonDetect,
          detectionLimit: nonDetect ? value : null,
          source: 'entered',
          sampleId: agent.kind === 'noise' ? null : `DEMO-${pick.date.replaceAll('-', '')}-${pick.workerCode}`,
          lab: agent.kind === 'noise' ? null : 'Demo laboratory (invented)',
          details: { statement: 'Demo data: an invented shift result.', flags: [] },
          notes: 'Demo data (invented).',
          status: voided ? 'void' : 'valid',
          voidReason: voided ? campaign.voided!.reason : null,
          voidedAt: voided ? stamp : null,
          createdAt: stamp,
          updatedAt: stamp,
        })
        .returning({ id: shiftResults.id })
        .get();
      resultCount += 1;
      if (voided) {
        audit(tx, {
          organizationId: input.organizationId,
          actor: null,
          entityType: 'shift_result',
          entityId: row.id,
          action: 'voided',
          reason: campaign.voided!.reason,
          before: { status: 'valid' },
          after: { status: 'void' },
          at: input.now,
        });
      }
    });
    if (measured.length > 0) {
      tx.update(exposureGroups).set({ dataVersion: measured.length, resultsChangedAt: stamp }).where(eq(exposureGroups.id, group.id)).run();
    }
  }
  if (campaigns.length > 0) {
    audit(tx, {
      organizationId: input.organizationId,
      actor: null,
      entityType: 'organization',
      entityId: input.organizationId,
      action: 'demo_results_seeded',
      reason: 'Demo sampling plans and invented shift results',
      after: { samplingPlans: campaigns.length, shiftResults: resultCount },
      at: input.now,
    });
  }
  return { plans: campaigns.length, results: resultCount };
}
