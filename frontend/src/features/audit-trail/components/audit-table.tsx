import { createColumnHelper } from '@tanstack/react-table';
import type { AuditEventView } from '@schema/audit';
import type { ListPage } from '@schema/list-query';
import { DataTable, TablePager, useServerListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { EmptyState } from '@frontend/components/states';
import { formatDateTime } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import { ChangeSummary } from './change-summary';

const column = createColumnHelper<ListTableFeatures, AuditEventView>();

const columns = column.columns([
  column.accessor('at', {
    header: 'When',
    enableSorting: false,
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatDateTime(info.getValue())}</span>,
  }),
  column.accessor('actor', {
    header: 'Person',
    enableSorting: false,
    cell: (info) => {
      const actor = info.getValue();
      return actor ? <span title={actor.email}>{actor.name}</span> : <span className="text-slate-500">System</span>;
    },
  }),
  column.accessor('entityType', {
    header: 'Record',
    enableSorting: false,
    cell: (info) => (
      <span className="whitespace-nowrap">
        {info.getValue().replaceAll('_', ' ')} <span className="text-slate-500 tabular-nums">#{info.row.original.entityId}</span>
      </span>
    ),
  }),
  column.accessor('action', { header: 'Action', enableSorting: false, cell: (info) => info.getValue() }),
  column.accessor('before', {
    id: 'changes',
    header: 'What changed',
    enableSorting: false,
    cell: (info) => <ChangeSummary before={info.row.original.before} after={info.row.original.after} />,
  }),
  column.accessor('reason', {
    header: 'Why',
    enableSorting: false,
    cell: (info) => <span className="block max-w-xs min-w-48 break-words">{info.getValue() || '—'}</span>,
  }),
]);

/** The audit events of one page (paged on the server), newest first. */
export function AuditTable({ page, params, busy }: { page: ListPage<AuditEventView>; params: ListParams; busy: boolean }) {
  const table = useServerListTable({ columns, page, params, getRowId: (event) => String(event.id) });
  return (
    <div className="space-y-3">
      <DataTable table={table} caption="Audit events, newest first" busy={busy} empty={<EmptyState title="No events match these filters" />} />
      <TablePager table={table} noun="events" />
    </div>
  );
}
