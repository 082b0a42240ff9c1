import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { resultChangeKeys } from '@frontend/lib/query-keys';
import { noiseKeys } from './get-noise-logs';
import type { NoiseLogDetail } from './types';

export type MaskChange =
  | { kind: 'add'; startS: number; endS: number; reason: string }
  | { kind: 'change'; maskId: number; startS: number; endS: number; reason: string }
  | { kind: 'remove'; maskId: number; reason: string };

/** POST …/masks, PATCH …/masks/:maskId, POST …/masks/:maskId/remove (data:edit). Answers the log with new figures. */
export function changeNoiseMask(organizationId: string, logId: string, change: MaskChange) {
  const base = apiPath('/api/orgs', organizationId, 'noise-logs', logId, 'masks');
  if (change.kind === 'add') return api.post<NoiseLogDetail>(base, { startS: change.startS, endS: change.endS, reason: change.reason });
  if (change.kind === 'change')
    return api.patch<NoiseLogDetail>(`${base}/${change.maskId}`, { startS: change.startS, endS: change.endS, reason: change.reason });
  return api.post<NoiseLogDetail>(`${base}/${change.maskId}/remove`, { reason: change.reason });
}

/** The answer replaces the cached log at once, so the reviewed figures update without a refetch. */
export function useChangeNoiseMask(organizationId: string, logId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (change: MaskChange) => changeNoiseMask(organizationId, logId, change),
    onSuccess: (log) => {
      client.setQueryData(noiseKeys.detail(organizationId, logId), log);
      void client.invalidateQueries({ queryKey: [...noiseKeys.all(organizationId), 'list'] });
      if (log.status === 'accepted') {
        for (const key of resultChangeKeys) void client.invalidateQueries({ queryKey: key(organizationId) });
      }
    },
  });
}
