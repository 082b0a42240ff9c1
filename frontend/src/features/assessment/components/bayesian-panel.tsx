import type { ExposureUnit } from '@schema/agents';
import { CategoryBadge, exposureCategories } from '@frontend/components/category-badge';
import { Notice } from '@frontend/components/notice';
import type { GroupAssessmentResponse } from '../api/get-assessment';
import { formatFigure, formatProbability, formatShare } from '../lib/format-figure';
import { Figure } from './figure';
import { ColumnHeads, Panel } from './figure-table';
import { JudgementBadge } from './judgement-badge';

type View = NonNullable<GroupAssessmentResponse['bayes']>;
type Summary = View['gm'];

const priorNames: Record<View['prior']['name'], string> = {
  reference: 'Reference prior',
  'informative-gsd': 'Informative prior on the GSD',
  'past-data': 'Prior from past data',
  'previous-posterior': 'Prior from an earlier assessment',
};

function SummaryRow({ label, summary, unit, share = false }: { label: string; summary: Summary; unit?: ExposureUnit; share?: boolean }) {
  return (
    <tr>
      <th scope="row" className="py-1.5 pr-3 text-left font-normal text-slate-600">
        {label}
      </th>
      <td className="py-1.5 pr-3 font-medium">
        <Figure value={summary.median} unit={unit} share={share} />
      </td>
      <td className="py-1.5 pr-3 text-slate-700">
        <Figure value={summary.lower} share={share} /> – <Figure value={summary.upper} share={share} />
      </td>
      <td className="py-1.5 text-slate-700">
        <Figure value={summary.q95} share={share} />
      </td>
    </tr>
  );
}

/** The Bayesian view: posterior medians with 95 % credible limits, P(P95 > OEL) and judgement, category probabilities, prior and diagnostics. */
export function BayesianPanel({ assessment }: { assessment: GroupAssessmentResponse }) {
  const { bayes, group, unavailable } = assessment;
  if (!bayes) {
    return (
      <Panel id="bayesian-title" title="Bayesian view">
        <p className="text-sm text-slate-700">The Bayesian view is not available for these data: {unavailable.bayes ?? 'no reason given'}.</p>
      </Panel>
    );
  }
  const unit = group.oelUnit;
  const d = bayes.diagnostics;
  const poorRHat = Math.max(d.rHat.mu, d.rHat.sigma) > 1.01;
  const poorEss = Math.min(d.effectiveSampleSize.mu, d.effectiveSampleSize.sigma) < 1000;
  return (
    <Panel
      id="bayesian-title"
      title="Bayesian view"
      subtitle={
        <>
          Posterior medians with 95 % credible limits. Prior: <strong className="font-medium">{priorNames[bayes.prior.name]}</strong> —{' '}
          {bayes.prior.description}.
        </>
      }
    >
      <table className="w-full text-sm" aria-label="Bayesian posterior summaries">
        <ColumnHeads names={['Figure', 'Median', '95 % credible limits', '95 % point']} />
        <tbody className="divide-y divide-slate-100">
          <SummaryRow label="Geometric mean" summary={bayes.gm} unit={unit} />
          <SummaryRow label="GSD" summary={bayes.gsd} />
          <SummaryRow label="95th percentile" summary={bayes.p95} unit={unit} />
          <SummaryRow label="Arithmetic mean" summary={bayes.arithmeticMean} unit={unit} />
          {bayes.exceedanceFraction && <SummaryRow label="Exceedance fraction" summary={bayes.exceedanceFraction} share />}
        </tbody>
      </table>

      {bayes.probabilityP95AboveOel !== null && bayes.judgement && (
        <div className="mt-3 flex flex-wrap items-center gap-x-3 gap-y-1 border-t border-slate-100 pt-2 text-sm" data-testid="bayes-probability">
          <span>
            P(95th percentile &gt; OEL) ={' '}
            <strong className="font-semibold" title={String(bayes.probabilityP95AboveOel)}>
              {formatShare(bayes.probabilityP95AboveOel)}
            </strong>
          </span>
          <JudgementBadge judgement={bayes.judgement} />
          <span className="basis-full text-xs text-slate-600">Rule: {bayes.judgementRule}.</span>
        </div>
      )}

      {bayes.categoryProbabilities && (
        <table className="mt-3 w-full text-sm" aria-label="Probability of each exposure category (Bayesian view)">
          <ColumnHeads names={['Exposure category', 'Probability']} />
          <tbody>
            {bayes.categoryProbabilities.map((probability, category) => (
              <tr key={category}>
                <td className="py-0.5 pr-3">
                  <CategoryBadge category={exposureCategories[category].category} />
                </td>
                <td className="py-0.5 tabular-nums" title={String(probability)}>
                  {formatProbability(probability)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}

      <div className="mt-3 border-t border-slate-100 pt-2 text-xs text-slate-600" data-testid="bayes-diagnostics">
        <p>
          Convergence: R-hat μ {formatFigure(d.rHat.mu)}, σ {formatFigure(d.rHat.sigma)} {poorRHat ? '(poor: above 1.01)' : '(good: at most 1.01)'}; effective
          sample size μ {Math.round(d.effectiveSampleSize.mu).toLocaleString('en-GB')}, σ {Math.round(d.effectiveSampleSize.sigma).toLocaleString('en-GB')}{' '}
          {poorEss ? '(poor: below 1,000)' : '(good: 1,000 or more)'}. {d.chains} chains × {d.kept.toLocaleString('en-GB')} draws after{' '}
          {d.burnIn.toLocaleString('en-GB')} burn-in, seed {d.seed}.
        </p>
      </div>
      {d.warnings.length > 0 && (
        <Notice tone="warning" title="The Markov chains may not have converged" className="mt-2">
          <ul className="list-disc pl-4">
            {d.warnings.map((warning) => (
              <li key={warning}>{warning}</li>
            ))}
          </ul>
          <p className="mt-1">Read the Bayesian figures with caution; the classical view does not depend on the chains.</p>
        </Notice>
      )}
    </Panel>
  );
}
