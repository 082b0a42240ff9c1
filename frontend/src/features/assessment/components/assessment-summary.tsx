import { CategoryBadge } from '@frontend/components/category-badge';
import { exposureCategoryDescription } from '@stats/exposure-category';
import type { GroupAssessmentResponse } from '../api/get-assessment';
import { formatProbability } from '../lib/format-figure';
import { Figure } from './figure';
import { JudgementBadge } from './judgement-badge';

/**
 * The answer first: the exposure category (colour, number and word), the judgement and the sentence a
 * manager can act on, with the figures they rest on.
 */
export function AssessmentSummary({ assessment }: { assessment: GroupAssessmentResponse }) {
  const { classical, bayes, group } = assessment;
  return (
    <section aria-labelledby="summary-title" className="card p-4">
      <h2 id="summary-title" className="sr-only">
        Summary
      </h2>
      <div className="flex flex-wrap items-start gap-x-8 gap-y-3">
        <div>
          <p className="text-xs font-medium tracking-wide text-slate-500 uppercase">Exposure category</p>
          <div className="mt-1" data-testid="summary-category">
            <CategoryBadge category={classical.categoryByP95} />
          </div>
        </div>
        <div>
          <p className="text-xs font-medium tracking-wide text-slate-500 uppercase">Judgement</p>
          <div className="mt-1" data-testid="summary-judgement">
            <JudgementBadge judgement={classical.judgement} size="lg" />
          </div>
        </div>
        <div className="min-w-64 flex-1">
          <p className="text-base leading-snug text-slate-900" data-testid="summary-sentence">
            {classical.managerSentence}
          </p>
        </div>
      </div>
      <p className="mt-3 border-t border-slate-100 pt-2 text-sm text-slate-600">
        95th percentile estimate <Figure value={classical.p95} unit={group.oelUnit} /> (upper tolerance limit{' '}
        <Figure value={classical.utl95_95} unit={group.oelUnit} />) against the OEL <Figure value={group.oel} unit={group.oelUnit} />.{' '}
        {exposureCategoryDescription(classical.categoryByP95)}
        {classical.categoryByUtl !== classical.categoryByP95 && <> On its upper tolerance limit the group would be in category {classical.categoryByUtl}.</>}
        {bayes?.probabilityP95AboveOel != null && bayes.judgement && (
          <>
            {' '}
            The Bayesian view gives a {formatProbability(bayes.probabilityP95AboveOel)} probability that the 95th percentile is above the OEL:{' '}
            <strong className="font-medium text-slate-800">{bayes.judgement}</strong>.
          </>
        )}
      </p>
    </section>
  );
}
