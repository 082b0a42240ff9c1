import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ListPage } from '@schema/list-query';
import { DataTable, TablePager, useServerListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { RecordActions } from '@frontend/components/record-actions';
import { EmptyState } from '@frontend/components/states';
import { ArchivedBadge } from '@frontend/components/status-badge';
import type { ListParams } from '@frontend/lib/list-params';
import type { WorkerListItem } from '../api/get-workers';
import { useArchiveWorker } from '../api/update-worker';
import { WorkerName } from './worker-name';

const column = createColumnHelper<ListTableFeatures, WorkerListItem>();

/** Workers by code; names only for roles that may see them (the column is left out otherwise). */
export function WorkersTable({
  organizationId,
  page,
  params,
  busy,
  canEdit,
  canSeeNames,
  onEdit,
  onOutcome,
}: {
  organizationId: string;
  page: ListPage<WorkerListItem>;
  params: ListParams;
  busy: boolean;
  canEdit: boolean;
  canSeeNames: boolean;
  onOutcome: (message: string) => void;
  onEdit: (worker: WorkerListItem) => void;
}) {
  const archive = useArchiveWorker(organizationId);
  const base = `/orgs/${encodeURIComponent(organizationId)}`;
  const columns = useMemo(
    () =>
      column.columns([
        column.accessor('code', {
          header: 'Code',
          cell: (info) => (
            <Link to={`${base}/workers/${info.row.original.id}`} className="font-medium tabular-nums">
              {info.getValue()}
            </Link>
          ),
        }),
        ...(canSeeNames ? [column.display({ id: 'name', header: 'Name', enableSorting: true, cell: (info) => <WorkerName worker={info.row.original} /> })] : []),
        column.accessor('jobTitle', { header: 'Job title', cell: (info) => <span className="text-slate-700">{info.getValue() || '—'}</span> }),
        column.accessor('currentGroups', {
          header: 'Groups today',
          enableSorting: false,
          cell: (info) =>
            info.getValue().length === 0 ? (
              <span className="text-slate-400">none</span>
            ) : (
              <ul className="flex flex-wrap gap-x-3 gap-y-0.5">
                {info.getValue().map((group) => (
                  <li key={group.id}>
                    <Link to={`${base}/exposure-groups/${group.id}`}>{group.name}</Link>
                  </li>
                ))}
              </ul>
            ),
        }),
        column.accessor('archived', { header: 'Status', enableSorting: false, cell: (info) => <ArchivedBadge archived={info.getValue()} /> }),
        ...(canEdit
          ? [
              column.display({
                id: 'actions',
                header: () => <span className="sr-only">Actions</span>,
                cell: (info) => {
                  const worker = info.row.original;
                  return (
                    <RecordActions
                      name={worker.code}
                      what="worker"
                      archived={worker.archived}
                      consequence="The worker is left out of new sampling plan draws and pick lists; memberships and results stay."
                      onDone={onOutcome}
                      onEdit={() => onEdit(worker)}
                      onArchive={(archived, reason) => archive.mutateAsync({ workerId: worker.id, archived, reason })}
                    />
                  );
                },
              }),
            ]
          : []),
      ]),
    [base, canEdit, canSeeNames, onEdit, onOutcome, archive.mutateAsync],
  );
  const table = useServerListTable({ columns, page, params, getRowId: (worker) => String(worker.id) });
  const filtered = Boolean(params.q || params.filter('archived') || params.filter('groupId'));
  return (
    <div className="space-y-3">
      <DataTable
        table={table}
        caption="Workers"
        busy={busy}
        rowClassName={(worker) => (worker.archived ? 'bg-slate-50/60 text-slate-500' : undefined)}
        empty={
          <EmptyState title={filtered ? 'No worker matches' : 'No workers yet'}>
            {filtered ? 'Clear the search or the filters.' : canEdit ? 'Add workers with “Add worker”, then put them in groups.' : 'A hygienist adds workers here.'}
          </EmptyState>
        }
      />
      <TablePager table={table} noun="workers" />
    </div>
  );
}
