import { Link, useParams } from 'react-router';
import { useFieldSheet } from '@frontend/features/sampling-plans/api/get-field-sheet';
import { FieldSheet } from '@frontend/features/sampling-plans/components/field-sheet';
import { DocumentTitle } from '@frontend/components/document-title';
import { QueryState } from '@frontend/components/query-state';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/sampling-plans/:planId/field-sheet — the printable sheet (every role may read and print it). */
export function Component() {
  const membership = useMembership();
  const { planId = '' } = useParams();
  const sheet = useFieldSheet(membership.organizationKey, planId);
  return (
    <>
      <DocumentTitle title={`Field sheet · ${sheet.data?.group.name ?? 'Sampling plan'}`} />
      {sheet.data && (
        <p className="no-print mb-3 text-sm print:hidden">
          <Link to={`/orgs/${encodeURIComponent(membership.organizationKey)}/exposure-groups/${sheet.data.group.id}#plan-title`}>
            ← Back to {sheet.data.group.name}
          </Link>
        </p>
      )}
      <QueryState query={sheet} loading="Loading the field sheet…" errorTitle="Could not load the field sheet">
        {(data) => <FieldSheet sheet={data} />}
      </QueryState>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
