import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { noiseInstrumentLabels, noiseStrategyLabels, type NoiseEstimateView } from '@schema/noise-estimates';
import { useExposureGroup } from '@frontend/features/exposure-groups/api/get-exposure-group';
import { useNoiseEstimates } from '@frontend/features/noise-estimates/api/get-noise-estimates';
import { useArchiveNoiseEstimate } from '@frontend/features/noise-estimates/api/save-noise-estimate';
import { EstimateFigures } from '@frontend/features/noise-estimates/components/estimate-figures';
import { EstimateForm } from '@frontend/features/noise-estimates/components/estimate-form';
import { Button } from '@frontend/components/button';
import { CautionNote } from '@frontend/components/caution-note';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

/** Which estimate the form is open for: none, a new one, or an existing one by id. */
type Editing = null | 'new' | number;

function EstimateCard({ estimate, canEdit, onEdit, onArchive }: { estimate: NoiseEstimateView; canEdit: boolean; onEdit: () => void; onArchive: () => void }) {
  const headingId = `estimate-${estimate.id}-title`;
  return (
    <article aria-labelledby={headingId} className="space-y-3 rounded-lg border border-slate-200 bg-white p-4" data-testid="noise-estimate">
      <header className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <h2 id={headingId} className="text-base font-semibold text-slate-900">
            {estimate.title || noiseStrategyLabels[estimate.strategy]}
          </h2>
          <p className="text-xs text-slate-600">
            {noiseStrategyLabels[estimate.strategy]} · {noiseInstrumentLabels[estimate.instrument]} · entered by {estimate.createdBy ?? 'the demo seed'} on{' '}
            {estimate.createdAt.slice(0, 10)}
          </p>
        </div>
        {canEdit && (
          <div className="flex gap-2">
            <Button size="sm" onClick={onEdit}>
              Change inputs
            </Button>
            <Button size="sm" variant="ghost" onClick={onArchive}>
              Archive
            </Button>
          </div>
        )}
      </header>
      {estimate.figures ? (
        <EstimateFigures figures={estimate.figures} headingId={headingId} />
      ) : (
        <Notice tone="error" title="No figures">
          {estimate.figuresError}
        </Notice>
      )}
      {estimate.notes && <p className="text-sm text-slate-700">Notes: {estimate.notes}</p>}
    </article>
  );
}

/**
 * /orgs/:orgId/exposure-groups/:groupId/noise-estimates — ISO 9612:2009 estimates of a noise
 * group: task-based, job-based or full-day, with LEX,8h, its expanded uncertainty, the budget and
 * the comparison of LEX,8h + U with the action and limit values in force.
 */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const { groupId = '' } = useParams();
  const canEdit = useCanEdit();
  const group = useExposureGroup(organizationId, groupId);
  const estimates = useNoiseEstimates(organizationId, groupId);
  const archive = useArchiveNoiseEstimate(organizationId);
  const [editing, setEditing] = useState<Editing>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const base = `/orgs/${encodeURIComponent(organizationId)}`;
  const groupName = group.data?.name ?? 'Exposure group';

  return (
    <>
      <DocumentTitle title={`Noise estimate (ISO 9612) · ${groupName} · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={
          <>
            <Link to={`${base}/exposure-groups`} className="underline">
              Exposure groups
            </Link>{' '}
            ·{' '}
            <Link to={`${base}/exposure-groups/${encodeURIComponent(groupId)}`} className="underline">
              {groupName}
            </Link>
          </>
        }
        title="Noise estimate (ISO 9612)"
        description="LEX,8h of the group by the task-based, job-based or full-day strategy of ISO 9612:2009, with its expanded uncertainty U and the comparison of LEX,8h + U with the values in force."
        actions={
          canEdit && editing === null ? (
            <Button variant="primary" onClick={() => setEditing('new')}>
              New estimate
            </Button>
          ) : undefined
        }
      />
      <div className="space-y-6">
        <CautionNote />
        <aside aria-labelledby="hearing-title" className="rounded-md border border-primary-200 bg-primary-50/70 px-4 py-3 text-sm text-primary-900">
          <h2 id="hearing-title" className="text-sm font-semibold">
            Hearing conservation
          </h2>
          <p className="mt-1" data-testid="hearing-conservation">
            The hearing conservation trigger is an 8-hour TWA of 85 dB(A), or a 50 % dose under the OSHA criteria (OSHA 29 CFR 1910.95(c)(1)); in the EU, the
            upper exposure action value of 85 dB(A) (Directive 2003/10/EC). A LEX,8h + U at or above it means hearing conservation applies unless the regulation
            that applies to you says otherwise.
          </p>
        </aside>
        <p className="text-xs text-slate-600" data-testid="method-note">
          Method: ISO 9612:2009 clauses 9–11 and Annex C; U = 1.65·u (one-sided 95 %). For the job-based and full-day strategies the sampling term c1·u1 is
          computed from Land’s exact limit for a lognormal mean, not read from the printed Table C.4; it reproduces the standard’s Annex E and F results to 0.1
          dB. LEX,8h + U is compared with each value, the cautious reading.
        </p>
        {saved && <Notice tone="success">{saved}</Notice>}
        {editing !== null && (
          <section aria-labelledby="estimate-form-title" className="rounded-lg border border-primary-200 bg-white p-4">
            <h2 id="estimate-form-title" className="mb-3 text-base font-semibold text-slate-900">
              {editing === 'new' ? 'New estimate' : 'Change the estimate’s inputs'}
            </h2>
            <EstimateForm
              organizationId={organizationId}
              groupId={Number(groupId)}
              estimate={editing === 'new' ? null : (estimates.data?.find((estimate) => estimate.id === editing) ?? null)}
              onSaved={(estimate) => {
                setEditing(null);
                setSaved(`Saved “${estimate.title || noiseStrategyLabels[estimate.strategy]}”: its figures are below.`);
              }}
              onCancel={() => setEditing(null)}
            />
          </section>
        )}
        <QueryState query={estimates} loading="Loading the estimates…" errorTitle="Could not load the estimates">
          {(list) =>
            list.length === 0 ? (
              <p className="text-sm text-slate-700">No ISO 9612 estimate for this group yet.</p>
            ) : (
              <div className="space-y-4">
                {list.map((estimate) => (
                  <EstimateCard
                    key={estimate.id}
                    estimate={estimate}
                    canEdit={canEdit}
                    onEdit={() => {
                      setSaved(null);
                      setEditing(estimate.id);
                    }}
                    onArchive={() => archive.mutate({ estimateId: estimate.id, archived: true })}
                  />
                ))}
              </div>
            )
          }
        </QueryState>
      </div>
    </>
  );
}
