import { Link, useNavigate, useParams } from 'react-router';
import { ResetPasswordForm } from '@frontend/features/auth/components/reset-password-form';
import { CenteredPage } from '@frontend/components/centered-page';
import { DocumentTitle } from '@frontend/components/document-title';

/** /reset-password/:token — the link from the reset e-mail. */
export function Component() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  return (
    <CenteredPage>
      <DocumentTitle title="New password" />
      <div className="card p-6">
        <h1 className="text-lg">Choose a new password</h1>
        <p className="mt-1 mb-5 text-sm text-slate-600">The link in your e-mail works once; after saving, sign in with the new password.</p>
        <ResetPasswordForm token={token} onDone={() => navigate('/sign-in?reset=1', { replace: true })} />
      </div>
      <p className="mt-4 text-center text-sm">
        <Link to="/sign-in">Back to sign-in</Link>
      </p>
    </CenteredPage>
  );
}
