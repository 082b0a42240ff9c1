import { redirect, type LoaderFunctionArgs } from 'react-router';
import { DocumentTitle } from '@frontend/components/document-title';
import { EmptyState } from '@frontend/components/states';
import { PageHeader } from '@frontend/components/page-header';
import { defaultMembership, requireSession, useSession } from '../session';

/** / — opens the remembered organization (or the first one) at /orgs/:orgId. */
export async function loader({ request }: LoaderFunctionArgs) {
  const me = await requireSession(request);
  const membership = defaultMembership(me);
  if (membership) throw redirect(`/orgs/${encodeURIComponent(String(membership.organizationId))}`);
  return null;
}

/** Only reached by someone with no active membership. */
export function Component() {
  const me = useSession();
  return (
    <>
      <DocumentTitle title="No organization" />
      <PageHeader title={`Welcome, ${me.user.name}`} />
      <EmptyState title="You are not a member of any organization yet">
        Ask an admin of your organization to invite {me.user.email}, or to reactivate your membership.
      </EmptyState>
    </>
  );
}
