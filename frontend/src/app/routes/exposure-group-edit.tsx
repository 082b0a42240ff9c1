import { useParams, type LoaderFunctionArgs } from 'react-router';
import { useExposureGroup } from '@frontend/features/exposure-groups/api/get-exposure-group';
import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { GroupFormPage } from '../group-form-page';
import { requirePermission } from '../session';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/exposure-groups/:groupId/edit — hygienists and admins (data:edit). */
export async function loader(args: LoaderFunctionArgs) {
  return requirePermission(args, 'data:edit');
}

export function Component() {
  const membership = useMembership();
  const { groupId = '' } = useParams();
  const group = useExposureGroup(membership.organizationKey, groupId);
  return (
    <>
      <DocumentTitle title={`Edit ${group.data?.name ?? 'exposure group'} · ${membership.organizationName}`} />
      <PageHeader eyebrow={group.data?.siteName ?? 'Exposure group'} title={group.data ? `Edit “${group.data.name}”` : 'Edit exposure group'} />
      <QueryState query={group} loading="Loading the group…" errorTitle="Could not load the group">
        {(data) => <GroupFormPage group={data} />}
      </QueryState>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
