import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { resultChangeKeys } from '@frontend/lib/query-keys';
import { noiseKeys } from './get-noise-logs';
import type { NoiseLogDetail } from './types';

/** POST /api/orgs/:orgId/noise-logs/:logId/accept (data:edit): the log becomes the worker's shift result. */
export function acceptNoiseLog(organizationId: string, logId: string) {
  return api.post<NoiseLogDetail>(`${apiPath('/api/orgs', organizationId, 'noise-logs', logId)}/accept`);
}

export function useAcceptNoiseLog(organizationId: string, logId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => acceptNoiseLog(organizationId, logId),
    onSuccess: (log) => {
      client.setQueryData(noiseKeys.detail(organizationId, logId), log);
      void client.invalidateQueries({ queryKey: noiseKeys.all(organizationId) });
      for (const key of resultChangeKeys) void client.invalidateQueries({ queryKey: key(organizationId) });
    },
  });
}
