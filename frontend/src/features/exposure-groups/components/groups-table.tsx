import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ListPage } from '@schema/list-query';
import { DataTable, TablePager, useServerListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { EmptyState } from '@frontend/components/states';
import { StatusBadge } from '@frontend/components/status-badge';
import type { ExposureGroupView } from '@frontend/lib/api-types';
import { formatDate, formatNumber } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import { OelText } from './oel-text';

const column = createColumnHelper<ListTableFeatures, ExposureGroupView>();

/** Exposure groups, sorted and paged by the server; the name opens the group's page. */
export function GroupsTable({
  organizationId,
  page,
  params,
  busy,
  canEdit,
}: {
  organizationId: string;
  page: ListPage<ExposureGroupView>;
  params: ListParams;
  busy: boolean;
  canEdit: boolean;
}) {
  const columns = useMemo(
    () =>
      column.columns([
        column.accessor('name', {
          header: 'Group',
          cell: (info) => {
            const group = info.row.original;
            return (
              <span className="flex flex-wrap items-center gap-1.5">
                <Link to={`/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${group.id}`} className="font-medium">
                  {group.name}
                </Link>
                {group.archived && <StatusBadge tone="muted">Archived</StatusBadge>}
              </span>
            );
          },
        }),
        column.accessor('siteName', { header: 'Site', cell: (info) => <span className="text-slate-700">{info.getValue()}</span> }),
        column.accessor('agentName', { header: 'Agent', cell: (info) => <span className="text-slate-700">{info.getValue()}</span> }),
        column.accessor('processArea', { header: 'Process or area', cell: (info) => <span className="text-slate-700">{info.getValue() || '—'}</span> }),
        column.display({ id: 'oel', header: 'OEL', cell: (info) => <OelText effective={info.row.original.effectiveOel} /> }),
        column.accessor('shiftHours', { header: 'Shift', cell: (info) => <span className="tabular-nums">{formatNumber(info.getValue())} h</span> }),
        column.accessor('memberCount', { header: 'Members', enableSorting: false, cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
        column.accessor('validResultCount', {
          header: 'Results',
          enableSorting: false,
          cell: (info) => (
            <span className="tabular-nums">
              {info.getValue()}
              {info.row.original.voidResultCount > 0 && <span className="text-slate-500"> + {info.row.original.voidResultCount} void</span>}
            </span>
          ),
        }),
        column.accessor('resultsChangedAt', {
          header: 'Results changed',
          cell: (info) => <span className="text-slate-600 tabular-nums">{info.getValue() ? formatDate(info.getValue()) : '—'}</span>,
        }),
      ]),
    [organizationId],
  );
  const table = useServerListTable({ columns, page, params, getRowId: (group) => String(group.id) });
  const filtered = Boolean(params.q || params.filter('archived') || params.filter('siteId') || params.filter('agentId'));
  return (
    <div className="space-y-3">
      <DataTable
        table={table}
        caption="Exposure groups"
        busy={busy}
        rowClassName={(group) => (group.archived ? 'bg-slate-50/60 text-slate-500' : undefined)}
        empty={
          <EmptyState title={filtered ? 'No group matches' : 'No exposure groups yet'}>
            {filtered ? 'Clear the search or the filters.' : canEdit ? 'Set up the first group with “New exposure group”.' : 'A hygienist sets up groups here.'}
          </EmptyState>
        }
      />
      <TablePager table={table} noun="groups" />
    </div>
  );
}
