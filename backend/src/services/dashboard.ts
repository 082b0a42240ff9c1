import { and, eq, sql } from 'drizzle-orm';
import type { DashboardGroup, OrganizationDashboard, OverviewOrganization } from '@schema/dashboard';
import { memberships, organizations } from '@schema/organizations';
import type { ExposureCategory, Judgement } from '@stats/types';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { NotFound } from '../errors';
import { addDays, today } from './dates';
import { decisionSummaries } from './decision-records';

/*
 * The organization dashboard (issue 7, PRODUCT.md capability 7). A group's category and judgement are
 * those of its current approved decision record — what a qualified person signed off — not a fresh
 * computation, so the page stays fast for a large organization: one aggregate query for every group
 * (site, agent, current record, open draft, result count, current plan's progress as correlated
 * subqueries on indexed columns) and one for the recent decisions. No query per group.
 */

interface GroupRow {
  id: number;
  name: string;
  site_id: number;
  site_name: string;
  agent_name: string;
  data_version: number;
  record_id: number | null;
  category: number | null;
  judgement: string | null;
  review_date: string | null;
  data_version_at_approval: number | null;
  approved_at: string | null;
  open_status: string | null;
  valid_results: number;
  plan_id: number | null;
  target_count: number | null;
  plan_done: number | null;
}

function groupRows(db: Db, organizationId: number): GroupRow[] {
  return db.all<GroupRow>(sql`
    SELECT g.id, g.name, g.site_id, s.name AS site_name, a.name AS agent_name, g.data_version,
      dr.id AS record_id, dr.category, dr.judgement, dr.review_date, dr.data_version_at_approval, dr.approved_at,
      (SELECT o.status FROM decision_records o
        WHERE o.exposure_group_id = g.id AND o.status IN ('draft', 'returned') ORDER BY o.id DESC LIMIT 1) AS open_status,
      (SELECT COUNT(*) FROM shift_results r WHERE r.exposure_group_id = g.id AND r.status = 'valid') AS valid_results,
      p.id AS plan_id, p.target_count,
      (SELECT COUNT(*) FROM planned_picks k
        WHERE k.sampling_plan_id = p.id AND k.draw = p.draw
          AND EXISTS (SELECT 1 FROM shift_results r
            WHERE r.exposure_group_id = g.id AND r.worker_id = k.worker_id AND r.date = k.date AND r.status = 'valid')) AS plan_done
    FROM exposure_groups g
    JOIN sites s ON s.id = g.site_id
    JOIN agents a ON a.id = g.agent_id
    LEFT JOIN decision_records dr ON dr.exposure_group_id = g.id AND dr.status = 'approved'
    LEFT JOIN sampling_plans p ON p.id = (
      SELECT sp.id FROM sampling_plans sp WHERE sp.exposure_group_id = g.id AND sp.archived = 0
      ORDER BY sp.created_at DESC, sp.id DESC LIMIT 1)
    WHERE g.organization_id = ${organizationId} AND g.archived = 0
    ORDER BY s.name, g.name`);
}

function groupOf(row: GroupRow): DashboardGroup {
  return {
    id: row.id,
    name: row.name,
    siteId: row.site_id,
    siteName: row.site_name,
    agentName: row.agent_name,
    recordId: row.record_id,
    category: row.category as ExposureCategory | null,
    judgement: row.judgement as Judgement | null,
    reviewDate: row.review_date,
    approvedAt: row.approved_at,
    outOfDate: row.record_id !== null && row.data_version_at_approval !== null && row.data_version > row.data_version_at_approval,
    openDraft: row.open_status as DashboardGroup['openDraft'],
    validResults: row.valid_results,
    plan: row.plan_id === null ? null : { id: row.plan_id, targetCount: row.target_count ?? 0, done: row.plan_done ?? 0 },
  };
}

/** The organization overview: site × category matrix, groups needing attention, review dates due, sampling progress, recent decisions. */
export function organizationDashboard(db: Db, clock: Clock, organizationId: number): OrganizationDashboard {
  const organization = db.select({ id: organizations.id, name: organizations.name }).from(organizations).where(eq(organizations.id, organizationId)).get();
  if (!organization) throw new NotFound(`No organization ${organizationId}`);
  const groups = groupRows(db, organizationId).map(groupOf);
  const date = today(clock);
  const in30 = addDays(date, 30);
  const in90 = addDays(date, 90);

  const sites = new Map<number, OrganizationDashboard['matrix'][number]>();
  for (const group of groups) {
    let site = sites.get(group.siteId);
    if (!site) {
      site = { siteId: group.siteId, siteName: group.siteName, cells: [[], [], [], [], []], undecided: [] };
      sites.set(group.siteId, site);
    }
    if (group.category === null) site.undecided.push(group.id);
    else site.cells[group.category].push(group.id);
  }
  const decided = groups.filter((group) => group.reviewDate !== null);
  const ids = (list: DashboardGroup[]) => list.map((group) => group.id);
  return {
    organization,
    today: date,
    matrix: [...sites.values()],
    groups,
    unacceptable: ids(groups.filter((group) => group.judgement === 'unacceptable')),
    uncertain: ids(groups.filter((group) => group.judgement === 'uncertain')),
    reviews: {
      overdue: ids(decided.filter((group) => group.reviewDate! < date)),
      within30: ids(decided.filter((group) => group.reviewDate! >= date && group.reviewDate! <= in30)),
      within90: ids(decided.filter((group) => group.reviewDate! > in30 && group.reviewDate! <= in90)),
    },
    recentDecisions: decisionSummaries(db, organizationId, { limit: 10 }),
    counts: {
      groups: groups.length,
      decided: decided.length,
      undecided: groups.length - decided.length,
      outOfDate: groups.filter((group) => group.outOfDate).length,
      openDrafts: groups.filter((group) => group.openDraft !== null).length,
    },
  };
}

/** A person's overview across every organization where they hold an active membership (the consultant's view). */
export function myOverview(db: Db, clock: Clock, userId: number): { organizations: OverviewOrganization[] } {
  const rows = db
    .select({ organizationId: memberships.organizationId, role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.active, true)))
    .all();
  const list = rows.map((row) => {
    const dashboard = organizationDashboard(db, clock, row.organizationId);
    const categories = [0, 0, 0, 0, 0] as [number, number, number, number, number];
    const byId = new Map(dashboard.groups.map((group) => [group.id, group]));
    for (const group of dashboard.groups) if (group.category !== null) categories[group.category] += 1;
    return {
      organization: dashboard.organization,
      role: row.role,
      counts: dashboard.counts,
      categories,
      unacceptable: dashboard.unacceptable.map((id) => {
        const { name, siteName } = byId.get(id)!;
        return { id, name, siteName };
      }),
      uncertain: dashboard.uncertain.length,
      reviewsOverdue: dashboard.reviews.overdue.length,
      reviewsWithin90: dashboard.reviews.within30.length + dashboard.reviews.within90.length,
    };
  });
  list.sort((a, b) => a.organization.name.localeCompare(b.organization.name));
  return { organizations: list };
}
