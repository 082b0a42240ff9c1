import type { ExposureUnit } from '@schema/agents';
import type { AssessmentResult } from '@schema/assessment';
import type { ResultSource } from '@schema/shift-results';
import { formatDate } from '@frontend/lib/format';
import { formatFigure, unitLabel } from '../lib/format-figure';

const sourceWords: Record<ResultSource, string> = {
  entered: 'Entered',
  'lab-import': 'Lab import',
  'noise-log': 'Noise log',
  mixture: 'Mixture',
};

/** Every valid result, in the order the engine receives them (date, worker). */
export function allResults(used: readonly AssessmentResult[], excluded: readonly AssessmentResult[]): AssessmentResult[] {
  return [...used, ...excluded].sort((a, b) =>
    a.date < b.date ? -1 : a.date > b.date ? 1 : a.workerCode < b.workerCode ? -1 : a.workerCode > b.workerCode ? 1 : a.id - b.id,
  );
}

/**
 * The valid results with a "leave out" box each (what-if). Ticking one recomputes the page without it;
 * nothing is written. People whose role may not run statistics see the table without the boxes.
 */
export function ResultsTable({
  results,
  leftOut,
  unit,
  canLeaveOut,
  onLeaveOut,
}: {
  results: readonly AssessmentResult[];
  leftOut: readonly number[];
  unit: ExposureUnit;
  canLeaveOut: boolean;
  onLeaveOut: (id: number, leaveOut: boolean) => void;
}) {
  const out = new Set(leftOut);
  return (
    <div className="card overflow-x-auto">
      <table className="table-dense w-full" aria-label="Valid shift results of this group">
        <thead>
          <tr>
            {canLeaveOut && (
              <th scope="col" className="w-24">
                Leave out
              </th>
            )}
            <th scope="col">Date</th>
            <th scope="col">Worker</th>
            <th scope="col" className="text-right">
              Value ({unitLabel(unit)})
            </th>
            <th scope="col" className="w-1/3">
              Source
            </th>
          </tr>
        </thead>
        <tbody>
          {results.map((result) => {
            const isOut = out.has(result.id);
            const valueText = `${result.nonDetect ? '<' : ''}${formatFigure(result.value)}`;
            return (
              <tr key={result.id} className={isOut ? 'bg-slate-50 text-slate-500' : undefined} data-result-id={result.id}>
                {canLeaveOut && (
                  <td>
                    <input
                      type="checkbox"
                      className="size-4 accent-primary-700"
                      checked={isOut}
                      onChange={(event) => onLeaveOut(result.id, event.target.checked)}
                      aria-label={`Leave out ${result.workerCode} on ${result.date} (${valueText} ${unitLabel(unit)})`}
                    />
                  </td>
                )}
                <td className="whitespace-nowrap">{formatDate(`${result.date}T12:00:00Z`)}</td>
                <td className="font-medium">{result.workerCode}</td>
                <td className={`text-right tabular-nums ${isOut ? 'line-through' : ''}`} title={String(result.value)}>
                  {valueText}
                  {result.nonDetect && <span className="ml-1 text-xs text-slate-500">non-detect</span>}
                </td>
                <td>
                  {sourceWords[result.source]}
                  {isOut && <span className="ml-2 text-xs font-medium text-slate-600">left out</span>}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
