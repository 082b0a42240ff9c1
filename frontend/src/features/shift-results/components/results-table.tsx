import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { ListPage } from '@schema/list-query';
import { Button } from '@frontend/components/button';
import { DataTable, TablePager, useServerListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { EmptyState } from '@frontend/components/states';
import { StatusBadge } from '@frontend/components/status-badge';
import type { ShiftResultView } from '@frontend/lib/api-types';
import { formatCalendarDate, formatNumber } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import { ResultValue, sourceLabels } from './result-value';

const column = createColumnHelper<ListTableFeatures, ShiftResultView>();

function sampleText(result: ShiftResultView): string {
  const parts: string[] = [];
  if (result.sampleId) parts.push(result.sampleId);
  if (result.startTime && result.endTime) parts.push(`${result.startTime.slice(-5)}–${result.endTime.slice(-5)}`);
  if (result.sampledMinutes !== null) parts.push(`${formatNumber(result.sampledMinutes, 4)} min`);
  if (result.lab) parts.push(result.lab);
  return parts.join(' · ');
}

/**
 * Shift results, sorted, filtered and paged by the server. Void results stay in the list, struck
 * through and marked with their reason. Details open the statement of how each result was reached.
 */
export function ResultsTable({
  page,
  params,
  busy,
  canEdit,
  canSeeNames,
  filtered,
  onDetails,
  onChangeStatus,
}: {
  page: ListPage<ShiftResultView>;
  params: ListParams;
  busy: boolean;
  canEdit: boolean;
  canSeeNames: boolean;
  filtered: boolean;
  onDetails: (result: ShiftResultView) => void;
  onChangeStatus: (result: ShiftResultView) => void;
}) {
  const columns = useMemo(
    () =>
      column.columns([
        column.accessor('date', {
          header: 'Date',
          cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatCalendarDate(info.getValue())}</span>,
        }),
        column.accessor((result) => result.worker.code, {
          id: 'workerCode',
          header: 'Worker',
          cell: (info) => {
            const worker = info.row.original.worker;
            return (
              <span className="whitespace-nowrap">
                <span className="font-medium tabular-nums">{worker.code}</span>
                {canSeeNames && worker.name && <span className="block text-xs text-slate-600">{worker.name}</span>}
              </span>
            );
          },
        }),
        column.accessor('value', {
          header: 'Result',
          cell: (info) => (
            <span className={info.row.original.status === 'void' ? 'line-through decoration-slate-400' : undefined}>
              <ResultValue result={info.row.original} />
            </span>
          ),
        }),
        column.accessor('source', { header: 'Source', cell: (info) => sourceLabels[info.getValue()] }),
        column.display({
          id: 'sample',
          header: 'Sample',
          cell: (info) => <span className="text-xs text-slate-600">{sampleText(info.row.original) || '—'}</span>,
        }),
        column.accessor('status', {
          header: 'Status',
          cell: (info) =>
            info.getValue() === 'valid' ? (
              <StatusBadge tone="positive">Valid</StatusBadge>
            ) : (
              <span className="block max-w-xs">
                <StatusBadge tone="void">Void</StatusBadge>
                <span className="mt-0.5 block text-xs text-slate-600">{info.row.original.voidReason}</span>
              </span>
            ),
        }),
        column.display({
          id: 'actions',
          header: () => <span className="sr-only">Actions</span>,
          cell: (info) => {
            const result = info.row.original;
            const what = `result of ${result.worker.code} on ${result.date}`;
            return (
              <div className="flex justify-end gap-1.5">
                <Button size="sm" variant="ghost" aria-label={`Details of the ${what}`} onClick={() => onDetails(result)}>
                  Details
                </Button>
                {canEdit &&
                  (result.status === 'valid' ? (
                    <Button size="sm" variant="danger" aria-label={`Void the ${what}`} onClick={() => onChangeStatus(result)}>
                      Void
                    </Button>
                  ) : (
                    <Button size="sm" aria-label={`Restore the ${what}`} onClick={() => onChangeStatus(result)}>
                      Restore
                    </Button>
                  ))}
              </div>
            );
          },
        }),
      ]),
    [canEdit, canSeeNames, onDetails, onChangeStatus],
  );
  const table = useServerListTable({ columns, page, params, getRowId: (result) => String(result.id) });
  return (
    <div className="space-y-3">
      <DataTable
        table={table}
        caption="Shift results"
        busy={busy}
        rowClassName={(result) => (result.status === 'void' ? 'bg-red-50/40 text-slate-500' : undefined)}
        empty={
          <EmptyState title={filtered ? 'No result matches' : 'No results yet'}>
            {filtered
              ? 'Clear the search or the filters.'
              : canEdit
                ? 'Enter a result, or import a lab file.'
                : 'Results appear here as they are entered or imported.'}
          </EmptyState>
        }
      />
      <TablePager table={table} noun="results" />
    </div>
  );
}
