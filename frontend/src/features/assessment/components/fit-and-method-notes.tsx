import { Notice } from '@frontend/components/notice';
import type { GroupAssessmentResponse } from '../api/get-assessment';
import { formatFigure } from '../lib/format-figure';
import { Figure } from './figure';

/** The fit-check warning (Shapiro–Wilk p < 0.05 on the logs) with likely reasons, and the non-detect method note. */
export function FitAndMethodNotes({ assessment }: { assessment: GroupAssessmentResponse }) {
  const { classical: c, group } = assessment;
  const limits = c.descriptive.detectionLimits;
  return (
    <div className="space-y-2">
      {c.fitCheck.doubtful && c.fitCheck.warning && (
        <Notice tone="warning" title="The lognormal fit is doubtful">
          <p data-testid="fit-warning">{c.fitCheck.warning}</p>
          {c.fitCheck.likelyReasons.length > 0 && (
            <>
              <p className="mt-1 font-medium">Likely reasons</p>
              <ul className="list-disc pl-5">
                {c.fitCheck.likelyReasons.map((reason) => (
                  <li key={reason}>{reason}</li>
                ))}
              </ul>
            </>
          )}
        </Notice>
      )}
      {c.nonDetects > 0 && (
        <Notice tone="info" title={`Non-detects: ${c.nonDetects} of ${c.n} results are below their detection limit`}>
          <p data-testid="nondetect-note">
            {limits && (
              <>
                Detection limits <Figure value={limits.lowest} unit={group.oelUnit} />
                {limits.highest !== limits.lowest && (
                  <>
                    {' '}
                    to <Figure value={limits.highest} unit={group.oelUnit} />
                  </>
                )}
                .{' '}
              </>
            )}
            {c.fit.methodNote} Charts draw non-detects as open circles.
          </p>
        </Notice>
      )}
      {!c.fitCheck.doubtful && c.fitCheck.shapiroWilkLog && (
        <p className="text-xs text-slate-600">
          The lognormal model fits the {c.nonDetects > 0 ? 'detected values' : 'results'}: Shapiro–Wilk on the logs p ={' '}
          {formatFigure(c.fitCheck.shapiroWilkLog.p)} (a warning shows below 0.05).
        </p>
      )}
    </div>
  );
}
