import type { DecisionRecordView } from '@schema/decision-records';
import { formatCalendarDate, formatDateTime, formatNumber } from '@frontend/lib/format';

/** What approval froze: data hash, method, versions, settings, the results used and those left out (with reasons). */
export function FrozenDetails({ record }: { record: DecisionRecordView }) {
  const inputs = record.frozenInputs;
  if (!inputs || !record.settings || !record.engineVersion) return null;
  const rows: Array<[string, string]> = [
    ['Data hash (SHA-256)', record.dataHash ?? '—'],
    ['Method', record.method ?? '—'],
    ['Bellwether version', record.engineVersion.application],
    ['Statistics engine version', record.engineVersion.statistics],
    ['Seed', String(record.settings.seed)],
    ['Bayesian prior', record.settings.prior],
    [
      'Bayesian threshold P(P95 > OEL)',
      `${formatNumber(record.settings.unacceptableThreshold)} (${record.settings.unacceptableThresholdSource === 'organization' ? 'organization setting' : 'default'})`,
    ],
    ['Data version at approval', String(record.dataVersionAtApproval ?? '—')],
    ['Approved', formatDateTime(record.approvedAt)],
  ];
  return (
    <section aria-labelledby="frozen-title" className="space-y-3 rounded-md border border-slate-200 bg-white p-4">
      <h2 id="frozen-title" className="text-base">
        Frozen at approval
      </h2>
      <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[14rem_1fr]">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-slate-600">{label}</dt>
            <dd className="font-mono text-xs break-all text-slate-900 sm:text-sm">{value}</dd>
          </div>
        ))}
      </dl>
      <details>
        <summary className="cursor-pointer text-sm font-medium">Results used ({inputs.results.length})</summary>
        <table className="mt-2 w-full text-sm">
          <caption className="sr-only">Results frozen in this record</caption>
          <thead className="text-left text-xs text-slate-600">
            <tr>
              <th scope="col" className="py-1 pr-3 font-medium">
                Result
              </th>
              <th scope="col" className="py-1 pr-3 font-medium">
                Worker
              </th>
              <th scope="col" className="py-1 pr-3 font-medium">
                Date
              </th>
              <th scope="col" className="py-1 font-medium">
                Value
              </th>
            </tr>
          </thead>
          <tbody>
            {inputs.results.map((result) => (
              <tr key={result.id} className="border-t border-slate-100">
                <td className="py-1 pr-3">{result.id}</td>
                <td className="py-1 pr-3">{result.workerCode}</td>
                <td className="py-1 pr-3">{formatCalendarDate(result.date)}</td>
                <td className="py-1 tabular-nums">
                  {result.nonDetect ? '<' : ''}
                  {formatNumber(result.value, 4)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
      {inputs.excluded.length > 0 && (
        <div>
          <h3 className="text-sm font-medium">Left out ({inputs.excluded.length})</h3>
          <ul className="mt-1 list-disc pl-5 text-sm">
            {inputs.excluded.map((result) => (
              <li key={result.id}>
                Result {result.id} ({result.workerCode}, {formatCalendarDate(result.date)}, {formatNumber(result.value, 4)}): {result.reason}
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
