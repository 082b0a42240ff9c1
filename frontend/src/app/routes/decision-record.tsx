import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { can } from '@schema/permissions';
import { useDecisionProposal } from '@frontend/features/decision-records/api/get-decision-proposal';
import { useDecisionRecord } from '@frontend/features/decision-records/api/get-decision-record';
import { useReviewDecision } from '@frontend/features/decision-records/api/review-decision';
import { useUpdateDecisionDraft } from '@frontend/features/decision-records/api/update-decision-draft';
import { DecisionJudgement, DecisionStatusBadge, OutOfDateMarker } from '@frontend/features/decision-records/components/decision-badges';
import { DraftForm } from '@frontend/features/decision-records/components/draft-form';
import { EvidencePackLinks } from '@frontend/features/decision-records/components/evidence-pack-links';
import { FrozenDetails } from '@frontend/features/decision-records/components/frozen-details';
import { KeyFigures } from '@frontend/features/decision-records/components/key-figures';
import { AcknowledgePanel, CommentsPanel, ReviewPanel } from '@frontend/features/decision-records/components/review-panel';
import { Button, ButtonLink } from '@frontend/components/button';
import { CategoryBadge } from '@frontend/components/category-badge';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { ErrorState, LoadingState } from '@frontend/components/states';
import { formatCalendarDate, formatDateTime } from '@frontend/lib/format';
import { useSession } from '../session';
import { useMembership } from '../use-membership';

