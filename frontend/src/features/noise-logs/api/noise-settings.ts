import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { NoiseSettingsValues } from '@schema/noise-logs';
import { api, apiPath } from '@frontend/lib/api-client';
import { noiseKeys } from './get-noise-logs';

/** GET /api/orgs/:orgId/noise-settings (org:read). */
export function noiseSettingsQuery(organizationId: string) {
  return queryOptions({
    queryKey: noiseKeys.settings(organizationId),
    queryFn: ({ signal }) => api.get<NoiseSettingsValues>(`${apiPath('/api/orgs', organizationId)}/noise-settings`, { signal }),
  });
}

export function useNoiseSettings(organizationId: string) {
  return useQuery(noiseSettingsQuery(organizationId));
}

/** PUT /api/orgs/:orgId/noise-settings (settings:manage). */
export function useUpdateNoiseSettings(organizationId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (values: NoiseSettingsValues) => api.put<NoiseSettingsValues>(`${apiPath('/api/orgs', organizationId)}/noise-settings`, values),
    onSuccess: (values) => client.setQueryData(noiseKeys.settings(organizationId), values),
  });
}
