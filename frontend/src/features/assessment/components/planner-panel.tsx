import type { GroupAssessmentResponse } from '../api/get-assessment';
import { formatProbability } from '../lib/format-figure';
import { ColumnHeads, Panel } from './figure-table';

/** The sample planner: its one sentence and the forecast for k = 1..12 more shifts, labelled a forecast, not a promise. */
export function PlannerPanel({ assessment }: { assessment: GroupAssessmentResponse }) {
  const plan = assessment.planner;
  if (!plan) {
    return (
      <Panel id="planner-title" title="Sample planner">
        <p className="text-sm text-slate-700">Not available for these data: {assessment.unavailable.planner ?? 'no reason given'}.</p>
      </Panel>
    );
  }
  return (
    <Panel
      id="planner-title"
      title="Sample planner"
      subtitle="How likely more shift results are to settle the judgement. A forecast from the current data, not a promise."
    >
      <p className="text-sm font-medium text-slate-900" data-testid="planner-statement">
        {plan.statement}
      </p>
      <table className="mt-2 w-full text-sm" aria-label="Forecast: probability that k more shifts settle the judgement">
        <ColumnHeads names={['More shifts', 'Settled', 'Acceptable', 'Unacceptable']} />
        <tbody className="divide-y divide-slate-100 tabular-nums">
          {plan.forecasts.map((forecast) => {
            const recommended = forecast.additional === plan.recommendedAdditional;
            return (
              <tr key={forecast.additional} className={recommended ? 'bg-primary-50 font-medium' : undefined}>
                <td className="py-0.5 pr-3">
                  {forecast.additional}
                  {recommended && <span className="ml-1 text-xs font-normal text-primary-800">(recommended)</span>}
                </td>
                <td className="py-0.5 pr-3" title={String(forecast.probabilitySettled)}>
                  {formatProbability(forecast.probabilitySettled)}
                </td>
                <td className="py-0.5 pr-3" title={String(forecast.probabilityAcceptable)}>
                  {formatProbability(forecast.probabilityAcceptable)}
                </td>
                <td className="py-0.5" title={String(forecast.probabilityUnacceptable)}>
                  {formatProbability(forecast.probabilityUnacceptable)}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="mt-2 text-xs text-slate-600">
        {plan.simulations.toLocaleString('en-GB')} simulated futures per row; a count is recommended when it settles the judgement with at least{' '}
        {formatProbability(plan.targetProbability)} probability. The forecast assumes the group and its controls stay as they are.
      </p>
    </Panel>
  );
}
