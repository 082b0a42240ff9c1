import { useState } from 'react';
import { Link } from 'react-router';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { Notice } from '@frontend/components/notice';
import { EmptyState } from '@frontend/components/states';
import type { WorkerMembership } from '@frontend/lib/api-types';
import { formatCalendarDate } from '@frontend/lib/format';
import type { WorkerDetail } from '../api/get-worker';
import { MembershipActions } from './membership-actions';
import { MembershipForm } from './membership-form';
import { MembershipStatus } from './membership-status';

/** A worker's group memberships over time, oldest first, with add, end and date changes for editors. */
export function WorkerMemberships({
  organizationId,
  worker,
  groupChoices,
  canEdit,
}: {
  organizationId: string;
  worker: WorkerDetail;
  /** Groups in use to choose from (loaded by the page). */
  groupChoices: ReadonlyArray<{ id: number; label: string }> | undefined;
  canEdit: boolean;
}) {
  const [adding, setAdding] = useState(false);
  const [outcome, setOutcome] = useState<string | null>(null);
  const base = `/orgs/${encodeURIComponent(organizationId)}`;
  const memberships: WorkerMembership[] = worker.memberships;

  return (
    <section aria-labelledby="memberships-title" className="space-y-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id="memberships-title" className="text-base">
          Group memberships over time
        </h2>
        {canEdit && !worker.archived && (
          <Button onClick={() => setAdding(true)} disabled={!groupChoices}>
            Add to a group
          </Button>
        )}
      </div>
      {outcome && <Notice tone="success">{outcome}</Notice>}
      {memberships.length === 0 ? (
        <EmptyState title="In no group yet">{canEdit ? 'Add the worker to a group with “Add to a group”.' : undefined}</EmptyState>
      ) : (
        <div className="card overflow-x-auto">
          <table className="table-dense w-full">
            <caption className="sr-only">Group memberships of {worker.code}, oldest first</caption>
            <thead>
              <tr>
                <th scope="col">Exposure group</th>
                <th scope="col">From</th>
                <th scope="col">To</th>
                <th scope="col">Status</th>
                {canEdit && (
                  <th scope="col">
                    <span className="sr-only">Actions</span>
                  </th>
                )}
              </tr>
            </thead>
            <tbody>
              {memberships.map((period) => (
                <tr key={period.id} className={period.current ? undefined : 'text-slate-500'}>
                  <td>
                    <Link to={`${base}/exposure-groups/${period.exposureGroupId}`} className="font-medium">
                      {period.groupName}
                    </Link>
                  </td>
                  <td className="tabular-nums">{formatCalendarDate(period.fromDate)}</td>
                  <td className="tabular-nums">{period.toDate ? formatCalendarDate(period.toDate) : 'still a member'}</td>
                  <td>
                    <MembershipStatus period={period} />
                  </td>
                  {canEdit && (
                    <td>
                      <MembershipActions organizationId={organizationId} period={period} who={`${worker.code} in ${period.groupName}`} onDone={setOutcome} />
                    </td>
                  )}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <Dialog open={adding} onClose={() => setAdding(false)} title="Add to a group" description={`${worker.code}, from a date.`}>
        <MembershipForm
          organizationId={organizationId}
          fixed={{ workerId: worker.id }}
          choiceLabel="Exposure group"
          choices={groupChoices ?? []}
          onCancel={() => setAdding(false)}
          onSaved={(membership) => {
            setOutcome(`${worker.code} is a member of “${membership.groupName}” from ${formatCalendarDate(membership.fromDate)}.`);
            setAdding(false);
          }}
        />
      </Dialog>
    </section>
  );
}
