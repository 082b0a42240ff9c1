import { Link } from 'react-router';
import type { DecisionChange, GroupDecisions } from '@schema/decision-records';
import { formatCalendarDate, formatNumber } from '@frontend/lib/format';

function show(change: DecisionChange, value: string | number | null): string {
  if (value === null) return '—';
  if (change.field === 'reviewDate') return formatCalendarDate(String(value));
  if (change.field === 'dataHash') return `${String(value).slice(0, 12)}…`;
  if (change.field === 'exceedanceFraction' && typeof value === 'number') return `${formatNumber(100 * value)} %`;
  return typeof value === 'number' ? formatNumber(value) : value;
}

/** What changed between consecutive approved records, newest first. */
export function DecisionHistory({ organizationId, history }: { organizationId: string; history: GroupDecisions['history'] }) {
  if (history.length === 0) return <p className="text-sm text-slate-600">Differences appear here once a second record has been approved.</p>;
  const link = (id: number) => <Link to={`/orgs/${encodeURIComponent(organizationId)}/decision-records/${id}`}>record {id}</Link>;
  return (
    <ol className="space-y-3">
      {history.map((step) => (
        <li key={step.toId} className="rounded-md border border-slate-200 bg-white p-3">
          <p className="text-sm font-medium text-slate-800">
            From {link(step.fromId)} to {link(step.toId)}
          </p>
          {step.changes.length === 0 ? (
            <p className="mt-1 text-sm text-slate-600">No change in category, judgement, review date or the main figures.</p>
          ) : (
            <table className="mt-2 w-full text-sm">
              <caption className="sr-only">
                Changes from record {step.fromId} to record {step.toId}
              </caption>
              <thead className="text-left text-xs text-slate-600">
                <tr>
                  <th scope="col" className="py-1 pr-3 font-medium">
                    What
                  </th>
                  <th scope="col" className="py-1 pr-3 font-medium">
                    Before
                  </th>
                  <th scope="col" className="py-1 font-medium">
                    After
                  </th>
                </tr>
              </thead>
              <tbody>
                {step.changes.map((change) => (
                  <tr key={change.field} className="border-t border-slate-100">
                    <th scope="row" className="py-1 pr-3 text-left font-normal text-slate-700">
                      {change.label}
                    </th>
                    <td className="py-1 pr-3 tabular-nums">{show(change, change.before)}</td>
                    <td className="py-1 font-medium tabular-nums">{show(change, change.after)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </li>
      ))}
    </ol>
  );
}
