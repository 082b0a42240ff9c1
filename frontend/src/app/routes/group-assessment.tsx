import { Link, useParams } from 'react-router';
import { priorNames, type PriorName } from '@schema/assessment';
import { can } from '@schema/permissions';
import { assessmentRefusal, useAssessment, type GroupAssessmentResponse } from '@frontend/features/assessment/api/get-assessment';
import { AssessmentSummary } from '@frontend/features/assessment/components/assessment-summary';
import { AssessmentCautions, HearingConservation, MethodsAndSettings } from '@frontend/features/assessment/components/assessment-notes';
import { BayesianPanel } from '@frontend/features/assessment/components/bayesian-panel';
import { BetweenWorkerPanel } from '@frontend/features/assessment/components/between-worker-panel';
import { ChartsSection } from '@frontend/features/assessment/components/charts-section';
import { ClassicalPanel } from '@frontend/features/assessment/components/classical-panel';
import { FitAndMethodNotes } from '@frontend/features/assessment/components/fit-and-method-notes';
import { PlannerPanel } from '@frontend/features/assessment/components/planner-panel';
import { RefusalPanel } from '@frontend/features/assessment/components/refusal-panel';
import { allResults, ResultsTable } from '@frontend/features/assessment/components/results-table';
import { WhatIfChanges } from '@frontend/features/assessment/components/what-if-changes';
import { formatWithUnit } from '@frontend/features/assessment/lib/format-figure';
import { useAssessmentVariant } from '@frontend/features/assessment/lib/use-assessment-variant';
import { Button } from '@frontend/components/button';
import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { ErrorState, LoadingState } from '@frontend/components/states';
import { isApiError } from '@frontend/lib/api-client';
import { useMembership } from '../use-membership';

const priorLabels: Record<PriorName, string> = {
  reference: 'Reference prior (default)',
  'gsd-informative': 'Informative prior on the GSD',
};

