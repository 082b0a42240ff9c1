import { useEffect } from 'react';
import { Outlet, useParams, type LoaderFunctionArgs } from 'react-router';
import { rememberOrganization } from '@frontend/lib/current-organization';
import { requireMembership } from '../session';

/** /orgs/:orgId — checks membership (404 otherwise) and remembers the organization for next time. */
export async function loader(args: LoaderFunctionArgs) {
  return requireMembership(args);
}

export function Component() {
  const { orgId = '' } = useParams();
  useEffect(() => rememberOrganization(orgId), [orgId]);
  return <Outlet />;
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
