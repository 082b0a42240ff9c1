import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ListPage } from '@schema/list-query';
import { ArchivableListTable, type ArchivableRecordKind } from '@frontend/components/archivable-list-table';
import type { ListTableFeatures } from '@frontend/components/data-table';
import type { ListParams } from '@frontend/lib/list-params';
import type { WorkerListItem } from '../api/get-workers';
import { useArchiveWorker } from '../api/update-worker';
import { WorkerName } from './worker-name';

const column = createColumnHelper<ListTableFeatures, WorkerListItem>();

/** Workers by code; names only for roles that may see them (the column is left out otherwise). */
export function WorkersTable({
  organizationId,
  canSeeNames,
  ...props
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
  const { mutateAsync } = useArchiveWorker(organizationId);
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
        ...(canSeeNames
          ? [column.display({ id: 'name', header: 'Name', enableSorting: true, cell: (info) => <WorkerName worker={info.row.original} /> })]
          : []),
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
      ]),
    [base, canSeeNames],
  );
  const kind = useMemo<ArchivableRecordKind<WorkerListItem>>(
    () => ({
      what: 'worker',
      plural: 'workers',
      consequence: 'The worker is left out of new sampling plan draws and pick lists; memberships and results stay.',
      nameOf: (worker) => worker.code,
      archive: (worker, archived, reason) => mutateAsync({ workerId: worker.id, archived, reason }),
      addHint: 'Add workers with “Add worker”, then put them in groups.',
      readerHint: 'A hygienist adds workers here.',
    }),
    [mutateAsync],
  );
  return <ArchivableListTable kind={kind} columns={columns} caption="Workers" filterKeys={['archived', 'groupId']} {...props} />;
}
