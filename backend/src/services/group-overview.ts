import { and, eq } from 'drizzle-orm';
import { agents, oelEntries } from '@schema/agents';
import { samplingGuidance } from '@schema/sampling-plans';
import { sites } from '@schema/sites';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { getExposureGroup } from './exposure-groups';
import { cautions, currentPlanOf, listGroupPlans } from './sampling-plans';
import { resultCounts, resultsOfGroup } from './shift-results';
import { listGroupMembers, type NameAccess } from './workers';

/**
 * Everything the group page shows, in one answer so the page loads in one request: the group's
 * definition (with site, agent, the OEL list entry it follows and the effective OEL), its members
 * over time, its current sampling plan with picks and progress, every plan in short, and every
 * result (valid and void) with counts.
 */
export function groupOverview(db: Db, clock: Clock, organizationId: number, groupId: number, access: NameAccess) {
  return db.transaction((tx) => {
    const group = getExposureGroup(tx, clock, organizationId, groupId);
    const site = tx.select({ id: sites.id, name: sites.name, archived: sites.archived }).from(sites).where(eq(sites.id, group.siteId)).get()!;
    const agent = tx
      .select({ id: agents.id, name: agents.name, kind: agents.kind, casNumber: agents.casNumber, molecularWeight: agents.molecularWeight })
      .from(agents)
      .where(eq(agents.id, group.agentId))
      .get()!;
    const oelEntry =
      group.oelEntryId === null
        ? null
        : (tx
            .select()
            .from(oelEntries)
            .where(and(eq(oelEntries.id, group.oelEntryId), eq(oelEntries.organizationId, organizationId)))
            .get() ?? null);
    const results = resultsOfGroup(tx, group.id, access);
    const groupCautions: string[] = [...cautions];
    if (agent.kind === 'noise' && group.actionLevel !== null)
      groupCautions.push(`Hearing conservation trigger (action level): ${group.actionLevel} ${group.oelUnit === 'dose-percent' ? '% dose' : 'dB(A)'}.`);
    return {
      group,
      site,
      agent,
      oelEntry,
      members: listGroupMembers(tx, clock, organizationId, group.id, access),
      currentPlan: currentPlanOf(tx, organizationId, group.id, access),
      plans: listGroupPlans(tx, organizationId, group.id, 'all', access),
      results,
      counts: resultCounts(results),
      guidance: samplingGuidance,
      cautions: groupCautions,
    };
  });
}
