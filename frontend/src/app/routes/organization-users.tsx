import type { LoaderFunctionArgs } from 'react-router';
import { useInvitations } from '@frontend/features/users/api/get-invitations';
import { useMembers } from '@frontend/features/users/api/get-members';
import { InviteForm } from '@frontend/features/users/components/invite-form';
import { MembersTable } from '@frontend/features/users/components/members-table';
import { PendingInvitations } from '@frontend/features/users/components/pending-invitations';
import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { ErrorState, LoadingState } from '@frontend/components/states';
import { requirePermission, useSession } from '../session';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/users — admins only (users:manage); others get the 403 page. */
export async function loader(args: LoaderFunctionArgs) {
  return requirePermission(args, 'users:manage');
}

export function Component() {
  const me = useSession();
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const members = useMembers(organizationId);
  const invitations = useInvitations(organizationId);

  return (
    <>
      <DocumentTitle title={`People · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="People"
        description="Who can sign in to this organization, with which role. Deactivated people keep their history but cannot sign in here."
      />

      <section aria-labelledby="members-title" className="mb-8">
        <h2 id="members-title" className="mb-2 text-base">
          Members
        </h2>
        {members.isPending && <LoadingState label="Loading members…" />}
        {members.isError && <ErrorState title="Could not load the members" error={members.error} onRetry={() => members.refetch()} />}
        {members.data && <MembersTable organizationId={organizationId} members={members.data} currentUserId={me.user.id} />}
      </section>

      <section className="card mb-8 p-4">
        <InviteForm organizationId={organizationId} />
      </section>

      <section aria-labelledby="invitations-title">
        <h2 id="invitations-title" className="mb-2 text-base">
          Open invitations
        </h2>
        {invitations.isPending && <LoadingState label="Loading invitations…" />}
        {invitations.isError && <ErrorState title="Could not load the invitations" error={invitations.error} onRetry={() => invitations.refetch()} />}
        {invitations.data && <PendingInvitations organizationId={organizationId} invitations={invitations.data} />}
      </section>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
