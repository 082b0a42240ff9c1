import type { LoaderFunctionArgs } from 'react-router';
import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { GroupFormPage } from '../group-form-page';
import { requirePermission } from '../session';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/exposure-groups/new — hygienists and admins (data:edit). */
export async function loader(args: LoaderFunctionArgs) {
  return requirePermission(args, 'data:edit');
}

export function Component() {
  const membership = useMembership();
  return (
    <>
      <DocumentTitle title={`New exposure group · ${membership.organizationName}`} />
      <PageHeader
        eyebrow="Exposure groups"
        title="New exposure group"
        description="Workers whose tasks, processes and controls give them a similar exposure to one agent, judged against one limit."
      />
      <GroupFormPage />
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
