import { useParams } from 'react-router';
import { sameId, type Membership } from '@frontend/features/auth/api/get-me';
import { ApiError } from '@frontend/lib/api-client';
import { useSession } from './session';

/** The signed-in person's membership in the organization of the URL (/orgs/:orgId/…). */
export function useMembership(): Membership & { organizationKey: string } {
  const { orgId = '' } = useParams();
  const me = useSession();
  const membership = me.memberships.find((m) => sameId(m.organizationId, orgId));
  // The /orgs/:orgId loader already refused non-members; this guards a membership lost since.
  if (!membership) throw new ApiError(404, 'not_found', 'No organization with this address is open to you.');
  return { ...membership, organizationKey: orgId };
}
