import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ListPage } from '@schema/list-query';
import { DataTable, TablePager, useServerListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { EmptyState } from '@frontend/components/states';
import { StatusBadge } from '@frontend/components/status-badge';
import { formatDateTime } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import type { ImportBatchSummary } from '../api/types';

const column = createColumnHelper<ListTableFeatures, ImportBatchSummary>();

/** Earlier lab files, newest first: imported ones with their result count, others still waiting for a mapping. */
export function LabImportsTable({
  organizationId,
  page,
  params,
  busy,
}: {
  organizationId: string;
  page: ListPage<ImportBatchSummary>;
  params: ListParams;
  busy: boolean;
}) {
  const columns = useMemo(
    () =>
      column.columns([
        column.accessor('fileName', {
          header: 'File',
          enableSorting: false,
          cell: (info) => (
            <Link to={`/orgs/${encodeURIComponent(organizationId)}/lab-imports/${info.row.original.id}`} className="font-medium break-all">
              {info.getValue()}
            </Link>
          ),
        }),
        column.accessor('createdAt', {
          header: 'Uploaded',
          enableSorting: false,
          cell: (info) => <span className="tabular-nums">{formatDateTime(info.getValue())}</span>,
        }),
        column.accessor('rowCount', { header: 'Rows', enableSorting: false, cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
        column.accessor('status', {
          header: 'Status',
          enableSorting: false,
          cell: (info) =>
            info.getValue() === 'committed' ? (
              <StatusBadge tone="positive">Imported: {info.row.original.resultCount} results</StatusBadge>
            ) : (
              <StatusBadge tone="neutral">Not imported</StatusBadge>
            ),
        }),
      ]),
    [organizationId],
  );
  const table = useServerListTable({ columns, page, params, getRowId: (batch) => String(batch.id) });
  return (
    <div className="space-y-3">
      <DataTable table={table} caption="Lab files, newest first" busy={busy} empty={<EmptyState title={params.q ? 'No file matches' : 'No lab files yet'} />} />
      <TablePager table={table} noun="files" />
    </div>
  );
}
