import { Link } from 'react-router';
import type { DecisionRecordSummary } from '@schema/decision-records';
import { CategoryBadge } from '@frontend/components/category-badge';
import { formatCalendarDate, formatDate } from '@frontend/lib/format';
import { DecisionJudgement, DecisionStatusBadge, OutOfDateMarker } from './decision-badges';

/** The records of a group (or an organization) as a table: status, category, judgement, people, dates. */
export function DecisionList({
  organizationId,
  records,
  showGroup = false,
  caption,
}: {
  organizationId: string;
  records: DecisionRecordSummary[];
  showGroup?: boolean;
  caption: string;
}) {
  return (
    <div className="overflow-x-auto rounded-md border border-slate-200 bg-white">
      <table className="w-full text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-slate-50 text-left text-xs text-slate-600">
          <tr>
            <th scope="col" className="px-3 py-2 font-medium">
              Record
            </th>
            {showGroup && (
              <th scope="col" className="px-3 py-2 font-medium">
                Exposure group
              </th>
            )}
            <th scope="col" className="px-3 py-2 font-medium">
              Status
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Category
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Judgement
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Drafted by
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Approved by
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Review date
            </th>
          </tr>
        </thead>
        <tbody>
          {records.map((record) => (
            <tr key={record.id} className="border-t border-slate-100 align-top">
              <td className="px-3 py-2 whitespace-nowrap">
                <Link to={`/orgs/${encodeURIComponent(organizationId)}/decision-records/${record.id}`}>Record {record.id}</Link>
              </td>
              {showGroup && <td className="px-3 py-2">{record.exposureGroupName}</td>}
              <td className="px-3 py-2">
                <div className="flex flex-wrap gap-1">
                  <DecisionStatusBadge status={record.status} />
                  {record.outOfDate && <OutOfDateMarker />}
                </div>
              </td>
              <td className="px-3 py-2">
                <CategoryBadge category={record.category} />
              </td>
              <td className="px-3 py-2">
                <DecisionJudgement judgement={record.judgement} />
              </td>
              <td className="px-3 py-2">
                {record.drafter.name}
                <div className="text-xs text-slate-500">{formatDate(record.submittedAt)}</div>
              </td>
              <td className="px-3 py-2">
                {record.approver ? (
                  <>
                    {record.approver.name}
                    <div className="text-xs text-slate-500">{formatDate(record.approvedAt)}</div>
                  </>
                ) : (
                  '—'
                )}
              </td>
              <td className="px-3 py-2 whitespace-nowrap">{formatCalendarDate(record.reviewDate)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
