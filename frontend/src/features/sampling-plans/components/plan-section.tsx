import { useState } from 'react';
import { ArchiveToggle } from '@frontend/components/archive-toggle';
import { Button, ButtonLink } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { Notice } from '@frontend/components/notice';
import { EmptyState } from '@frontend/components/states';
import { StatusBadge } from '@frontend/components/status-badge';
import type { PlanSummary, PlanView, SamplingGuidance as Guidance } from '@frontend/lib/api-types';
import { formatCalendarDate } from '@frontend/lib/format';
import { useArchiveSamplingPlan } from '../api/update-sampling-plan';
import { PlanForm } from './plan-form';
import { PlanPicks } from './plan-picks';
import { PlanProgress } from './plan-progress';
import { RedrawForm } from './redraw-form';
import { SamplingGuidance } from './sampling-guidance';

function planName(plan: PlanSummary): string {
  return plan.title || `Plan of ${formatCalendarDate(plan.createdAt)}`;
}

/**
 * The group's sampling plan: target and guidance, the window, the seed and draw that make the
 * picks reproducible, progress, the picks, and the printable field sheet. Editors draw a plan,
 * change it, redraw it with a new seed, or archive it; earlier plans are listed below.
 */
export function PlanSection({
  organizationId,
  group,
  plan,
  plans,
  guidance,
  canEdit,
  canSeeNames,
}: {
  organizationId: string;
  group: { id: number; name: string; archived: boolean };
  plan: PlanView | null;
  plans: PlanSummary[];
  guidance: Guidance;
  canEdit: boolean;
  canSeeNames: boolean;
}) {
  const [dialog, setDialog] = useState<'new' | 'edit' | 'redraw' | null>(null);
  const [outcome, setOutcome] = useState<string | null>(null);
  const archive = useArchiveSamplingPlan(organizationId);
  const others = plans.filter((other) => other.id !== plan?.id);
  const base = `/orgs/${encodeURIComponent(organizationId)}`;
  const editable = canEdit && !group.archived;

  return (
    <section aria-labelledby="plan-title" className="space-y-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 id="plan-title" className="text-base">
            Sampling plan
          </h2>
          <p className="text-sm text-slate-600">Worker-shifts picked at random across the window, reproducible from the stored seed.</p>
        </div>
        <div className="flex flex-wrap gap-2">
          {plan && <ButtonLink to={`${base}/sampling-plans/${plan.id}/field-sheet`}>Field sheet</ButtonLink>}
          {plan && editable && (
            <>
              <Button onClick={() => setDialog('edit')}>Change plan</Button>
              <Button onClick={() => setDialog('redraw')}>Redraw</Button>
            </>
          )}
          {editable && (
            <Button variant={plan ? 'secondary' : 'primary'} onClick={() => setDialog('new')}>
              {plan ? 'New plan' : 'Plan sampling'}
            </Button>
          )}
        </div>
      </div>
      {outcome && <Notice tone="success">{outcome}</Notice>}

      {plan ? (
        <div className="card space-y-4 p-4">
          <div className="flex flex-wrap items-start justify-between gap-3">
            <dl className="grid flex-1 gap-x-6 gap-y-2 text-sm sm:grid-cols-2 lg:grid-cols-4">
              <div>
                <dt className="text-xs font-medium text-slate-500 uppercase">Plan</dt>
                <dd className="font-medium">{planName(plan)}</dd>
              </div>
              <div>
                <dt className="text-xs font-medium text-slate-500 uppercase">Window</dt>
                <dd className="tabular-nums">
                  {formatCalendarDate(plan.startDate)} – {formatCalendarDate(plan.endDate)}
                  <span className="block text-xs text-slate-600">{plan.includeWeekends ? 'every day' : 'weekdays only'}</span>
                </dd>
              </div>
              <div>
                <dt className="text-xs font-medium text-slate-500 uppercase">Target</dt>
                <dd className="tabular-nums">
                  {plan.targetCount} shifts <span className="block text-xs text-slate-600">of {plan.availableShifts} worker-shifts available</span>
                </dd>
              </div>
              <div>
                <dt className="text-xs font-medium text-slate-500 uppercase">Seed</dt>
                <dd className="tabular-nums" data-testid="plan-seed">
                  {plan.seed} <span className="block text-xs text-slate-600">draw {plan.draw}</span>
                </dd>
              </div>
            </dl>
            {editable && (
              <ArchiveToggle
                archived={plan.archived}
                name={planName(plan)}
                what="sampling plan"
                consequence="The plan and its picks stay, listed under earlier plans; the group then shows its newest plan in use, if any."
                onChange={(archived, reason) => archive.mutateAsync({ planId: plan.id, archived, reason })}
              />
            )}
          </div>
          <PlanProgress progress={plan.progress} />
          {plan.warnings.map((warning) => (
            <Notice key={warning} tone="warning">
              {warning}
            </Notice>
          ))}
          {plan.notes && <p className="text-sm whitespace-pre-line text-slate-700">{plan.notes}</p>}
          <PlanPicks organizationId={organizationId} picks={plan.picks} canSeeNames={canSeeNames} />
        </div>
      ) : (
        <EmptyState title="No sampling plan yet">
          <div className="mx-auto max-w-2xl space-y-2 text-left">
            <SamplingGuidance guidance={guidance} />
            {!canEdit && <p className="text-center">A hygienist plans the sampling.</p>}
          </div>
        </EmptyState>
      )}

      {others.length > 0 && (
        <details className="card px-4 py-2 text-sm">
          <summary className="cursor-pointer font-medium text-slate-800">Earlier plans ({others.length})</summary>
          <ul className="mt-2 divide-y divide-slate-100">
            {others.map((other) => (
              <li key={other.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <span>
                  <span className="font-medium">{planName(other)}</span>
                  <span className="text-slate-600 tabular-nums">
                    {' '}
                    · {formatCalendarDate(other.startDate)} – {formatCalendarDate(other.endDate)} · {other.progress.done} of {other.targetCount} measured · seed{' '}
                    {other.seed}
                  </span>
                  {other.archived && (
                    <>
                      {' '}
                      <StatusBadge tone="muted">Archived</StatusBadge>
                    </>
                  )}
                </span>
                <span className="flex gap-1.5">
                  <ButtonLink size="sm" to={`${base}/sampling-plans/${other.id}/field-sheet`} aria-label={`Field sheet of ${planName(other)}`}>
                    Field sheet
                  </ButtonLink>
                  {editable && (
                    <ArchiveToggle
                      archived={other.archived}
                      name={planName(other)}
                      what="sampling plan"
                      consequence="The plan and its picks stay, listed here."
                      onChange={(archived, reason) => archive.mutateAsync({ planId: other.id, archived, reason })}
                    />
                  )}
                </span>
              </li>
            ))}
          </ul>
        </details>
      )}

      <Dialog
        open={dialog === 'new' || dialog === 'edit'}
        onClose={() => setDialog(null)}
        title={dialog === 'edit' ? 'Change the sampling plan' : 'Plan sampling'}
        description={group.name}
        wide
      >
        <PlanForm
          organizationId={organizationId}
          groupId={group.id}
          plan={dialog === 'edit' && plan ? plan : undefined}
          guidance={guidance}
          onCancel={() => setDialog(null)}
          onSaved={(saved) => {
            setOutcome(`${dialog === 'edit' ? 'Plan saved' : 'Plan drawn'}: ${saved.picks.length} worker-shifts picked with seed ${saved.seed}.`);
            setDialog(null);
          }}
        />
      </Dialog>
      <Dialog
        open={dialog === 'redraw'}
        onClose={() => setDialog(null)}
        title="Redraw the picks"
        description="The plan keeps its target and window; a new seed picks other worker-shifts. The earlier draw is kept."
      >
        {plan && (
          <RedrawForm
            organizationId={organizationId}
            plan={plan}
            onCancel={() => setDialog(null)}
            onSaved={(saved) => {
              setOutcome(`Redrawn with seed ${saved.seed} (draw ${saved.draw}).`);
              setDialog(null);
            }}
          />
        )}
      </Dialog>
    </section>
  );
}
