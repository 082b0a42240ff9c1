import { redirect, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { meQuery } from '@frontend/features/auth/api/get-me';
import { SignInForm } from '@frontend/features/auth/components/sign-in-form';
import { CenteredPage } from '@frontend/components/centered-page';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { safeNextPath } from '@frontend/lib/safe-next';
import { queryClient } from '../query-client';

/** /sign-in?next=/orgs/1/users — someone already signed in goes straight on. */
export async function loader({ request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(meQuery());
  if (me) throw redirect(safeNextPath(new URL(request.url).searchParams.get('next')));
  return null;
}

export function Component() {
  const [searchParams] = useSearchParams();
  const navigate = useNavigate();
  const next = safeNextPath(searchParams.get('next'));

  return (
    <CenteredPage>
      <DocumentTitle title="Sign in" />
      <div className="card p-6">
        <h1 id="sign-in-title" className="text-lg">
          Sign in
        </h1>
        <p className="mt-1 mb-5 text-sm text-slate-600">Use the e-mail address your organization invited.</p>
        {searchParams.get('reset') === '1' && (
          <Notice tone="success" className="mb-4">
            Your password is changed. Sign in with the new one.
          </Notice>
        )}
        <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
      </div>
    </CenteredPage>
  );
}
