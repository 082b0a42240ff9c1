import type { GroupAssessmentResponse } from '../api/get-assessment';
import { formatFigure, formatProbability } from '../lib/format-figure';
import { Figure } from './figure';
import { ColumnHeads, FigureRow, FigureTable, Panel } from './figure-table';

/** Within- and between-worker variation, the F-test, P(a worker's mean > OEL) and workers who may not belong. */
export function BetweenWorkerPanel({ assessment }: { assessment: GroupAssessmentResponse }) {
  const { betweenWorker: w, unavailable, group } = assessment;
  if (!w) {
    return (
      <Panel id="between-worker-title" title="Between-worker analysis">
        <p className="text-sm text-slate-700">Not available for these data: {unavailable.betweenWorker ?? 'no reason given'}.</p>
      </Panel>
    );
  }
  const flagged = w.workerSummaries.filter((worker) => worker.flagged);
  return (
    <Panel
      id="between-worker-title"
      title="Between-worker analysis"
      subtitle={`${w.workers} workers with 2 or more results, ${w.n} results${w.excludedResults > 0 ? ` (${w.excludedResults} left out: single results or no worker code)` : ''}${w.nonDetectsSubstituted > 0 ? `; ${w.nonDetectsSubstituted} non-detects taken at their limit ÷ √2` : ''}.`}
    >
      <FigureTable label="Between-worker figures">
        <FigureRow label="GSD within workers" value={<Figure value={w.withinGsd} />} note="Day-to-day variation of one worker" />
        <FigureRow
          label="GSD between workers"
          value={<Figure value={w.betweenGsd} />}
          note={<>Spread of workers’ long-term means; R0.95 = {formatFigure(w.ratio95)}</>}
        />
        <FigureRow label="Intraclass correlation" value={<Figure value={w.intraclassCorrelation} />} note="Share of the variance that lies between workers" />
        <FigureRow
          label="Differences between workers"
          value={<>p = {formatFigure(w.pValue)}</>}
          note={
            <>
              F = {formatFigure(w.fStatistic)} on {w.degreesOfFreedomBetween} and {w.degreesOfFreedomWithin} degrees of freedom;{' '}
              {w.pValue < 0.05 ? 'the workers differ more than chance would explain.' : 'no clear difference between workers.'}
            </>
          }
        />
        {w.probabilityWorkerMeanAboveOel !== null && (
          <FigureRow
            label="P(a worker’s mean > OEL)"
            value={<span title={String(w.probabilityWorkerMeanAboveOel)}>{formatProbability(w.probabilityWorkerMeanAboveOel)}</span>}
            note="Probability that a randomly chosen worker’s long-term mean exposure is above the OEL"
          />
        )}
      </FigureTable>
      <table className="mt-3 w-full text-sm" aria-label="Workers in the between-worker analysis">
        <ColumnHeads names={['Worker', 'Results', 'Geometric mean', 'May not belong?']} />
        <tbody className="divide-y divide-slate-100">
          {w.workerSummaries.map((worker) => (
            <tr key={worker.worker} className={worker.flagged ? 'bg-amber-50' : undefined}>
              <td className="py-1 pr-3 font-medium">{worker.worker}</td>
              <td className="py-1 pr-3 tabular-nums">{worker.n}</td>
              <td className="py-1 pr-3">
                <Figure value={worker.gm} unit={group.oelUnit} />
              </td>
              <td className="py-1">{worker.flagged ? <>Flagged: {worker.flagReason}</> : 'No'}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-2 text-xs text-slate-600">
        {flagged.length === 0 ? 'No worker is flagged. ' : `${flagged.length} flagged: check their tasks before keeping them in this group. `}
        {w.flagRule}
      </p>
    </Panel>
  );
}
