import { useState } from 'react';
import { Link, useLocation, useParams, type LoaderFunctionArgs } from 'react-router';
import { useExposureGroupChoices } from '@frontend/features/exposure-groups/api/get-exposure-groups';
import type { LabImportCommitted } from '@frontend/features/lab-import/api/commit-lab-import';
import { useLabImport } from '@frontend/features/lab-import/api/get-lab-import';
import { FilePreview } from '@frontend/features/lab-import/components/file-preview';
import { ImportSummary } from '@frontend/features/lab-import/components/import-summary';
import { MappingForm } from '@frontend/features/lab-import/components/mapping-form';
import { useShiftResults } from '@frontend/features/shift-results/api/get-shift-results';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { formatDateTime } from '@frontend/lib/format';
import { requirePermission } from '../session';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/lab-imports/:batchId — preview, column mapping, check and commit of one uploaded file. */
export async function loader(args: LoaderFunctionArgs) {
  return requirePermission(args, 'data:edit');
}

function formatBytes(bytes: number): string {
  return bytes < 1024 ? `${bytes} bytes` : bytes < 1024 * 1024 ? `${(bytes / 1024).toFixed(1)} kB` : `${(bytes / 1024 / 1024).toFixed(2)} MB`;
}

export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const { batchId = '' } = useParams();
  const location = useLocation();
  const warnings = (location.state as { warnings?: string[] } | null)?.warnings ?? [];
  const upload = useLabImport(organizationId, batchId);
  const groups = useExposureGroupChoices(organizationId);
  const [committed, setCommitted] = useState<LabImportCommitted | null>(null);
  const isCommitted = committed !== null || upload.data?.batch.status === 'committed';
  // A file imported earlier (opened again later): its results, to list where they went.
  const stored = useShiftResults(organizationId, `importBatchId=${encodeURIComponent(batchId)}&pageSize=200&sort=date`);
  const base = `/orgs/${encodeURIComponent(organizationId)}`;

  return (
    <>
      <DocumentTitle title={`${upload.data?.batch.fileName ?? 'Lab file'} · Import lab results`} />
      <PageHeader
        eyebrow={
          <Link to={`${base}/lab-imports`} className="underline">
            Import lab results
          </Link>
        }
        title={upload.data?.batch.fileName ?? 'Lab file'}
        description={
          upload.data &&
          `${upload.data.batch.rowCount} rows · ${formatBytes(upload.data.batch.fileSize)} · uploaded ${formatDateTime(upload.data.batch.createdAt)} · SHA-256 ${upload.data.batch.sha256.slice(0, 16)}…`
        }
      />
      <QueryState query={upload} loading="Reading the file…" errorTitle="Could not load the lab file">
        {(data) => (
          <div className="space-y-6">
            {warnings.map((warning) => (
              <Notice key={warning} tone="warning">
                {warning}
              </Notice>
            ))}
            {isCommitted ? (
              <ImportSummary organizationId={organizationId} batch={committed?.batch ?? data.batch} results={committed?.results ?? stored.data?.items ?? []} />
            ) : (
              <>
                <FilePreview preview={data.preview} />
                {groups.data ? (
                  <MappingForm
                    organizationId={organizationId}
                    batch={data.batch}
                    preview={data.preview}
                    groups={groups.data.items.map((group) => ({ id: group.id, name: group.name, siteName: group.siteName, unit: group.oelUnit }))}
                    onCommitted={(result) => {
                      setCommitted(result);
                      window.scrollTo({ top: 0 });
                    }}
                  />
                ) : (
                  <QueryState query={groups} loading="Loading exposure groups…" errorTitle="Could not load the exposure groups">
                    {() => null}
                  </QueryState>
                )}
              </>
            )}
          </div>
        )}
      </QueryState>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
