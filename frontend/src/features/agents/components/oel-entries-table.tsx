import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { averagingTimeLabels, exposureUnitLabels } from '@schema/agents';
import type { ListPage } from '@schema/list-query';
import { DataTable, TablePager, useServerListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { RecordActions } from '@frontend/components/record-actions';
import { EmptyState } from '@frontend/components/states';
import { ArchivedBadge } from '@frontend/components/status-badge';
import { formatNumber } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import type { OelEntryView } from '../api/get-oel-entries';
import { useArchiveOelEntry } from '../api/update-oel-entry';

const column = createColumnHelper<ListTableFeatures, OelEntryView>();

/** The organization's OEL list: agent × source × value × unit × averaging time. */
export function OelEntriesTable({
  organizationId,
  page,
  params,
  busy,
  canEdit,
  onEdit,
  onOutcome,
}: {
  organizationId: string;
  page: ListPage<OelEntryView>;
  params: ListParams;
  busy: boolean;
  canEdit: boolean;
  onOutcome: (message: string) => void;
  onEdit: (entry: OelEntryView) => void;
}) {
  const archive = useArchiveOelEntry(organizationId);
  const columns = useMemo(
    () =>
      column.columns([
        column.accessor('agentName', { header: 'Agent', cell: (info) => <span className="font-medium text-slate-900">{info.getValue()}</span> }),
        column.accessor('source', { header: 'Source', cell: (info) => <span className="block max-w-sm text-slate-700">{info.getValue()}</span> }),
        column.accessor('value', {
          header: 'Limit',
          cell: (info) => <span className="font-medium whitespace-nowrap tabular-nums">{formatNumber(info.getValue(), 6)}</span>,
        }),
        column.accessor('unit', { header: 'Unit', cell: (info) => exposureUnitLabels[info.getValue()] }),
        column.accessor('averagingTime', { header: 'Averaging time', cell: (info) => averagingTimeLabels[info.getValue()] }),
        column.accessor('archived', { header: 'Status', enableSorting: false, cell: (info) => <ArchivedBadge archived={info.getValue()} /> }),
        ...(canEdit
          ? [
              column.display({
                id: 'actions',
                header: () => <span className="sr-only">Actions</span>,
                cell: (info) => {
                  const entry = info.row.original;
                  const name = `${entry.agentName}, ${formatNumber(entry.value, 6)} ${exposureUnitLabels[entry.unit]} (${entry.source})`;
                  return (
                    <RecordActions
                      name={name}
                      what="limit"
                      archived={entry.archived}
                      consequence="It leaves the list offered when setting up a group; groups that took this limit keep their copy."
                      onDone={onOutcome}
                      onEdit={() => onEdit(entry)}
                      onArchive={(archived, reason) => archive.mutateAsync({ entryId: entry.id, archived, reason })}
                    />
                  );
                },
              }),
            ]
          : []),
      ]),
    [canEdit, onEdit, onOutcome, archive.mutateAsync],
  );
  const table = useServerListTable({ columns, page, params, getRowId: (entry) => String(entry.id) });
  const filtered = Boolean(params.q || params.filter('archived') || params.filter('agentId'));
  return (
    <div className="space-y-3">
      <DataTable
        table={table}
        caption="OEL list"
        busy={busy}
        rowClassName={(entry) => (entry.archived ? 'bg-slate-50/60 text-slate-500' : undefined)}
        empty={
          <EmptyState title={filtered ? 'No limit matches' : 'No limits yet'}>
            {filtered ? 'Clear the search or the filters.' : canEdit ? 'Add the limits your organization uses with “Add limit”.' : 'A hygienist adds limits here.'}
          </EmptyState>
        }
      />
      <TablePager table={table} noun="limits" />
    </div>
  );
}
