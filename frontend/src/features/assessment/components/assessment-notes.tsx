import { CautionNote, cautionText } from '@frontend/components/caution-note';
import type { GroupAssessmentResponse } from '../api/get-assessment';

/** The hearing conservation trigger (action level) of a noise group, shown wherever its results are shown. */
export function HearingConservation({ note }: { note: NonNullable<GroupAssessmentResponse['hearingConservation']> }) {
  return (
    <aside aria-labelledby="hearing-title" className="rounded-md border border-primary-200 bg-primary-50/70 px-4 py-3 text-sm text-primary-900">
      <h2 id="hearing-title" className="text-sm text-primary-900">
        Hearing conservation
      </h2>
      <p className="mt-1" data-testid="hearing-conservation">
        {note.statement}
      </p>
    </aside>
  );
}

/** The cautions PRODUCT.md asks for on assessment pages, and any caution the server adds for this group (e.g. results in dB(A)). */
export function AssessmentCautions({ cautions }: Pick<GroupAssessmentResponse, 'cautions'>) {
  // The two general cautions are in CautionNote; anything else the server adds is shown as well.
  const extra = cautions.filter((caution) => caution !== cautionText.judgement && caution !== cautionText.regulations);
  return (
    <div className="space-y-2">
      <CautionNote />
      {extra.map((caution) => (
        <p key={caution} className="rounded-md border border-amber-300/80 bg-amber-50/70 px-4 py-2 text-sm text-amber-950">
          {caution}
        </p>
      ))}
    </div>
  );
}

/** How the figures were made: methods with sources, settings, versions and the data hash. */
export function MethodsAndSettings({ assessment }: { assessment: GroupAssessmentResponse }) {
  const { classical, bayes, betweenWorker, planner, settings, engineVersion, data } = assessment;
  return (
    <details className="card px-4 py-3 text-sm">
      <summary className="cursor-pointer font-semibold text-slate-800">Methods, settings and versions</summary>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-slate-700">
        {classical.methods.map((method) => (
          <li key={method}>{method}</li>
        ))}
        {bayes && <li>Bayesian view: {bayes.method}.</li>}
        {betweenWorker && <li>Between-worker analysis: {betweenWorker.method}.</li>}
        {planner && <li>Sample planner: {planner.method}.</li>}
      </ul>
      <dl className="mt-3 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-xs text-slate-600">
        <dt>Seed</dt>
        <dd>{settings.seed}</dd>
        <dt>Bayesian threshold</dt>
        <dd>
          unacceptable when P(P95 &gt; OEL) ≥ {settings.unacceptableThreshold} (
          {settings.unacceptableThresholdSource === 'organization' ? "the organization's setting" : 'the default'})
        </dd>
        <dt>Markov chains</dt>
        <dd>
          {settings.mcmc.chains} × {settings.mcmc.kept.toLocaleString('en-GB')} after {settings.mcmc.burnIn.toLocaleString('en-GB')} burn-in
        </dd>
        <dt>Versions</dt>
        <dd>
          Bellwether {engineVersion.application}, statistics engine {engineVersion.statistics}
        </dd>
        <dt>Data hash</dt>
        <dd className="font-mono break-all">{data.dataHash}</dd>
      </dl>
    </details>
  );
}
