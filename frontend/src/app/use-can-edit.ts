import { can } from '@schema/permissions';
import { useMembership } from './use-membership';

/**
 * Whether the signed-in person may change the organization's records ('data:edit': hygienists
 * and admins). Others see the same pages without the edit controls; the server refuses anyway.
 */
export function useCanEdit(): boolean {
  return can(useMembership().role, 'data:edit');
}
