import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import { Button } from '@frontend/components/button';
import { DataTable, TablePager, useClientListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { Dialog } from '@frontend/components/dialog';
import { Notice } from '@frontend/components/notice';
import { EmptyState } from '@frontend/components/states';
import { StatusBadge } from '@frontend/components/status-badge';
import type { GroupMember } from '@frontend/lib/api-types';
import { formatCalendarDate } from '@frontend/lib/format';
import { useWorkerChoices } from '../api/get-workers';
import { MembershipActions } from './membership-actions';
import { MembershipForm } from './membership-form';
import { MembershipStatus } from './membership-status';
import { WorkerName, workerLabel } from './worker-name';

const column = createColumnHelper<ListTableFeatures, GroupMember>();

/**
 * A group's members over time: every period (current, ended, starting later) with its dates.
 * Editors add a worker from a date, end a period or correct its dates.
 */
export function GroupMembers({
  organizationId,
  group,
  members,
  canEdit,
  canSeeNames,
}: {
  organizationId: string;
  group: { id: number; name: string; archived: boolean };
  members: GroupMember[];
  canEdit: boolean;
  canSeeNames: boolean;
}) {
  const [adding, setAdding] = useState(false);
  const [outcome, setOutcome] = useState<string | null>(null);
  const workers = useWorkerChoices(organizationId);
  const base = `/orgs/${encodeURIComponent(organizationId)}`;

  const columns = useMemo(
    () =>
      column.columns([
        column.accessor((member) => member.worker.code, {
          id: 'worker',
          header: 'Worker',
          sortFn: 'alphanumeric',
          cell: (info) => (
            <span className="flex items-center gap-1.5">
              <Link to={`${base}/workers/${info.row.original.worker.id}`} className="font-medium tabular-nums">
                {info.getValue()}
              </Link>
              {info.row.original.worker.archived && <StatusBadge tone="muted">Archived</StatusBadge>}
            </span>
          ),
        }),
        ...(canSeeNames ? [column.display({ id: 'name', header: 'Name', cell: (info) => <WorkerName worker={info.row.original.worker} /> })] : []),
        column.accessor((member) => member.worker.jobTitle, {
          id: 'jobTitle',
          header: 'Job title',
          sortFn: 'alphanumeric',
          cell: (info) => info.getValue() || '—',
        }),
        column.accessor('fromDate', {
          header: 'From',
          sortFn: 'alphanumeric',
          cell: (info) => <span className="tabular-nums">{formatCalendarDate(info.getValue())}</span>,
        }),
        column.accessor((member) => member.toDate ?? '9999-12-31', {
          id: 'toDate',
          header: 'To',
          sortFn: 'alphanumeric',
          cell: (info) => <span className="tabular-nums">{info.row.original.toDate ? formatCalendarDate(info.row.original.toDate) : 'still a member'}</span>,
        }),
        column.display({ id: 'status', header: 'Status', cell: (info) => <MembershipStatus period={info.row.original} /> }),
        ...(canEdit
          ? [
              column.display({
                id: 'actions',
                header: () => <span className="sr-only">Actions</span>,
                cell: (info) => (
                  <MembershipActions
                    organizationId={organizationId}
                    period={info.row.original}
                    who={`${info.row.original.worker.code} in ${group.name}`}
                    onDone={setOutcome}
                  />
                ),
              }),
            ]
          : []),
      ]),
    [base, canEdit, canSeeNames, group.name, organizationId],
  );
  const table = useClientListTable({ columns, data: members, initialSorting: [{ id: 'worker', desc: false }], getRowId: (member) => String(member.id) });
  const currentCount = new Set(members.filter((member) => member.current).map((member) => member.worker.id)).size;

  return (
    <section aria-labelledby="members-title" className="space-y-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 id="members-title" className="text-base">
            Members over time
          </h2>
          <p className="text-sm text-slate-600">
            {currentCount} current member{currentCount === 1 ? '' : 's'}; a sampling plan draws from the workers who are members on each day.
          </p>
        </div>
        {canEdit && !group.archived && (
          <Button onClick={() => setAdding(true)} disabled={!workers.data}>
            Add member
          </Button>
        )}
      </div>
      {outcome && <Notice tone="success">{outcome}</Notice>}
      <DataTable
        table={table}
        caption={`Members of ${group.name} over time`}
        rowClassName={(member) => (member.current ? undefined : 'text-slate-500')}
        empty={
          <EmptyState title="No members yet">
            {canEdit ? 'Add the workers of this group with “Add member”.' : 'A hygienist adds the group’s workers.'}
          </EmptyState>
        }
      />
      {members.length > 25 && <TablePager table={table} noun="periods" />}
      <Dialog open={adding} onClose={() => setAdding(false)} title="Add a member" description={`To ${group.name}, from a date.`}>
        <MembershipForm
          organizationId={organizationId}
          fixed={{ exposureGroupId: group.id }}
          choiceLabel="Worker"
          choices={(workers.data?.items ?? []).map((worker) => ({ id: worker.id, label: workerLabel(worker) }))}
          onCancel={() => setAdding(false)}
          onSaved={(membership) => {
            const worker = workers.data?.items.find((candidate) => candidate.id === membership.workerId);
            setOutcome(`${worker?.code ?? 'The worker'} is a member from ${formatCalendarDate(membership.fromDate)}.`);
            setAdding(false);
          }}
        />
      </Dialog>
    </section>
  );
}
