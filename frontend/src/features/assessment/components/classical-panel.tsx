import { CategoryBadge } from '@frontend/components/category-badge';
import type { GroupAssessmentResponse } from '../api/get-assessment';
import { formatFigure } from '../lib/format-figure';
import { Figure } from './figure';
import { FigureRow, FigureTable, Panel } from './figure-table';
import { JudgementBadge } from './judgement-badge';

const fitMethods = {
  complete: 'Every result detected: logs of the results',
  ros: 'Robust regression on order statistics (non-detects)',
  'censored-mle': 'Censored maximum likelihood (non-detects)',
} as const;

const en689Words = { compliant: 'Compliant', 'non-compliant': 'Non-compliant', 'no-decision': 'No decision yet' } as const;

/** The classical view: lognormal fit, percentile, exceedance fraction and mean with their limits, EN 689, category and judgement. */
export function ClassicalPanel({ assessment }: { assessment: GroupAssessmentResponse }) {
  const { classical: c, group } = assessment;
  const unit = group.oelUnit;
  const complete = c.nonDetects === 0;
  const swLog = c.fitCheck.shapiroWilkLog;
  return (
    <Panel id="classical-title" title="Classical view" subtitle="Estimates from the lognormal fit with 95 % confidence limits.">
      <FigureTable label="Classical figures">
        <FigureRow
          label="Results used"
          value={
            <>
              {c.n}
              {c.nonDetects > 0 && <span className="font-normal text-slate-600"> ({c.nonDetects} non-detects)</span>}
            </>
          }
          note={fitMethods[c.fit.method]}
        />
        <FigureRow
          label="Geometric mean · GSD"
          value={
            <>
              <Figure value={c.gm} unit={unit} /> · <Figure value={c.gsd} />
            </>
          }
        />
        <FigureRow
          testId="classical-p95"
          label="95th percentile"
          value={<Figure value={c.p95} unit={unit} />}
          note={
            <>
              UTL95%,95% (upper 95 % confidence limit): <Figure value={c.utl95_95} unit={unit} />
            </>
          }
        />
        <FigureRow
          label="Exceedance fraction"
          value={<Figure value={c.exceedanceFraction} share />}
          note={
            <>
              of shifts above the OEL; 95 % limits <Figure value={c.exceedanceFractionLcl95} share /> (lower) to{' '}
              <Figure value={c.exceedanceFractionUcl95} share /> (upper)
              {c.exceedanceFractionInterval95 && (
                <>
                  ; two-sided 95 % interval <Figure value={c.exceedanceFractionInterval95.lower} share />–
                  <Figure value={c.exceedanceFractionInterval95.upper} share />
                </>
              )}
            </>
          }
        />
        <FigureRow
          label={complete ? 'Arithmetic mean (MVUE)' : 'Arithmetic mean (fitted)'}
          value={<Figure value={c.amMvue} unit={unit} />}
          note={
            <>
              {complete ? "Land's exact" : 'Bootstrap'} one-sided 95 % limits: <Figure value={c.amLcl95} unit={unit} /> (lower),{' '}
              <Figure value={c.amUcl95} unit={unit} /> (upper)
            </>
          }
        />
        <FigureRow
          label="Exposure category"
          value={<CategoryBadge category={c.categoryByP95} />}
          note={<>On the 95th percentile estimate; on the UTL: category {c.categoryByUtl}</>}
        />
        <FigureRow label="Judgement" value={<JudgementBadge judgement={c.judgement} />} note={c.judgementRules[c.judgement]} />
        <FigureRow
          testId="classical-en689"
          label="EN 689:2018"
          value={en689Words[c.en689.result]}
          note={
            <>
              {c.en689.test === 'statistical' ? 'Statistical test (6 or more results). ' : 'Preliminary test (3–5 results). '}
              {c.en689.explanation}{' '}
              {c.en689.reassessmentMonths !== null
                ? `Reassess within ${c.en689.reassessmentMonths} months (EN 689 guidance on the GM as a share of the OEL).`
                : 'No reassessment interval until the group is compliant.'}
            </>
          }
        />
        <FigureRow
          label="Lognormal fit check"
          value={
            swLog ? (
              <>
                Shapiro–Wilk on logs: W {formatFigure(swLog.w)}, p {formatFigure(swLog.p)}
              </>
            ) : (
              'Not tested'
            )
          }
          note={
            <>
              {c.fitCheck.shapiroWilkRaw && (
                <>
                  On raw values: W {formatFigure(c.fitCheck.shapiroWilkRaw.w)}, p {formatFigure(c.fitCheck.shapiroWilkRaw.p)}.{' '}
                </>
              )}
              {c.fitCheck.basis}
            </>
          }
        />
      </FigureTable>
    </Panel>
  );
}
