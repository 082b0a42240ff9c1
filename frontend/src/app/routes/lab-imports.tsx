import { useState } from 'react';
import { useNavigate, type LoaderFunctionArgs } from 'react-router';
import { useLabImports } from '@frontend/features/lab-import/api/get-lab-imports';
import { importProblems, type LabImportProblem } from '@frontend/features/lab-import/api/types';
import { useUploadLabFile } from '@frontend/features/lab-import/api/upload-lab-file';
import { ImportProblems } from '@frontend/features/lab-import/components/import-problems';
import { LabFileDrop } from '@frontend/features/lab-import/components/lab-file-drop';
import { LabImportsTable } from '@frontend/features/lab-import/components/lab-imports-table';
import { DocumentTitle } from '@frontend/components/document-title';
import { SearchField } from '@frontend/components/search-field';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { listQueryString, useListParams } from '@frontend/lib/list-params';
import { requirePermission } from '../session';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/lab-imports — upload a lab results file (data:edit), and the files uploaded before. */
export async function loader(args: LoaderFunctionArgs) {
  return requirePermission(args, 'data:edit');
}

export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const navigate = useNavigate();
  const upload = useUploadLabFile(organizationId);
  const params = useListParams({ defaultSort: '-createdAt', sortFields: ['createdAt'], defaultPageSize: 10 });
  const history = useLabImports(organizationId, listQueryString(params));
  const [refused, setRefused] = useState<{ fileName: string; problems: LabImportProblem[] } | null>(null);
  const [failure, setFailure] = useState<string | null>(null);

  function send(file: File) {
    setRefused(null);
    setFailure(null);
    upload.mutate(file, {
      onSuccess: (uploaded) => navigate(String(uploaded.batch.id), { state: { warnings: uploaded.warnings ?? [] } }),
      onError: (error) => {
        const problems = importProblems(error);
        if (problems) setRefused({ fileName: file.name, problems });
        else setFailure(error.message);
      },
    });
  }

  return (
    <>
      <DocumentTitle title={`Import lab results · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Import lab results"
        description="Upload the lab's CSV, check how its columns map to shift results, and import. Nothing is stored until every row is right."
      />
      <div className="space-y-4">
        <LabFileDrop onFile={send} busy={upload.isPending} />
        {refused && <ImportProblems problems={refused.problems} title={`“${refused.fileName}” could not be read`} />}
        {failure && <Notice tone="error">{failure}</Notice>}
        <section aria-labelledby="history-title" className="space-y-3 pt-4">
          <h2 id="history-title" className="text-base">
            Files uploaded before
          </h2>
          <div role="search" aria-label="Search lab files">
            <SearchField label="Search file name or SHA-256" value={params.q} onSearch={(q) => params.update({ q }, { replace: true })} />
          </div>
          <QueryState query={history} loading="Loading lab files…" errorTitle="Could not load the lab files">
            {(page) => <LabImportsTable organizationId={organizationId} page={page} params={params} busy={history.isPlaceholderData} />}
          </QueryState>
        </section>
      </div>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
