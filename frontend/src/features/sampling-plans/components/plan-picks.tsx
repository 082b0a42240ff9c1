import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router';
import { DataTable, TablePager, useClientListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { EmptyState } from '@frontend/components/states';
import { StatusBadge } from '@frontend/components/status-badge';
import type { PlanPick } from '@frontend/lib/api-types';
import { formatCalendarDate } from '@frontend/lib/format';

const column = createColumnHelper<ListTableFeatures, PlanPick>();

/** The worker-shifts the current draw picked, by date; measured ones are marked. */
export function PlanPicks({ organizationId, picks, canSeeNames }: { organizationId: string; picks: PlanPick[]; canSeeNames: boolean }) {
  const base = `/orgs/${encodeURIComponent(organizationId)}`;
  const columns = useMemo(
    () =>
      column.columns([
        column.accessor('date', {
          header: 'Date',
          sortFn: 'alphanumeric',
          cell: (info) => (
            <span className="whitespace-nowrap tabular-nums">
              {formatCalendarDate(info.getValue())} <span className="text-slate-500">{info.row.original.weekday.slice(0, 3)}</span>
            </span>
          ),
        }),
        column.accessor((pick) => pick.worker.code, {
          id: 'worker',
          header: 'Worker',
          sortFn: 'alphanumeric',
          cell: (info) => (
            <Link to={`${base}/workers/${info.row.original.worker.id}`} className="font-medium tabular-nums">
              {info.getValue()}
            </Link>
          ),
        }),
        ...(canSeeNames
          ? [column.accessor((pick) => pick.worker.name ?? '', { id: 'name', header: 'Name', sortFn: 'alphanumeric', cell: (info) => info.getValue() || '—' })]
          : []),
        column.accessor((pick) => pick.worker.jobTitle, {
          id: 'jobTitle',
          header: 'Job title',
          sortFn: 'alphanumeric',
          cell: (info) => info.getValue() || '—',
        }),
        column.accessor((pick) => (pick.done ? 1 : 0), {
          id: 'done',
          header: 'Measured',
          sortFn: 'basic',
          cell: (info) => (info.row.original.done ? <StatusBadge tone="positive">Measured</StatusBadge> : <StatusBadge tone="neutral">To do</StatusBadge>),
        }),
      ]),
    [base, canSeeNames],
  );
  const table = useClientListTable({ columns, data: picks, initialSorting: [{ id: 'date', desc: false }], getRowId: (pick) => String(pick.id) });
  return (
    <div className="space-y-2">
      <DataTable
        table={table}
        caption="Picked worker-shifts"
        empty={<EmptyState title="No picks">No member of the group works on a day of the plan's window.</EmptyState>}
      />
      {picks.length > 25 && <TablePager table={table} noun="picks" />}
    </div>
  );
}
