import { Link } from 'react-router';
import type { ShiftResultView } from '@frontend/lib/api-types';
import { formatDateTime } from '@frontend/lib/format';
import type { ImportBatchSummary } from '../api/types';

const assumptionWords: Record<string, string> = {
  zero: 'unsampled time counted as no exposure',
  'sampled-average': 'unsampled time counted as exposed at the sampled average',
};

/** After a commit: how many results went where, with a link to each group's page. */
export function ImportSummary({ organizationId, batch, results }: { organizationId: string; batch: ImportBatchSummary; results: readonly ShiftResultView[] }) {
  const byGroup = new Map<number, { name: string; count: number; nonDetects: number; combined: number }>();
  for (const result of results) {
    const entry = byGroup.get(result.exposureGroupId) ?? { name: result.exposureGroupName, count: 0, nonDetects: 0, combined: 0 };
    entry.count += 1;
    if (result.nonDetect) entry.nonDetects += 1;
    if ((result.details?.parts?.length ?? 0) > 1) entry.combined += 1;
    byGroup.set(result.exposureGroupId, entry);
  }
  const base = `/orgs/${encodeURIComponent(organizationId)}`;
  const assumption = batch.mapping?.unsampledTime;
  return (
    <section aria-labelledby="summary-title" className="space-y-3 rounded-md border border-emerald-300 bg-emerald-50 px-4 py-4 text-sm text-emerald-950">
      <h2 id="summary-title" className="text-base text-emerald-950">
        Imported {batch.resultCount} shift result{batch.resultCount === 1 ? '' : 's'} from “{batch.fileName}”
      </h2>
      <p>
        Committed {formatDateTime(batch.committedAt)}. The file is kept with its SHA-256 <code className="text-xs break-all">{batch.sha256}</code>, so every
        result traces back to these bytes.
        {assumption && ` Shifts with several samples: ${assumptionWords[assumption] ?? assumption}.`}
      </p>
      <ul className="space-y-1">
        {[...byGroup.entries()].map(([groupId, entry]) => (
          <li key={groupId}>
            <Link to={`${base}/exposure-groups/${groupId}#results-title`} className="font-medium">
              {entry.name}
            </Link>
            : {entry.count} result{entry.count === 1 ? '' : 's'}
            {entry.nonDetects > 0 && `, ${entry.nonDetects} below detection`}
            {entry.combined > 0 && `, ${entry.combined} combined from several samples`}
          </li>
        ))}
      </ul>
      <p>
        <Link to={`${base}/lab-imports`}>Import another file</Link>
      </p>
    </section>
  );
}
