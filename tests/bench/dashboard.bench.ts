/**
 * The organization dashboard on a large organization (issue 7: "must stay fast for large organizations"):
 * the demo plus 1,000 more exposure groups over 20 sites, each with 20 valid results, an approved decision
 * record and a sampling plan of 20 picks. The issue gives no number; the row reports the median so a change
 * to the query plan shows. Built with direct inserts (the services' checks would only slow the set-up).
 */
import { eq } from 'drizzle-orm';
import { agents } from '@schema/agents';
import { decisionRecords } from '@schema/decision-records';
import { exposureGroups } from '@schema/exposure-groups';
import { organizations } from '@schema/organizations';
import { plannedPicks, samplingPlans } from '@schema/sampling-plans';
import { shiftResults } from '@schema/shift-results';
import { sites } from '@schema/sites';
import { users } from '@schema/users';
import { workers } from '@schema/workers';
import { createFakeClock } from '../../backend/src/clock';
import { seedDemo } from '../../backend/src/db/seed-demo';
import { organizationDashboard } from '../../backend/src/services/dashboard';
import { createTemporaryDatabase } from '../helpers/test-app';
import { medianMs, type BenchRow } from './types';

const extraGroups = 1000;
const resultsPerGroup = 20;

export async function run(): Promise<BenchRow[]> {
  const temporary = createTemporaryDatabase();
  const { db } = temporary;
  const clock = createFakeClock();
  try {
    await seedDemo(db, { password: 'bench-password', clock, decisions: false });
    const organizationId = db.select().from(organizations).where(eq(organizations.slug, 'ridgeback-timber')).get()!.id;
    const agentId = db.select().from(agents).where(eq(agents.organizationId, organizationId)).get()!.id;
    const userId = db.select().from(users).get()!.id;
    const stamp = clock.now().toISOString();
    const times = { createdAt: stamp, updatedAt: stamp };
    db.transaction((tx) => {
      const siteIds = Array.from(
        { length: 20 },
        (_, index) =>
          tx
            .insert(sites)
            .values({ organizationId, name: `Bench site ${index + 1}`, ...times })
            .returning()
            .get().id,
      );
      const workerIds = Array.from(
        { length: resultsPerGroup },
        (_, index) =>
          tx
            .insert(workers)
            .values({ organizationId, code: `BW-${index + 1}`, ...times })
            .returning()
            .get().id,
      );
      for (let group = 0; group < extraGroups; group += 1) {
        const groupId = tx
          .insert(exposureGroups)
          .values({
            organizationId,
            siteId: siteIds[group % siteIds.length],
            name: `Bench group ${group + 1}`,
            agentId,
            oelValue: 1,
            oelUnit: 'mg/m3',
            oelSource: 'Bench limit',
            oelAveragingTime: '8h-twa',
            dataVersion: resultsPerGroup,
            ...times,
          })
          .returning()
          .get().id;
        const planId = tx
          .insert(samplingPlans)
          .values({
            organizationId,
            exposureGroupId: groupId,
            targetCount: resultsPerGroup,
            startDate: '2024-01-01',
            endDate: '2024-12-31',
            seed: group + 1,
            ...times,
          })
          .returning()
          .get().id;
        for (let index = 0; index < resultsPerGroup; index += 1) {
          const date = `2024-${String(1 + (index % 12)).padStart(2, '0')}-${String(1 + index).padStart(2, '0')}`;
          tx.insert(shiftResults)
            .values({
              organizationId,
              exposureGroupId: groupId,
              workerId: workerIds[index],
              agentId,
              date,
              value: 0.1 + index / 100,
              unit: 'mg/m3',
              source: 'entered',
              ...times,
            })
            .run();
          tx.insert(plannedPicks)
            .values({ organizationId, samplingPlanId: planId, draw: 1, workerId: workerIds[index], date, position: index + 1 })
            .run();
        }
        tx.insert(decisionRecords)
          .values({
            organizationId,
            exposureGroupId: groupId,
            status: 'approved',
            category: (group % 5) as 0 | 1 | 2 | 3 | 4,
            judgement: group % 3 === 0 ? 'uncertain' : 'acceptable',
            rationale: 'Bench record',
            reviewDate: `2025-${String(1 + (group % 12)).padStart(2, '0')}-15`,
            reviewDateSource: 'Bench',
            draftedByUserId: userId,
            submittedAt: stamp,
            approvedByUserId: userId,
            approvedAt: stamp,
            dataVersionAtDraft: resultsPerGroup,
            dataVersionAtApproval: group % 10 === 0 ? resultsPerGroup - 1 : resultsPerGroup,
            ...times,
          })
          .run();
      }
    });
    const dashboard = organizationDashboard(db, clock, organizationId);
    if (dashboard.groups.length < extraGroups) throw new Error(`dashboard bench: expected at least ${extraGroups} groups, got ${dashboard.groups.length}`);
    const median = await medianMs(7, () => organizationDashboard(db, clock, organizationId), 2);
    return [
      {
        suite: 'api',
        name: `organization dashboard, ${dashboard.groups.length} groups × ${resultsPerGroup} results (service, one aggregate query + recent decisions)`,
        value: median,
        unit: 'ms',
        note: 'median of 7 after 2 warm-ups; no target in issue 7',
      },
    ];
  } finally {
    temporary.close();
  }
}
