import { redirect, type LoaderFunctionArgs } from 'react-router';
import { defaultMembership, requireSession } from '../session';

/** /users — a short address for the current organization's people page. */
export async function loader({ request }: LoaderFunctionArgs) {
  const me = await requireSession(request);
  const membership = defaultMembership(me);
  throw redirect(membership ? `/orgs/${encodeURIComponent(String(membership.organizationId))}/users` : '/');
}
