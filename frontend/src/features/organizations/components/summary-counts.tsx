import type { OrganizationSummary } from '../api/get-organization-summary';

const items: ReadonlyArray<{ key: keyof OrganizationSummary['counts']; label: string }> = [
  { key: 'sites', label: 'Sites' },
  { key: 'exposureGroups', label: 'Exposure groups' },
  { key: 'workers', label: 'Workers' },
  { key: 'agents', label: 'Agents' },
  { key: 'members', label: 'Members' },
];

/** The organization's size at a glance: one figure per kind of record. */
export function SummaryCounts({ counts }: { counts: OrganizationSummary['counts'] }) {
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-5">
      {items.map((item) => (
        <div key={item.key} className="card px-4 py-3">
          <dt className="text-xs font-medium tracking-wide text-slate-500 uppercase">{item.label}</dt>
          <dd className="mt-1 text-2xl font-semibold text-slate-900 tabular-nums" data-count={item.key}>
            {counts[item.key].toLocaleString()}
          </dd>
        </div>
      ))}
    </dl>
  );
}

/** Placeholder boxes with the same shape while the figures load. */
export function SummaryCountsSkeleton() {
  return (
    <div aria-hidden="true" className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-5">
      {items.map((item) => (
        <div key={item.key} className="card px-4 py-3">
          <div className="h-3 w-20 rounded bg-slate-200" />
          <div className="mt-2 h-7 w-10 animate-pulse rounded bg-slate-200" />
        </div>
      ))}
    </div>
  );
}
