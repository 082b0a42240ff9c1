import { evidencePackUrl } from '../api/get-evidence-pack';

/**
 * Download links for an approved record's evidence pack: the zip (PDF, data.csv, record.json and the files that
 * make it checkable) as the main action, the PDF alone beside it. The page shows this only to roles with
 * evidence:export and only for approved (or later superseded) records; the server checks both again.
 */
export function EvidencePackLinks({ organizationId, recordId }: { organizationId: string; recordId: number }) {
  return (
    <section aria-labelledby="evidence-pack-title" className="flex flex-wrap items-center gap-3 rounded-md border border-slate-200 bg-white p-4">
      <div className="mr-auto">
        <h2 id="evidence-pack-title" className="text-base">
          Evidence pack
        </h2>
        <p className="text-sm text-slate-600">
          A PDF of this record with its charts, the data as CSV and the full record as JSON, in one zip. The README inside says how to recompute every figure.
        </p>
      </div>
      <a
        href={evidencePackUrl(organizationId, recordId, 'zip')}
        download
        className="bg-primary-700 hover:bg-primary-800 border-primary-800 inline-flex items-center rounded border px-3 py-1.5 text-sm font-medium whitespace-nowrap text-white no-underline hover:no-underline"
      >
        Download evidence pack
      </a>
      <a href={evidencePackUrl(organizationId, recordId, 'pdf')} download className="text-sm">
        PDF only
      </a>
    </section>
  );
}
