import { Link, useParams } from 'react-router';
import { can } from '@schema/permissions';
import { useWorkerLetters } from '@frontend/features/worker-letters/api/get-worker-letters';
import { WorkerLettersPanel } from '@frontend/features/worker-letters/components/worker-letters-panel';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

/**
 * /orgs/:orgId/exposure-groups/:groupId/worker-letters — letters to workers whose results are at or
 * above the action level: draft, preview, e-mail or hand over, cancel. Letters name the worker, so
 * only roles that may see names open this page; only roles that edit data change letters.
 */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const { groupId = '' } = useParams();
  const canEdit = useCanEdit();
  const canSeeNames = can(membership.role, 'workerNames:read');
  const letters = useWorkerLetters(organizationId, groupId, canSeeNames);
  const groupPath = `/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${encodeURIComponent(groupId)}`;

  if (!canSeeNames) {
    return (
      <Notice tone="warning" title="Worker letters name the worker">
        Your role may not see worker names, so it cannot open worker letters.
      </Notice>
    );
  }
  return (
    <>
      <DocumentTitle title={`Worker letters · ${letters.data?.group.name ?? 'Exposure group'} · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={
          <Link to={groupPath} className="underline">
            {letters.data?.group.name ?? 'Exposure group'}
          </Link>
        }
        title="Worker letters"
        description="A plain-language letter to each worker whose result is at or above the action level: their result, what it means, what happens next, and the duty it serves."
      />
      <QueryState query={letters} loading="Loading the letters…" errorTitle="Could not load the worker letters">
        {(data) => <WorkerLettersPanel organizationId={organizationId} data={data} canEdit={canEdit} />}
      </QueryState>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
