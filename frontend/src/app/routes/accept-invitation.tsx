import { Link, useNavigate, useParams } from 'react-router';
import { roleLabels } from '@schema/permissions';
import { useInvitation } from '@frontend/features/auth/api/get-invitation';
import { AcceptInvitationForm } from '@frontend/features/auth/components/accept-invitation-form';
import { CenteredPage } from '@frontend/components/centered-page';
import { DocumentTitle } from '@frontend/components/document-title';
import { ErrorState, LoadingState } from '@frontend/components/states';
import { Notice } from '@frontend/components/notice';
import { isApiError } from '@frontend/lib/api-client';
import { rememberOrganization } from '@frontend/lib/current-organization';
import { formatDate } from '@frontend/lib/format';

/** /accept-invitation/:token — the link from the invitation e-mail. */
export function Component() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const invitation = useInvitation(token);

  return (
    <CenteredPage>
      <DocumentTitle title="Accept invitation" />
      <div className="card p-6">
        <h1 className="text-lg">Join Bellwether</h1>
        {invitation.isPending && <LoadingState label="Checking your invitation…" />}
        {invitation.isError &&
          (isApiError(invitation.error, 404) ? (
            <Notice tone="error" title="This invitation link no longer works" className="mt-4">
              It may have expired, been used already or been withdrawn. Ask the person who invited you to send a new one.
            </Notice>
          ) : (
            <ErrorState title="Could not check the invitation" error={invitation.error} onRetry={() => invitation.refetch()} className="mt-4" />
          ))}
        {invitation.data && (
          <>
            <p className="mt-1 mb-5 text-sm text-slate-600">
              You are invited to <strong className="text-slate-900">{invitation.data.organizationName}</strong> as{' '}
              <strong className="text-slate-900">{roleLabels[invitation.data.role]}</strong>. The invitation is open until{' '}
              {formatDate(invitation.data.expiresAt)}.
            </p>
            <AcceptInvitationForm
              token={token}
              email={invitation.data.email}
              onAccepted={(session) => {
                const joined = session.memberships.find((m) => m.organizationName === invitation.data.organizationName);
                if (joined) rememberOrganization(joined.organizationId);
                navigate(joined ? `/orgs/${encodeURIComponent(String(joined.organizationId))}` : '/', { replace: true });
              }}
            />
          </>
        )}
      </div>
      <p className="mt-4 text-center text-sm">
        Already have an account here? <Link to="/sign-in">Sign in</Link>
      </p>
    </CenteredPage>
  );
}
