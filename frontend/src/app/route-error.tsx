import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { CenteredPage } from '@frontend/components/centered-page';
import { DocumentTitle } from '@frontend/components/document-title';
import { isApiError } from '@frontend/lib/api-client';

interface Explained {
  status: number | null;
  title: string;
  message: string;
}

/** Turns whatever a loader or render threw into words for the reader. */
function explain(error: unknown): Explained {
  const status = isRouteErrorResponse(error) ? error.status : isApiError(error) ? error.status : null;
  const detail = isRouteErrorResponse(error) ? (typeof error.data === 'string' ? error.data : error.statusText) : error instanceof Error ? error.message : '';
  if (status === 404) return { status, title: 'Not found', message: detail || 'Nothing lives at this address, or it is not open to you.' };
  if (status === 403) return { status, title: 'Not available to your role', message: detail || 'Your role does not include this page.' };
  if (status === 401) return { status, title: 'Signed out', message: 'Your session ended. Sign in again to continue.' };
  return {
    status,
    title: 'Something went wrong',
    message: detail || 'The page could not be shown. Reload it; if this keeps happening, tell your admin what you were doing.',
  };
}

function ErrorBody({ explained }: { explained: Explained }) {
  return (
    <div role="alert" className="card p-6">
      {explained.status !== null && <p className="text-sm font-semibold text-slate-500">{explained.status}</p>}
      <h1 className="text-lg">{explained.title}</h1>
      <p className="mt-2 text-sm text-slate-700">{explained.message}</p>
      <p className="mt-4 flex gap-4 text-sm">
        <Link to="/">Go to the start page</Link>
        {explained.status === null && (
          <button type="button" className="text-primary-700 underline-offset-2 hover:underline" onClick={() => window.location.reload()}>
            Reload this page
          </button>
        )}
      </p>
    </div>
  );
}

/** Error boundary for pages inside the signed-in frame: the sidebar stays, the page shows the problem. */
export function RouteErrorBoundary() {
  const explained = explain(useRouteError());
  return (
    <div className="max-w-xl">
      <DocumentTitle title={explained.title} />
      <ErrorBody explained={explained} />
    </div>
  );
}

/** Last-resort boundary for the whole app (the frame itself failed). */
export function RootErrorBoundary() {
  const explained = explain(useRouteError());
  return (
    <CenteredPage>
      <DocumentTitle title={explained.title} />
      <ErrorBody explained={explained} />
    </CenteredPage>
  );
}
