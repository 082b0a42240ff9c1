import { useNavigate, useParams, useSearchParams } from 'react-router';
import { assessmentQuery } from '@schema/assessment';
import { useCreateDecisionDraft } from '@frontend/features/decision-records/api/create-decision-draft';
import { useDecisionProposal } from '@frontend/features/decision-records/api/get-decision-proposal';
import { DraftForm } from '@frontend/features/decision-records/components/draft-form';
import { KeyFigures } from '@frontend/features/decision-records/components/key-figures';
import { CautionNote } from '@frontend/components/caution-note';
import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { ErrorState, LoadingState } from '@frontend/components/states';
import { formatCalendarDate } from '@frontend/lib/format';
import { useMembership } from '../use-membership';

/**
 * /orgs/:orgId/exposure-groups/:groupId/decisions/new[?exclude=ids] — draft a decision record. The results
 * left out on the assessment page (what-if, `?exclude=`) come along and each needs a reason; the page shows
 * the figures approval would freeze now and the proposed review date with its source.
 */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const { groupId = '' } = useParams();
  const [search] = useSearchParams();
  const parsed = assessmentQuery.safeParse({ exclude: search.get('exclude') ?? undefined });
  const exclude = parsed.success ? parsed.data.exclude : [];
  const proposal = useDecisionProposal(organizationId, groupId, exclude);
  const create = useCreateDecisionDraft(organizationId, groupId);
  const navigate = useNavigate();
  const base = `/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${encodeURIComponent(groupId)}`;

  return (
    <>
      <DocumentTitle title="Draft a decision record" />
      <PageHeader
        eyebrow="Decision records"
        title="Draft a decision record"
        description="An analyst who did not draft it approves it or returns it with a comment. Approval freezes the data and figures shown here."
      />
      {proposal.isPending && <LoadingState label="Computing the figures this draft starts from…" />}
      {proposal.isError && <ErrorState title="Could not compute the figures for a draft" error={proposal.error} onRetry={() => proposal.refetch()} />}
      {proposal.data && (
        <div className="grid gap-5 lg:grid-cols-[1fr_22rem]">
          <DraftForm
            proposal={proposal.data}
            exclusions={exclude.map((resultId) => ({ resultId, reason: '' }))}
            submitLabel="Submit for review"
            onCancel={() => navigate(`${base}/decisions`)}
            onSubmit={async (values) => {
              const record = await create.mutateAsync(values);
              navigate(`/orgs/${encodeURIComponent(organizationId)}/decision-records/${record.id}`);
            }}
          />
          <aside className="space-y-4">
            <div className="rounded-md border border-slate-200 bg-white p-3">
              <KeyFigures figures={proposal.data} caption="Figures approval would freeze now" />
              <p className="mt-2 text-xs text-slate-600">
                Data hash <code className="break-all">{proposal.data.dataHash.slice(0, 16)}…</code> · results left out:{' '}
                {proposal.data.excludedIds.length === 0 ? 'none' : proposal.data.excludedIds.join(', ')}
              </p>
            </div>
            <div className="rounded-md border border-slate-200 bg-white p-3 text-sm">
              <p className="text-xs font-medium tracking-wide text-slate-500 uppercase">Proposed review date</p>
              <p className="mt-1 font-medium">{formatCalendarDate(proposal.data.reviewDate)}</p>
              <p className="mt-1 text-slate-600">{proposal.data.reviewDateSource}</p>
            </div>
            <CautionNote />
          </aside>
        </div>
      )}
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
