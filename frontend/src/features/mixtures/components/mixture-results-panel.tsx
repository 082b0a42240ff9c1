import { useState } from 'react';
import { Button } from '@frontend/components/button';
import { Notice } from '@frontend/components/notice';
import { isApiError } from '@frontend/lib/api-client';
import { formatCalendarDate } from '@frontend/lib/format';
import { useComputeMixtureResults, useMixturePreview } from '../api/mixtures';

const indexText = (value: number, nonDetect: boolean) => `${nonDetect ? '< ' : ''}${Number(value.toPrecision(3))}`;

/**
 * On a mixture group's page: a preview of the index Σ Cᵢ/OELᵢ per worker-shift from the components'
 * results (what will be written, skipped with the missing components, and replaced), and the button
 * that writes it.
 */
export function MixtureResultsPanel({ organizationId, groupId, canEdit }: { organizationId: string; groupId: number; canEdit: boolean }) {
  const preview = useMixturePreview(organizationId, groupId);
  const compute = useComputeMixtureResults(organizationId, groupId);
  const [outcome, setOutcome] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);

  return (
    <section aria-labelledby="mixture-title" className="space-y-3">
      <h2 id="mixture-title" className="text-base">
        Mixture index
      </h2>
      {outcome && <Notice tone="success">{outcome}</Notice>}
      {problem && <Notice tone="error">{problem}</Notice>}
      {preview.isPending && <p className="text-sm text-slate-600">Working out the preview…</p>}
      {preview.error && <Notice tone="warning">{isApiError(preview.error) ? preview.error.message : 'The preview could not be worked out.'}</Notice>}
      {preview.data && (
        <>
          <p className="text-sm text-slate-700">
            {preview.data.formula} over {preview.data.mixture.components.join(', ')} — {preview.data.source}. {preview.data.nonDetectRule}
          </p>
          <div className="card overflow-x-auto">
            <table className="table-dense w-full">
              <caption className="sr-only">Mixture results that computing would write</caption>
              <thead>
                <tr>
                  <th scope="col">Date</th>
                  <th scope="col">Worker</th>
                  <th scope="col">Index</th>
                  <th scope="col">Working</th>
                </tr>
              </thead>
              <tbody>
                {preview.data.rows.length === 0 ? (
                  <tr>
                    <td colSpan={4} className="text-sm text-slate-600">
                      No shift of this group’s members has a valid result for every component yet.
                    </td>
                  </tr>
                ) : (
                  preview.data.rows.map((row) => (
                    <tr key={`${row.workerId}-${row.date}`}>
                      <td>{formatCalendarDate(row.date)}</td>
                      <td>{row.workerCode}</td>
                      <td className="tabular-nums">{indexText(row.index, row.nonDetect)}</td>
                      <td className="text-xs text-slate-700">
                        {row.statement}
                        {row.flags.map((flag) => (
                          <p key={flag} className="text-amber-900">
                            {flag}
                          </p>
                        ))}
                      </td>
                    </tr>
                  ))
                )}
              </tbody>
            </table>
          </div>
          {preview.data.skipped.length > 0 && (
            <Notice tone="warning" title={`${preview.data.skipped.length} shift${preview.data.skipped.length === 1 ? '' : 's'} left out`}>
              <ul className="list-disc pl-5">
                {preview.data.skipped.map((skip) => (
                  <li key={`${skip.workerCode}-${skip.date}`}>
                    {skip.workerCode}, {formatCalendarDate(skip.date)}: {skip.reason}
                  </li>
                ))}
              </ul>
            </Notice>
          )}
          {preview.data.replaces.length > 0 && (
            <p className="text-sm text-slate-700">
              Computing replaces the {preview.data.replaces.length} mixture result{preview.data.replaces.length === 1 ? '' : 's'} now in the group: they are
              voided with the reason “recomputed”, never deleted.
            </p>
          )}
          {canEdit && (
            <Button
              variant="primary"
              pending={compute.isPending}
              disabled={preview.data.rows.length === 0 && preview.data.replaces.length === 0}
              onClick={async () => {
                setProblem(null);
                try {
                  const written = await compute.mutateAsync();
                  setOutcome(
                    `${written.written} mixture result${written.written === 1 ? '' : 's'} written${written.voided > 0 ? `, ${written.voided} earlier one${written.voided === 1 ? '' : 's'} voided (recomputed)` : ''}.`,
                  );
                  await preview.refetch();
                } catch (failure) {
                  setProblem(isApiError(failure) ? failure.message : 'The results could not be computed.');
                }
              }}
            >
              Compute mixture results
            </Button>
          )}
        </>
      )}
    </section>
  );
}