/**
 * /orgs/:orgId/exposure-groups/:groupId/assessment — the group's assessment: category, judgement and
 * sentence; the classical and Bayesian views side by side; charts; between-worker analysis; sample
 * planner; and the results with "leave out" boxes (what-if, kept in `?exclude=`; stored data unchanged).
 */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const { groupId = '' } = useParams();
  const canRun = can(membership.role, 'stats:run');
  const { variant, setLeftOut, clearExclusions, setPrior } = useAssessmentVariant();
  const whatIf = variant.exclude.length > 0;

  const current = useAssessment(organizationId, groupId, variant);
  const baseline = useAssessment(organizationId, groupId, { exclude: [], prior: variant.prior }, { enabled: whatIf });
  // Previous figures stay on screen while new ones compute, but never another group's.
  const assessment = current.data && String(current.data.group.id) === groupId ? current.data : undefined;
  const refusal = assessmentRefusal(current.error);
  const recomputing = current.isFetching && current.isPlaceholderData;

  const context = assessment ?? refusal;
  const group = context?.group;
  const results = context ? allResults(context.data.results, context.data.excluded) : [];

  return (
    <>
      <DocumentTitle title={group ? `Assessment · ${group.name}` : 'Assessment'} />
      <PageHeader
        eyebrow={group ? `Assessment · ${group.siteName} · ${group.agent.name}` : 'Assessment'}
        title={group?.name ?? 'Group assessment'}
        description={
          group && (
            <>
              Judged against the OEL of <strong className="font-medium text-slate-800">{formatWithUnit(group.oel, group.oelUnit)}</strong>.{' '}
              {group.oel !== group.baseOel && <>{group.oelStatement} </>}
              Source: {group.oelSource}
            </>
          )
        }
        actions={
          <>
            {canRun && (
              <label className="flex items-center gap-2 text-sm text-slate-700">
                Bayesian prior
                <select className="input w-auto py-1" value={variant.prior} onChange={(event) => setPrior(event.target.value as PriorName)}>
                  {priorNames.map((name) => (
                    <option key={name} value={name}>
                      {priorLabels[name]}
                    </option>
                  ))}
                </select>
              </label>
            )}
            <Link to={`/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${encodeURIComponent(groupId)}`} className="text-sm">
              Group page
            </Link>
            {/* Decision records (issue 7): the what-if exclusions travel to the draft, which asks a reason for each. */}
            <Link to={`/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${encodeURIComponent(groupId)}/decisions`} className="text-sm">
              Decision records
            </Link>
            {can(membership.role, 'decision:draft') && (
              <Link
                to={`/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${encodeURIComponent(groupId)}/decisions/new${whatIf ? `?exclude=${variant.exclude.join(',')}` : ''}`}
                className="text-sm font-medium"
              >
                Draft a decision record
              </Link>
            )}
          </>
        }
      />

      <p role="status" className="sr-only">
        {recomputing ? 'Recomputing the assessment…' : assessment ? 'Assessment up to date.' : ''}
      </p>
      {recomputing && (
        <p aria-hidden="true" className="mb-3 rounded border border-slate-200 bg-white px-3 py-1.5 text-sm text-slate-600">
          Recomputing with your changes… the figures below are the previous ones until then.
        </p>
      )}

      <div className="space-y-5">
        {whatIf && (
          <WhatIfChanges
            baseline={baseline.data ?? null}
            current={assessment && !recomputing ? assessment : null}
            leftOut={variant.exclude.length}
            onClear={clearExclusions}
          />
        )}

        {!context && current.isPending && (
          <LoadingState label="Computing the assessment… the Bayesian view and the sample planner take a moment the first time." />
        )}
        {!context && current.isError && <ErrorState title="Could not compute the assessment" error={current.error} onRetry={() => current.refetch()} />}
        {!context && isApiError(current.error, 400) && whatIf && (
          <Button size="sm" onClick={clearExclusions}>
            Put every result back
          </Button>
        )}

        {refusal && <RefusalPanel refusal={refusal} />}
        {refusal?.hearingConservation && <HearingConservation note={refusal.hearingConservation} />}
        {assessment && <AssessmentBody assessment={assessment} dimmed={recomputing} />}

        {context && (
          <section aria-labelledby="results-title">
            <h2 id="results-title" className="text-base">
              Results
            </h2>
            <p className="mt-0.5 mb-2 text-sm text-slate-600">
              {canRun
                ? 'Tick “leave out” to see the figures without a result (for example a suspected outlier). The stored results do not change; the results left out are saved with a decision draft.'
                : 'The valid shift results the assessment uses.'}
            </p>
            <ResultsTable results={results} leftOut={variant.exclude} unit={context.group.oelUnit} canLeaveOut={canRun} onLeaveOut={setLeftOut} />
          </section>
        )}

        {assessment && <MethodsAndSettings assessment={assessment} />}
        {context && <AssessmentCautions cautions={context.cautions} />}
      </div>
    </>
  );
}

function AssessmentBody({ assessment, dimmed }: { assessment: GroupAssessmentResponse; dimmed: boolean }) {
  return (
    <div className={`space-y-5 transition-opacity ${dimmed ? 'opacity-60' : ''}`} aria-busy={dimmed}>
      <AssessmentSummary assessment={assessment} />
      {assessment.hearingConservation && <HearingConservation note={assessment.hearingConservation} />}
      <FitAndMethodNotes assessment={assessment} />
      <div className="grid gap-4 lg:grid-cols-2">
        <ClassicalPanel assessment={assessment} />
        <BayesianPanel assessment={assessment} />
      </div>
      <ChartsSection assessment={assessment} />
      <div className="grid gap-4 lg:grid-cols-2">
        <BetweenWorkerPanel assessment={assessment} />
        <PlannerPanel assessment={assessment} />
      </div>
    </div>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
