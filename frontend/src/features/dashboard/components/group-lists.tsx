import { Link } from 'react-router';
import type { DashboardGroup, OrganizationDashboard } from '@schema/dashboard';
import { CategoryBadge } from '@frontend/components/category-badge';
import { formatCalendarDate } from '@frontend/lib/format';

/** The dashboard's groups by id: its lists and matrix cells carry group ids only. */
export type DashboardGroupsById = ReadonlyMap<number, DashboardGroup>;

/** Indexes the dashboard's groups by id (once per answer; the lists refer to them). */
export function groupsById(dashboard: OrganizationDashboard): DashboardGroupsById {
  return new Map(dashboard.groups.map((group) => [group.id, group]));
}

/** The groups for a list of ids, in the list's order (an id the answer does not hold is skipped). */
export function resolveGroups(ids: readonly number[], byId: DashboardGroupsById): DashboardGroup[] {
  return ids.flatMap((id) => {
    const group = byId.get(id);
    return group ? [group] : [];
  });
}

function GroupLine({ organizationId, group, detail }: { organizationId: string; group: DashboardGroup; detail?: string }) {
  return (
    <li className="flex flex-wrap items-center gap-2 py-1">
      <Link to={`/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${group.id}/decisions`}>{group.name}</Link>
      <span className="text-xs text-slate-500">{group.siteName}</span>
      {group.category !== null && <CategoryBadge category={group.category} />}
      {detail && <span className="text-xs text-slate-700">{detail}</span>}
      {group.outOfDate && <span className="text-xs font-medium text-amber-900">out of date</span>}
    </li>
  );
}

function Panel({
  id,
  title,
  empty,
  groups,
  organizationId,
  detail,
}: {
  id: string;
  title: string;
  empty: string;
  groups: DashboardGroup[];
  organizationId: string;
  detail?: (group: DashboardGroup) => string;
}) {
  return (
    <section aria-labelledby={id} className="rounded-md border border-slate-200 bg-white p-3">
      <h3 id={id} className="text-sm font-semibold">
        {title} <span className="font-normal text-slate-500">({groups.length})</span>
      </h3>
      {groups.length === 0 ? (
        <p className="mt-1 text-sm text-slate-600">{empty}</p>
      ) : (
        <ul className="mt-1 text-sm">
          {groups.map((group) => (
            <GroupLine key={group.id} organizationId={organizationId} group={group} detail={detail?.(group)} />
          ))}
        </ul>
      )}
    </section>
  );
}

/** Groups judged unacceptable or uncertain on their current approved records. */
export function AttentionLists({ organizationId, dashboard, byId }: { organizationId: string; dashboard: OrganizationDashboard; byId: DashboardGroupsById }) {
  return (
    <div className="grid gap-3 md:grid-cols-2">
      <Panel
        id="unacceptable-title"
        title="Unacceptable groups"
        empty="No group is judged unacceptable."
        groups={resolveGroups(dashboard.unacceptable, byId)}
        organizationId={organizationId}
      />
      <Panel
        id="uncertain-title"
        title="Uncertain groups"
        empty="No group is judged uncertain."
        groups={resolveGroups(dashboard.uncertain, byId)}
        organizationId={organizationId}
      />
    </div>
  );
}

/** Review dates overdue, due within 30 days and within 31–90 days. */
export function ReviewLists({ organizationId, dashboard, byId }: { organizationId: string; dashboard: OrganizationDashboard; byId: DashboardGroupsById }) {
  const due = (group: DashboardGroup) => `review ${formatCalendarDate(group.reviewDate)}`;
  const lists = [
    { id: 'overdue-title', title: 'Reviews overdue', empty: 'None overdue.', ids: dashboard.reviews.overdue },
    { id: 'due30-title', title: 'Due within 30 days', empty: 'None due in 30 days.', ids: dashboard.reviews.within30 },
    { id: 'due90-title', title: 'Due in 31–90 days', empty: 'None due in 31–90 days.', ids: dashboard.reviews.within90 },
  ];
  return (
    <div className="grid gap-3 md:grid-cols-3">
      {lists.map((list) => (
        <Panel
          key={list.id}
          id={list.id}
          title={list.title}
          empty={list.empty}
          groups={resolveGroups(list.ids, byId)}
          organizationId={organizationId}
          detail={due}
        />
      ))}
    </div>
  );
}

/** Each group's current sampling plan: shifts measured against the target, as a bar with the numbers beside it. */
export function SamplingProgress({ dashboard }: { dashboard: OrganizationDashboard }) {
  const planned = dashboard.groups.filter((group) => group.plan !== null);
  if (planned.length === 0) return <p className="text-sm text-slate-600">No sampling plans yet.</p>;
  return (
    <div className="overflow-x-auto rounded-md border border-slate-200 bg-white">
      <table className="w-full text-sm">
        <caption className="sr-only">Sampling progress of each group's current plan</caption>
        <thead className="bg-slate-50 text-left text-xs text-slate-600">
          <tr>
            <th scope="col" className="px-3 py-2 font-medium">
              Exposure group
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Measured / target
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Valid results
            </th>
          </tr>
        </thead>
        <tbody>
          {planned.map((group) => {
            const plan = group.plan!;
            const percent = Math.min(100, Math.round((100 * plan.done) / Math.max(1, plan.targetCount)));
            return (
              <tr key={group.id} className="border-t border-slate-100">
                <th scope="row" className="px-3 py-2 text-left font-normal">
                  {group.name} <span className="text-xs text-slate-500">{group.siteName}</span>
                </th>
                <td className="px-3 py-2">
                  <div className="flex items-center gap-2">
                    <div aria-hidden="true" className="h-2 w-28 overflow-hidden rounded bg-slate-200">
                      <div className="h-full bg-primary-700" style={{ width: `${percent}%` }} />
                    </div>
                    <span className="tabular-nums">
                      {plan.done} / {plan.targetCount}
                    </span>
                  </div>
                </td>
                <td className="px-3 py-2 tabular-nums">{group.validResults}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
