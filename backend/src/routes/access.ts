import type { Membership } from '@schema/organizations';
import { can } from '@schema/permissions';
import type { NameAccess } from '../services/workers';

/** Whether the caller's role may see worker names ('workerNames:read'; consultants may not). */
export function nameAccessOf(membership: Membership): NameAccess {
  return { canSeeNames: can(membership.role, 'workerNames:read') };
}
