import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { can } from '@schema/permissions';
import { useExposureGroupChoices } from '@frontend/features/exposure-groups/api/get-exposure-groups';
import { useWorker } from '@frontend/features/workers/api/get-worker';
import { useArchiveWorker } from '@frontend/features/workers/api/update-worker';
import { WorkerForm } from '@frontend/features/workers/components/worker-form';
import { WorkerMemberships } from '@frontend/features/workers/components/worker-memberships';
import { WorkerName } from '@frontend/features/workers/components/worker-name';
import { ArchiveToggle } from '@frontend/components/archive-toggle';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { ArchivedBadge } from '@frontend/components/status-badge';
import { formatDate } from '@frontend/lib/format';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/workers/:workerId — one worker and their group memberships over time. */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const { workerId = '' } = useParams();
  const canEdit = useCanEdit();
  const canSeeNames = can(membership.role, 'workerNames:read');
  const worker = useWorker(organizationId, workerId);
  const groups = useExposureGroupChoices(organizationId);
  const archive = useArchiveWorker(organizationId);
  const [editing, setEditing] = useState(false);

  return (
    <>
      <DocumentTitle title={`${worker.data?.code ?? 'Worker'} · ${membership.organizationName}`} />
      <QueryState query={worker} loading="Loading the worker…" errorTitle="Could not load the worker">
        {(data) => (
          <>
            <PageHeader
              eyebrow={
                <Link to={`/orgs/${encodeURIComponent(organizationId)}/workers`} className="underline">
                  Workers
                </Link>
              }
              title={data.code}
              description={data.jobTitle || 'No job title recorded'}
              actions={
                canEdit && (
                  <>
                    {!data.archived && <Button onClick={() => setEditing(true)}>Edit</Button>}
                    <ArchiveToggle
                      size="md"
                      archived={data.archived}
                      name={data.code}
                      what="worker"
                      consequence="The worker is left out of new sampling plan draws and pick lists; memberships and results stay."
                      onChange={(archived, reason) => archive.mutateAsync({ workerId: data.id, archived, reason })}
                    />
                  </>
                )
              }
            />
            <dl className="card mb-6 grid gap-x-6 gap-y-3 px-4 py-3 text-sm sm:grid-cols-4">
              <div>
                <dt className="text-xs font-medium text-slate-500 uppercase">Code</dt>
                <dd className="font-medium tabular-nums">{data.code}</dd>
              </div>
              <div>
                <dt className="text-xs font-medium text-slate-500 uppercase">Name</dt>
                <dd>{canSeeNames ? <WorkerName worker={data} /> : <span className="text-slate-500">Not shared with your role</span>}</dd>
              </div>
              {canSeeNames && (
                <div>
                  <dt className="text-xs font-medium text-slate-500 uppercase">E-mail (for letters)</dt>
                  <dd className="break-all">{data.email ? data.email : <span className="text-slate-500">None recorded</span>}</dd>
                </div>
              )}
              <div>
                <dt className="text-xs font-medium text-slate-500 uppercase">Status</dt>
                <dd>
                  <ArchivedBadge archived={data.archived} />
                </dd>
              </div>
              <div>
                <dt className="text-xs font-medium text-slate-500 uppercase">Added</dt>
                <dd className="tabular-nums">{formatDate(data.createdAt)}</dd>
              </div>
            </dl>
            <WorkerMemberships
              organizationId={organizationId}
              worker={data}
              canEdit={canEdit}
              groupChoices={groups.data?.items.map((group) => ({ id: group.id, label: `${group.name} (${group.siteName})` }))}
            />
            <Dialog open={editing} onClose={() => setEditing(false)} title="Edit worker">
              <WorkerForm
                organizationId={organizationId}
                canSeeNames={canSeeNames}
                worker={data}
                onCancel={() => setEditing(false)}
                onSaved={() => setEditing(false)}
              />
            </Dialog>
          </>
        )}
      </QueryState>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
