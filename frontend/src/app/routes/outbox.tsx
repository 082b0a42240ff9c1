import { data, Outlet, useParams, type LoaderFunctionArgs } from 'react-router';
import { useOutbox } from '@frontend/features/outbox/api/get-outbox';
import { OutboxList } from '@frontend/features/outbox/components/outbox-list';
import { Button } from '@frontend/components/button';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { ErrorState, LoadingState } from '@frontend/components/states';
import { canAnywhere, requireSession } from '../session';

/** /outbox — admins of any organization, and only while the local e-mail capture runs. */
export async function loader({ request }: LoaderFunctionArgs) {
  const me = await requireSession(request);
  if (!canAnywhere(me, 'outbox:read')) throw data('The outbox is for admins.', { status: 403 });
  return null;
}

export function Component() {
  const { messageId } = useParams();
  // Mail reaches the capture a moment after the request that sent it; poll while the page is open.
  const outbox = useOutbox({ refetchInterval: 3_000 });

  return (
    <>
      <DocumentTitle title="Outbox" />
      <PageHeader
        title="Outbox"
        description="E-mail this server would have sent, caught by the local capture. Only development and test set-ups have an outbox."
        actions={
          <Button size="sm" pending={outbox.isFetching && !outbox.isPending} onClick={() => outbox.refetch()}>
            Refresh
          </Button>
        }
      />
      {outbox.isPending && <LoadingState label="Loading the outbox…" />}
      {outbox.isError && <ErrorState title="Could not load the outbox" error={outbox.error} onRetry={() => outbox.refetch()} />}
      {outbox.data === null && (
        <Notice tone="info" title="No outbox on this server">
          This server sends e-mail through its mail relay, so nothing is captured here.
        </Notice>
      )}
      {outbox.data && (
        <div className="grid items-start gap-4 lg:grid-cols-[22rem_1fr]">
          <OutboxList entries={outbox.data} />
          <div>
            {messageId === undefined && outbox.data.length > 0 && <p className="px-1 py-2 text-sm text-slate-600">Choose a message to read it.</p>}
            <Outlet />
          </div>
        </div>
      )}
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
