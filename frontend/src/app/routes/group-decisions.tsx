import { Link, useParams } from 'react-router';
import { can } from '@schema/permissions';
import { useGroupDecisions } from '@frontend/features/decision-records/api/get-group-decisions';
import { DecisionHistory } from '@frontend/features/decision-records/components/decision-history';
import { DecisionList } from '@frontend/features/decision-records/components/decision-list';
import { ButtonLink } from '@frontend/components/button';
import { CautionNote } from '@frontend/components/caution-note';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { EmptyState, ErrorState, LoadingState } from '@frontend/components/states';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/exposure-groups/:groupId/decisions — the group's decision records, what changed between approvals, and a new draft when due. */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const { groupId = '' } = useParams();
  const decisions = useGroupDecisions(organizationId, groupId);
  const canDraft = can(membership.role, 'decision:draft');
  const base = `/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${encodeURIComponent(groupId)}`;
  const data = decisions.data;
  const open = data?.records.find((record) => record.status === 'draft' || record.status === 'returned');

  return (
    <>
      <DocumentTitle title={data ? `Decision records · ${data.group.name}` : 'Decision records'} />
      <PageHeader
        eyebrow="Decision records"
        title={data?.group.name ?? 'Decision records'}
        actions={
          <>
            <Link to={`${base}/assessment`} className="text-sm">
              Assessment
            </Link>
            {canDraft && data && !open && (
              <ButtonLink to={`${base}/decisions/new`} variant="primary">
                Draft a decision record
              </ButtonLink>
            )}
          </>
        }
      />
      {decisions.isPending && <LoadingState label="Loading the decision records…" />}
      {decisions.isError && <ErrorState title="Could not load the decision records" error={decisions.error} onRetry={() => decisions.refetch()} />}
      {data && (
        <div className="space-y-5">
          {data.offerNewDraft && (
            <Notice tone="warning" title="A new decision record is due">
              {data.offerReason} {canDraft ? 'Use “Draft a decision record” above.' : 'A hygienist drafts it.'}
            </Notice>
          )}
          {open && (
            <Notice tone="info" title={open.status === 'returned' ? 'A draft was returned to its drafter' : 'A draft is waiting for review'}>
              <Link to={`/orgs/${encodeURIComponent(organizationId)}/decision-records/${open.id}`}>Open record {open.id}</Link>
            </Notice>
          )}
          <section aria-labelledby="records-title">
            <h2 id="records-title" className="mb-2 text-base">
              Records
            </h2>
            {data.records.length === 0 ? (
              <EmptyState title="No decision records yet">
                A hygienist drafts one from the group's assessment; an analyst who did not draft it approves it.
              </EmptyState>
            ) : (
              <DecisionList organizationId={organizationId} records={data.records} caption={`Decision records of ${data.group.name}`} />
            )}
          </section>
          <section aria-labelledby="history-title">
            <h2 id="history-title" className="mb-2 text-base">
              What changed between approved records
            </h2>
            <DecisionHistory organizationId={organizationId} history={data.history} />
          </section>
          <CautionNote />
        </div>
      )}
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
