import { exposureUnitLabels } from '@schema/agents';
import type { ShiftResultView } from '@frontend/lib/api-types';
import { formatCalendarDate, formatDateTime, formatNumber } from '@frontend/lib/format';
import { resultValueText, sourceLabels } from './result-value';

const assumptionWords = {
  single: 'One sample taken as the shift result',
  zero: 'Unsampled time taken as zero exposure',
  'sampled-average': 'Unsampled time taken as exposed at the sampled average',
} as const;

/** How a result was reached: the statement in words, each sample that went into it, conversions and flags. */
export function ResultDetails({ result }: { result: ShiftResultView }) {
  const details = result.details;
  const combination = details?.combination;
  return (
    <div className="space-y-3 text-sm">
      <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-3">
        <div>
          <dt className="text-xs font-medium text-slate-500 uppercase">Worker and shift</dt>
          <dd className="tabular-nums">
            {result.worker.code} · {formatCalendarDate(result.date)}
          </dd>
        </div>
        <div>
          <dt className="text-xs font-medium text-slate-500 uppercase">Result</dt>
          <dd className="font-medium tabular-nums">{resultValueText(result)}</dd>
        </div>
        <div>
          <dt className="text-xs font-medium text-slate-500 uppercase">Source</dt>
          <dd>
            {sourceLabels[result.source]}
            {result.importBatchId !== null && ` (lab import ${result.importBatchId})`}
          </dd>
        </div>
        {result.reportedValue !== null && result.reportedUnit !== null && (
          <div>
            <dt className="text-xs font-medium text-slate-500 uppercase">As reported</dt>
            <dd className="tabular-nums">
              {formatNumber(result.reportedValue, 6)} {exposureUnitLabels[result.reportedUnit]}
            </dd>
          </div>
        )}
        <div>
          <dt className="text-xs font-medium text-slate-500 uppercase">Recorded</dt>
          <dd>
            {formatDateTime(result.createdAt)}
            {result.createdBy && ` by ${result.createdBy.name}`}
          </dd>
        </div>
        {result.status === 'void' && (
          <div className="sm:col-span-3">
            <dt className="text-xs font-medium text-slate-500 uppercase">Void</dt>
            <dd>
              “{result.voidReason}” — {formatDateTime(result.voidedAt)}
              {result.voidedBy && ` by ${result.voidedBy.name}`}
            </dd>
          </div>
        )}
      </dl>
      {details?.statement && <p className="rounded bg-slate-50 px-3 py-2 text-slate-800">{details.statement}</p>}
      {details?.flags.map((flag) => (
        <p key={flag} className="rounded border border-amber-300 bg-amber-50 px-3 py-2 text-amber-950">
          {flag}
        </p>
      ))}
      {combination && combination.assumption !== 'single' && (
        <p className="text-slate-700">
          {assumptionWords[combination.assumption]}: {combination.formula}.
          {combination.nonDetectParts > 0 &&
            ` With the ${combination.nonDetectParts} non-detect sample(s) at zero the result would be ${formatNumber(combination.lowerBound, 4)}; at their detection limits ${formatNumber(combination.upperBound, 4)}.`}
        </p>
      )}
      {details?.parts && details.parts.length > 0 && (
        <div className="overflow-x-auto rounded border border-slate-200">
          <table className="table-dense w-full">
            <caption className="sr-only">Samples that make up this result</caption>
            <thead>
              <tr>
                <th scope="col">File row</th>
                <th scope="col">Sample id</th>
                <th scope="col">Period</th>
                <th scope="col">Minutes</th>
                <th scope="col">As reported</th>
                <th scope="col">In {exposureUnitLabels[result.unit]}</th>
              </tr>
            </thead>
            <tbody>
              {details.parts.map((part, index) => (
                <tr key={`${part.row}-${index}`}>
                  <td className="tabular-nums">{part.row ?? '—'}</td>
                  <td>{part.sampleId ?? '—'}</td>
                  <td className="tabular-nums">{part.startTime && part.endTime ? `${part.startTime}–${part.endTime}` : '—'}</td>
                  <td className="tabular-nums">{part.minutes === null ? '—' : formatNumber(part.minutes, 4)}</td>
                  <td className="tabular-nums">
                    {part.nonDetect ? '< ' : ''}
                    {formatNumber(part.reportedValue, 4)} {exposureUnitLabels[part.reportedUnit]}
                  </td>
                  <td className="tabular-nums">
                    {part.nonDetect ? '< ' : ''}
                    {formatNumber(part.value, 4)}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {result.notes && <p className="whitespace-pre-line text-slate-700">Notes: {result.notes}</p>}
    </div>
  );
}
