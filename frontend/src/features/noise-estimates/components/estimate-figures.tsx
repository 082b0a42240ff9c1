import type { NoiseEstimateFigures } from '@schema/noise-estimates';
import { Notice } from '@frontend/components/notice';

const oneDecimal = (value: number) => (Math.round(value * 10) / 10).toFixed(1);
const twoDecimals = (value: number | null) => (value === null ? '—' : (Math.round(value * 100) / 100).toFixed(2));

/**
 * LEX,8h ± U, the comparison with the values in force, the warnings of the standard, and the
 * uncertainty budget (ISO 9612:2009 Annex C) of one estimate. Figures are rounded to 0.1 dB for
 * display (budget lines to 0.01); the API keeps full precision.
 */
export function EstimateFigures({ figures, headingId }: { figures: NoiseEstimateFigures; headingId: string }) {
  const above = figures.comparisons.filter((comparison) => comparison.lexPlusUAbove);
  return (
    <div className="space-y-4">
      <dl className="grid gap-3 sm:grid-cols-4" aria-labelledby={headingId}>
        <div className="rounded-md border border-slate-200 p-3">
          <dt className="text-xs text-slate-600">LEX,8h</dt>
          <dd className="text-2xl font-semibold text-slate-900" data-testid="lex8h">
            {oneDecimal(figures.lex8h)} dB(A)
          </dd>
        </div>
        <div className="rounded-md border border-slate-200 p-3">
          <dt className="text-xs text-slate-600">Expanded uncertainty U (1.65·u)</dt>
          <dd className="text-2xl font-semibold text-slate-900" data-testid="expanded-uncertainty">
            {oneDecimal(figures.expandedUncertainty)} dB
          </dd>
          {figures.expandedUncertaintyWithoutDuration !== null && (
            <dd className="text-xs text-slate-600">{oneDecimal(figures.expandedUncertaintyWithoutDuration)} dB without the duration terms</dd>
          )}
        </div>
        <div className="rounded-md border border-slate-200 p-3">
          <dt className="text-xs text-slate-600">LEX,8h + U</dt>
          <dd className="text-2xl font-semibold text-slate-900">{oneDecimal(figures.lexPlusU)} dB(A)</dd>
        </div>
        <div className="rounded-md border border-slate-200 p-3">
          <dt className="text-xs text-slate-600">Effective day Te · LAeq,Te</dt>
          <dd className="text-lg font-semibold text-slate-900">
            {figures.effectiveHours} h · {oneDecimal(figures.laeqTe)} dB(A)
          </dd>
        </div>
      </dl>

      <section aria-label="Comparison with the values in force" className="space-y-1">
        <p className="text-sm text-slate-700">
          Values in force: <strong>{figures.criteria.label}</strong>, and the group’s own values where they are in dB(A) or convertible.
        </p>
        <ul className="space-y-1 text-sm" data-testid="verdict">
          {figures.comparisons.map((comparison) => (
            <li key={`${comparison.kind}-${comparison.label}`} className={comparison.lexPlusUAbove ? 'font-medium text-red-900' : 'text-slate-800'}>
              {comparison.sentence} <span className="text-xs text-slate-600">({comparison.source})</span>
              {comparison.note && <span className="block text-xs text-slate-600">{comparison.note}</span>}
            </li>
          ))}
        </ul>
        {above.length === 0 && <p className="text-sm text-slate-700">LEX,8h + U is below every value in force.</p>}
      </section>

      {figures.warnings.length > 0 && (
        <Notice tone="warning" title="What ISO 9612 asks for">
          <ul className="list-disc space-y-1 pl-5">
            {figures.warnings.map((warning) => (
              <li key={warning}>{warning}</li>
            ))}
          </ul>
        </Notice>
      )}

      {figures.tasks && (
        <table className="w-full text-sm">
          <caption className="text-left text-sm font-semibold text-slate-900">Tasks</caption>
          <thead>
            <tr className="border-b border-slate-200 text-left text-xs text-slate-600">
              <th className="py-1 pr-2">Task</th>
              <th className="py-1 pr-2 text-right">T_m (h)</th>
              <th className="py-1 pr-2 text-right">LAeq,T,m (dB)</th>
              <th className="py-1 pr-2 text-right">Spread (dB)</th>
              <th className="py-1 text-right">Share of the daily energy</th>
            </tr>
          </thead>
          <tbody>
            {figures.tasks.map((task) => (
              <tr key={task.name} className="border-b border-slate-100">
                <th scope="row" className="py-1 pr-2 text-left font-normal">
                  {task.name}
                </th>
                <td className="py-1 pr-2 text-right">{task.hours}</td>
                <td className="py-1 pr-2 text-right">{oneDecimal(task.laeqDb)}</td>
                <td className="py-1 pr-2 text-right">{oneDecimal(task.spreadDb)}</td>
                <td className="py-1 text-right">{Math.round(task.energyShare * 100)} %</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}

      <table className="w-full text-sm" data-testid="uncertainty-budget">
        <caption className="text-left text-sm font-semibold text-slate-900">Uncertainty budget (ISO 9612:2009 Annex C)</caption>
        <thead>
          <tr className="border-b border-slate-200 text-left text-xs text-slate-600">
            <th className="py-1 pr-2">Term</th>
            <th className="py-1 pr-2 text-right">u</th>
            <th className="py-1 pr-2 text-right">c</th>
            <th className="py-1 pr-2 text-right">c·u (dB)</th>
            <th className="py-1">Source</th>
          </tr>
        </thead>
        <tbody>
          {figures.budget.map((line) => (
            <tr key={line.label} className="border-b border-slate-100">
              <th scope="row" className="py-1 pr-2 text-left font-normal">
                {line.label}
              </th>
              <td className="py-1 pr-2 text-right">{twoDecimals(line.standardUncertainty)}</td>
              <td className="py-1 pr-2 text-right">{twoDecimals(line.sensitivity)}</td>
              <td className="py-1 pr-2 text-right">{twoDecimals(line.contribution)}</td>
              <td className="py-1 text-xs text-slate-600">{line.source}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <th scope="row" className="py-1 pr-2 text-left">
              Combined standard uncertainty u
            </th>
            <td colSpan={2} />
            <td className="py-1 pr-2 text-right font-medium">{twoDecimals(figures.combinedUncertainty)}</td>
            <td />
          </tr>
          <tr>
            <th scope="row" className="py-1 pr-2 text-left">
              Expanded uncertainty U = 1.65·u
            </th>
            <td colSpan={2} />
            <td className="py-1 pr-2 text-right font-medium">{twoDecimals(figures.expandedUncertainty)}</td>
            <td />
          </tr>
        </tfoot>
      </table>
      {figures.cumulativeHours !== null || figures.minimumCumulativeHours !== null ? (
        <p className="text-sm text-slate-700">
          Sampled {figures.cumulativeHours === null ? 'duration not given for every sample' : `${twoDecimals(figures.cumulativeHours)} h`}; ISO 9612 Table 1
          asks for at least {figures.minimumCumulativeHours} h for this group size.
        </p>
      ) : null}
    </div>
  );
}
