import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router';
import type { DecisionRecordListItem } from '@schema/decision-records';
import type { ListPage } from '@schema/list-query';
import { CategoryBadge } from '@frontend/components/category-badge';
import { DataTable, TablePager, useServerListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { EmptyState } from '@frontend/components/states';
import { formatCalendarDate, formatDate } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import { DecisionJudgement, DecisionStatusBadge, OutOfDateMarker } from './decision-badges';

const column = createColumnHelper<ListTableFeatures, DecisionRecordListItem>();

/** The filters of the register page, so an empty page can say whether they hid every record. */
export const decisionRegisterFilters = ['status', 'category', 'judgement', 'siteId', 'outOfDate', 'reviewBy'] as const;

/** Every decision record of an organization, sorted and paged by the server; the group name opens the record. */
export function DecisionRegisterTable({
  organizationId,
  page,
  params,
  busy,
}: {
  organizationId: string;
  page: ListPage<DecisionRecordListItem>;
  params: ListParams;
  busy: boolean;
}) {
  const columns = useMemo(
    () =>
      column.columns([
        column.accessor('exposureGroupName', {
          header: 'Exposure group',
          cell: (info) => {
            const record = info.row.original;
            return (
              <span className="flex flex-col gap-0.5">
                <Link to={`/orgs/${encodeURIComponent(organizationId)}/decision-records/${record.id}`} className="font-medium">
                  {record.exposureGroupName}
                </Link>
                <span className="text-xs text-slate-500">Record {record.id}</span>
              </span>
            );
          },
        }),
        column.accessor('siteName', { header: 'Site', cell: (info) => <span className="text-slate-700">{info.getValue()}</span> }),
        column.accessor('status', {
          header: 'Status',
          cell: (info) => (
            <span className="flex flex-wrap gap-1">
              <DecisionStatusBadge status={info.getValue()} />
              {info.row.original.outOfDate && <OutOfDateMarker />}
            </span>
          ),
        }),
        column.accessor('category', { header: 'Category', cell: (info) => <CategoryBadge category={info.getValue()} /> }),
        column.accessor('judgement', { header: 'Judgement', enableSorting: false, cell: (info) => <DecisionJudgement judgement={info.getValue()} /> }),
        column.accessor('reviewDate', {
          header: 'Review date',
          cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatCalendarDate(info.getValue())}</span>,
        }),
        column.accessor('approvedAt', {
          header: 'Approved',
          cell: (info) => {
            const { approver } = info.row.original;
            if (!approver) return <span className="text-slate-500">Not yet</span>;
            return (
              <span className="flex flex-col">
                <span className="whitespace-nowrap tabular-nums">{formatDate(info.getValue())}</span>
                <span className="text-xs text-slate-500">{approver.name}</span>
              </span>
            );
          },
        }),
        column.accessor((record) => record.drafter.name, {
          id: 'drafter',
          header: 'Drafted by',
          enableSorting: false,
          cell: (info) => (
            <span className="flex flex-col">
              {info.getValue()}
              <span className="text-xs whitespace-nowrap text-slate-500 tabular-nums">{formatDate(info.row.original.submittedAt)}</span>
            </span>
          ),
        }),
      ]),
    [organizationId],
  );
  const table = useServerListTable({ columns, page, params, getRowId: (record) => String(record.id) });
  const filtered = Boolean(params.q || decisionRegisterFilters.some((name) => params.filter(name)));
  return (
    <div className="space-y-3">
      <DataTable
        table={table}
        caption="Decision records"
        busy={busy}
        rowClassName={(record) => (record.status === 'superseded' ? 'text-slate-500' : record.outOfDate ? 'bg-amber-50/50' : undefined)}
        empty={
          <EmptyState title={filtered ? 'No decision record matches' : 'No decision records yet'}>
            {filtered
              ? 'The search or the filters hide every record: clear them to see the whole register.'
              : 'A hygienist drafts the first record from an exposure group’s decisions page; it appears here once drafted.'}
          </EmptyState>
        }
      />
      <TablePager table={table} noun="records" />
    </div>
  );
}
