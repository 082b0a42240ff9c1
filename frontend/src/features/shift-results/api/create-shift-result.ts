import type { ShiftResultCreate } from '@schema/shift-results';
import { api, apiPath } from '@frontend/lib/api-client';
import type { ShiftResultView } from '@frontend/lib/api-types';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { resultChangeKeys } from '@frontend/lib/query-keys';

/** A result changes the group's counts, its plan's progress, the result lists and the out-of-date marks. */
export const resultTouches = resultChangeKeys;

/**
 * POST /api/orgs/:orgId/shift-results → 201. 400 names the field (not a member on that date, a
 * date in the future, a unit that does not convert); 409 when the worker-shift already has a valid result.
 */
export function createShiftResult(organizationId: string, result: ShiftResultCreate): Promise<ShiftResultView> {
  return api.post<ShiftResultView>(`${apiPath('/api/orgs', organizationId)}/shift-results`, result);
}

export function useCreateShiftResult(organizationId: string) {
  return useOrganizationMutation(organizationId, (result: ShiftResultCreate) => createShiftResult(organizationId, result), resultTouches);
}
