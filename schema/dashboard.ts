import type { ExposureCategory, Judgement } from '@stats/types';
import type { DecisionRecordSummary } from './decision-records';
import type { Role } from './permissions';

/*
 * The dashboards over the wire: GET /api/orgs/:orgId/dashboard and GET /api/me/overview
 * (backend/src/services/dashboard.ts). A group's category is its current approved decision record's.
 */

export interface DashboardGroup {
  id: number;
  name: string;
  siteId: number;
  siteName: string;
  agentName: string;
  /** The current approved decision record, if any. */
  recordId: number | null;
  category: ExposureCategory | null;
  judgement: Judgement | null;
  reviewDate: string | null;
  approvedAt: string | null;
  /** Results changed after the current record was approved. */
  outOfDate: boolean;
  openDraft: 'draft' | 'returned' | null;
  validResults: number;
  /** The current sampling plan's progress: picked shifts with a valid result, against the target. */
  plan: { id: number; targetCount: number; done: number } | null;
}

export interface DashboardCounts {
  groups: number;
  decided: number;
  undecided: number;
  outOfDate: number;
  openDrafts: number;
}

export interface OrganizationDashboard {
  organization: { id: number; name: string };
  /** The server's date (UTC) the review windows are counted from. */
  today: string;
  /**
   * One row per site; `cells[c]` holds the ids of the groups in category c. Every list below holds group
   * ids that refer to `groups` (each group is sent once: a large organization's answer stays small).
   */
  matrix: Array<{
    siteId: number;
    siteName: string;
    cells: [number[], number[], number[], number[], number[]];
    undecided: number[];
  }>;
  groups: DashboardGroup[];
  unacceptable: number[];
  uncertain: number[];
  reviews: { overdue: number[]; within30: number[]; within90: number[] };
  recentDecisions: DecisionRecordSummary[];
  counts: DashboardCounts;
}

/** One organization in a person's overview across organizations. */
export interface OverviewOrganization {
  organization: { id: number; name: string };
  role: Role;
  counts: DashboardCounts;
  /** Groups per category 0–4 (current approved records). */
  categories: [number, number, number, number, number];
  unacceptable: Array<{ id: number; name: string; siteName: string }>;
  uncertain: number;
  reviewsOverdue: number;
  /** Review dates from today to 90 days ahead. */
  reviewsWithin90: number;
}
