import type { NoiseEstimateParsed, NoiseEstimateView } from '@schema/noise-estimates';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

const touches = [orgKeys.noiseEstimates];

/** POST …/exposure-groups/:groupId/noise-estimates (new) or PUT …/noise-estimates/:id (replace the inputs). */
export function saveNoiseEstimate(
  organizationId: string,
  groupId: number,
  estimateId: number | null,
  estimate: NoiseEstimateParsed,
): Promise<NoiseEstimateView> {
  return estimateId === null
    ? api.post<NoiseEstimateView>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId)}/noise-estimates`, estimate)
    : api.put<NoiseEstimateView>(apiPath('/api/orgs', organizationId, 'noise-estimates', estimateId), estimate);
}

export function useSaveNoiseEstimate(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ groupId, estimateId, estimate }: { groupId: number; estimateId: number | null; estimate: NoiseEstimateParsed }) =>
      saveNoiseEstimate(organizationId, groupId, estimateId, estimate),
    touches,
  );
}

/** POST …/noise-estimates/:id/archive with { archived }. */
export function useArchiveNoiseEstimate(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ estimateId, archived }: { estimateId: number; archived: boolean }) =>
      api.post<NoiseEstimateView>(`${apiPath('/api/orgs', organizationId, 'noise-estimates', estimateId)}/archive`, { archived }),
    touches,
  );
}