/**
 * /orgs/:orgId/decision-records/:recordId — one decision record: category, judgement, rationale, actions and
 * review date; for a draft, the figures approval would freeze now and the analyst's review; for an approved
 * record, the frozen figures, hash, versions and settings, approvals and acknowledgements; comments; cautions.
 */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const me = useSession();
  const { recordId = '' } = useParams();
  const query = useDecisionRecord(organizationId, recordId);
  const record = query.data;
  const review = useReviewDecision(organizationId, Number(recordId));
  const update = useUpdateDecisionDraft(organizationId, Number(recordId));
  const [editing, setEditing] = useState(false);
  const open = record?.status === 'draft' || record?.status === 'returned';
  // Only roles that run statistics may compute a draft's figures (the proposal endpoint needs stats:run).
  const canRun = can(membership.role, 'stats:run');
  const pending = useDecisionProposal(
    organizationId,
    String(record?.exposureGroupId ?? ''),
    record?.exclusions.map((exclusion) => exclusion.resultId) ?? [],
    Boolean(open && canRun),
  );
  const live = open && canRun ? pending : null;
  const isDrafter = record?.drafter.id === me.user.id;
  const groupBase = record ? `/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${record.exposureGroupId}` : '';
  const run = (step: Parameters<typeof review.mutateAsync>[0]) => review.mutateAsync(step);

  return (
    <>
      <DocumentTitle title={record ? `Decision record ${record.id} · ${record.exposureGroupName}` : 'Decision record'} />
      <PageHeader
        eyebrow={record ? `Decision record ${record.id}` : 'Decision record'}
        title={record?.exposureGroupName ?? 'Decision record'}
        actions={
          record && (
            <>
              <Link to={`${groupBase}/decisions`} className="text-sm">
                All records of this group
              </Link>
              <Link to={`${groupBase}/assessment`} className="text-sm">
                Assessment
              </Link>
            </>
          )
        }
      />
      {query.isPending && <LoadingState label="Loading the decision record…" />}
      {query.isError && <ErrorState title="Could not load the decision record" error={query.error} onRetry={() => query.refetch()} />}
      {record && (
        <div className="space-y-5">
          {record.outOfDate && (
            <Notice tone="warning" title="Out of date">
              The group's results changed after this record was approved (data version {record.dataVersionAtApproval} → {record.groupDataVersion}). The record
              stays as approved; a new record is due.{' '}
              {can(membership.role, 'decision:draft') && <Link to={`${groupBase}/decisions/new`}>Draft a new decision record</Link>}
            </Notice>
          )}
          {record.status === 'returned' && (
            <Notice tone="warning" title={`Returned by ${record.returnedBy?.name ?? 'an analyst'} on ${formatDateTime(record.returnedAt)}`}>
              {record.returnComment}
            </Notice>
          )}
          <section aria-labelledby="decision-title" className="grid gap-4 rounded-md border border-slate-200 bg-white p-4 md:grid-cols-[1fr_18rem]">
            <div className="space-y-3">
              <h2 id="decision-title" className="sr-only">
                The decision
              </h2>
              <div className="flex flex-wrap items-center gap-2" data-testid="record-summary">
                <DecisionStatusBadge status={record.status} />
                {record.outOfDate && <OutOfDateMarker />}
                <CategoryBadge category={record.category} />
                <DecisionJudgement judgement={record.judgement} />
              </div>
              <div>
                <h3 className="text-sm font-medium text-slate-800">Rationale</h3>
                <p className="mt-1 text-sm whitespace-pre-wrap">{record.rationale}</p>
              </div>
              <div>
                <h3 className="text-sm font-medium text-slate-800">Actions</h3>
                <p className="mt-1 text-sm whitespace-pre-wrap">{record.actions || '—'}</p>
              </div>
              {record.exclusions.length > 0 && !record.frozenInputs && (
                <div>
                  <h3 className="text-sm font-medium text-slate-800">Results left out</h3>
                  <ul className="mt-1 list-disc pl-5 text-sm">
                    {record.exclusions.map((exclusion) => (
                      <li key={exclusion.resultId}>
                        Result {exclusion.resultId}: {exclusion.reason}
                      </li>
                    ))}
                  </ul>
                </div>
              )}
            </div>
            <dl className="space-y-2 text-sm">
              <div>
                <dt className="text-xs text-slate-500">Review date</dt>
                <dd className="font-medium">{formatCalendarDate(record.reviewDate)}</dd>
                <dd className="text-xs text-slate-600">{record.reviewDateSource}</dd>
              </div>
              <div>
                <dt className="text-xs text-slate-500">Drafted by</dt>
                <dd>
                  {record.drafter.name} · {formatDateTime(record.submittedAt)}
                </dd>
              </div>
              <div>
                <dt className="text-xs text-slate-500">Approved by</dt>
                <dd>{record.approver ? `${record.approver.name} · ${formatDateTime(record.approvedAt)}` : 'Not yet approved'}</dd>
              </div>
            </dl>
          </section>

          {record.figures && (
            <section aria-labelledby="figures-title" className="rounded-md border border-slate-200 bg-white p-4">
              <h2 id="figures-title" className="sr-only">
                Frozen figures
              </h2>
              <KeyFigures
                caption="Figures frozen at approval"
                figures={{ ...record.figures.classical, oel: record.figures.group.oel, oelUnit: record.figures.group.oelUnit }}
              />
              <p className="mt-2 text-sm text-slate-700">{record.figures.classical.managerSentence}</p>
            </section>
          )}
          {live && live.data && (
            <section aria-labelledby="live-title" className="rounded-md border border-slate-200 bg-white p-4">
              <h2 id="live-title" className="sr-only">
                Figures approval would freeze
              </h2>
              <KeyFigures caption="Figures approval would freeze now" figures={live.data} />
            </section>
          )}
          {live?.isError && <ErrorState title="Could not compute the figures of this draft" error={live.error} />}

          {record.status === 'draft' && can(membership.role, 'decision:approve') && <ReviewPanel record={record} isDrafter={isDrafter} run={run} />}

          {open && isDrafter && can(membership.role, 'decision:draft') && (
            <section aria-labelledby="drafter-title" className="space-y-3 rounded-md border border-slate-200 bg-white p-4">
              <h2 id="drafter-title" className="text-base">
                Your draft
              </h2>
              {!editing && (
                <div className="flex flex-wrap gap-2">
                  <Button onClick={() => setEditing(true)}>Edit the draft</Button>
                  {record.status === 'returned' && (
                    <Button variant="primary" pending={review.isPending} onClick={() => run({ step: 'resubmit' })}>
                      Resubmit for review
                    </Button>
                  )}
                </div>
              )}
              {editing && (
                <DraftForm
                  proposal={null}
                  record={record}
                  exclusions={record.exclusions}
                  submitLabel="Save the draft"
                  onCancel={() => setEditing(false)}
                  onSubmit={async (values) => {
                    await update.mutateAsync({
                      category: values.category,
                      judgement: values.judgement,
                      rationale: values.rationale,
                      actions: values.actions,
                      reviewDate: values.reviewDate,
                      exclusions: values.exclusions,
                    });
                    setEditing(false);
                  }}
                />
              )}
            </section>
          )}

          {(record.status === 'approved' || record.status === 'superseded') && can(membership.role, 'evidence:export') && (
            <EvidencePackLinks organizationId={organizationId} recordId={record.id} />
          )}
          {record.frozenInputs && <FrozenDetails record={record} />}
          {(record.status === 'approved' || record.status === 'superseded') && (
            <AcknowledgePanel record={record} userId={me.user.id} canAcknowledge={can(membership.role, 'decision:acknowledge')} run={run} />
          )}
          <CommentsPanel record={record} canComment={can(membership.role, 'comment:write')} run={run} />
          {record.status === 'superseded' && <ButtonLink to={`${groupBase}/decisions`}>See the current record</ButtonLink>}

          <aside aria-labelledby="cautions-title" className="rounded-md border border-amber-300/80 bg-amber-50/70 px-4 py-3 text-sm text-amber-950">
            <h2 id="cautions-title" className="text-sm font-semibold">
              Read this record with care
            </h2>
            <ul className="mt-1 list-disc space-y-1 pl-5">
              {record.cautions.map((caution) => (
                <li key={caution}>{caution}</li>
              ))}
            </ul>
          </aside>
        </div>
      )}
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
