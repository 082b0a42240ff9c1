import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { ListPage } from '@schema/list-query';
import { DataTable, TablePager, useServerListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { RecordActions } from '@frontend/components/record-actions';
import { EmptyState } from '@frontend/components/states';
import { ArchivedBadge } from '@frontend/components/status-badge';
import { formatDate } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import type { SiteView } from '../api/get-sites';
import { useArchiveSite } from '../api/update-site';

const column = createColumnHelper<ListTableFeatures, SiteView>();

/** The sites list: sort by name or last change, page through; edit and archive for editors. */
export function SitesTable({
  organizationId,
  page,
  params,
  busy,
  canEdit,
  onEdit,
  onOutcome,
}: {
  organizationId: string;
  page: ListPage<SiteView>;
  params: ListParams;
  busy: boolean;
  canEdit: boolean;
  onOutcome: (message: string) => void;
  onEdit: (site: SiteView) => void;
}) {
  const archive = useArchiveSite(organizationId);
  const columns = useMemo(
    () =>
      column.columns([
        column.accessor('name', { header: 'Name', cell: (info) => <span className="font-medium text-slate-900">{info.getValue()}</span> }),
        column.accessor('description', {
          header: 'Description',
          enableSorting: false,
          cell: (info) => <span className="line-clamp-2 max-w-md text-slate-700">{info.getValue() || '—'}</span>,
        }),
        column.accessor('exposureGroupCount', {
          header: 'Groups in use',
          enableSorting: false,
          cell: (info) => <span className="tabular-nums">{info.getValue()}</span>,
        }),
        column.accessor('archived', {
          header: 'Status',
          enableSorting: false,
          cell: (info) => <ArchivedBadge archived={info.getValue()} />,
        }),
        column.accessor('updatedAt', { header: 'Changed', cell: (info) => <span className="text-slate-600 tabular-nums">{formatDate(info.getValue())}</span> }),
        ...(canEdit
          ? [
              column.display({
                id: 'actions',
                header: () => <span className="sr-only">Actions</span>,
                cell: (info) => {
                  const site = info.row.original;
                  return (
                    <RecordActions
                      name={site.name}
                      what="site"
                      archived={site.archived}
                      consequence="It leaves the pick lists; its exposure groups and their results stay. A site with groups in use cannot be archived."
                      onDone={onOutcome}
                      onEdit={() => onEdit(site)}
                      onArchive={(archived, reason) => archive.mutateAsync({ siteId: site.id, archived, reason })}
                    />
                  );
                },
              }),
            ]
          : []),
      ]),
    [canEdit, onEdit, onOutcome, archive.mutateAsync],
  );
  const table = useServerListTable({ columns, page, params, getRowId: (site) => String(site.id) });

  return (
    <div className="space-y-3">
      <DataTable
        table={table}
        caption="Sites"
        busy={busy}
        rowClassName={(site) => (site.archived ? 'bg-slate-50/60 text-slate-500' : undefined)}
        empty={
          <EmptyState title={params.q || params.filter('archived') ? 'No site matches' : 'No sites yet'}>
            {params.q || params.filter('archived') ? 'Clear the search or show other sites.' : canEdit ? 'Add the first site with “Add site”.' : 'A hygienist adds sites here.'}
          </EmptyState>
        }
      />
      <TablePager table={table} noun="sites" />
    </div>
  );
}
