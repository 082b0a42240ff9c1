import { Link, useLocation } from 'react-router';
import { CenteredPage } from '@frontend/components/centered-page';
import { DocumentTitle } from '@frontend/components/document-title';

/** Any address no route claims. */
export function Component() {
  const location = useLocation();
  return (
    <CenteredPage>
      <DocumentTitle title="Page not found" />
      <div className="card p-6">
        <p className="text-sm font-semibold text-slate-500">404</p>
        <h1 className="text-lg">Page not found</h1>
        <p className="mt-2 text-sm text-slate-600">
          Nothing lives at <code className="rounded bg-slate-100 px-1 py-0.5 text-slate-800">{location.pathname}</code>. The link may be mistyped or out of
          date.
        </p>
        <p className="mt-4 text-sm">
          <Link to="/">Go to the start page</Link>
        </p>
      </div>
    </CenteredPage>
  );
}
