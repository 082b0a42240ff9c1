import { api, apiPath } from '@frontend/lib/api-client';
import type { ShiftResultView } from '@frontend/lib/api-types';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { resultTouches } from './create-shift-result';

/**
 * POST /api/orgs/:orgId/shift-results/:resultId/void | restore `{ reason }`. Nothing is deleted:
 * a void result stays, marked, with the reason; restoring needs a reason too. 409 when restoring
 * would make a second valid result for the same worker-shift.
 */
export function changeResultStatus(organizationId: string, resultId: number, action: 'void' | 'restore', reason: string): Promise<ShiftResultView> {
  return api.post<ShiftResultView>(`${apiPath('/api/orgs', organizationId, 'shift-results', resultId)}/${action}`, { reason });
}

export function useChangeResultStatus(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ resultId, action, reason }: { resultId: number; action: 'void' | 'restore'; reason: string }) =>
      changeResultStatus(organizationId, resultId, action, reason),
    resultTouches,
  );
}
