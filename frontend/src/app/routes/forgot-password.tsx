import { Link } from 'react-router';
import { ForgotPasswordForm } from '@frontend/features/auth/components/forgot-password-form';
import { CenteredPage } from '@frontend/components/centered-page';
import { DocumentTitle } from '@frontend/components/document-title';

/** /forgot-password */
export function Component() {
  return (
    <CenteredPage>
      <DocumentTitle title="Forgot password" />
      <div className="card p-6">
        <h1 className="text-lg">Choose a new password</h1>
        <p className="mt-1 mb-5 text-sm text-slate-600">Enter the e-mail address you sign in with.</p>
        <ForgotPasswordForm />
      </div>
      <p className="mt-4 text-center text-sm">
        <Link to="/sign-in">Back to sign-in</Link>
      </p>
    </CenteredPage>
  );
}
