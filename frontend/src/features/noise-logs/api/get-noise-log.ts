import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { noiseKeys } from './get-noise-logs';
import type { NoiseChannelData, NoiseLogDetail } from './types';

/** GET /api/orgs/:orgId/noise-logs/:logId (org:read). */
export function getNoiseLog(organizationId: string, logId: string, signal?: AbortSignal) {
  return api.get<NoiseLogDetail>(apiPath('/api/orgs', organizationId, 'noise-logs', logId), { signal });
}

export function noiseLogQuery(organizationId: string, logId: string) {
  return queryOptions({ queryKey: noiseKeys.detail(organizationId, logId), queryFn: ({ signal }) => getNoiseLog(organizationId, logId, signal) });
}

export function useNoiseLog(organizationId: string, logId: string) {
  return useQuery(noiseLogQuery(organizationId, logId));
}

/** GET …/channels?fromS&toS&points: min/max per bucket for long windows, every interval in short ones. */
export function getNoiseChannels(organizationId: string, logId: string, window: { fromS?: number; toS?: number }, signal?: AbortSignal) {
  const query = new URLSearchParams({ points: '4000' });
  if (window.fromS !== undefined) query.set('fromS', String(Math.max(0, window.fromS)));
  if (window.toS !== undefined) query.set('toS', String(Math.max(0, window.toS)));
  return api.get<NoiseChannelData>(`${apiPath('/api/orgs', organizationId, 'noise-logs', logId)}/channels?${query}`, { signal });
}

export function useNoiseChannels(organizationId: string, logId: string, window: { fromS?: number; toS?: number }) {
  return useQuery({
    queryKey: [...noiseKeys.detail(organizationId, logId), 'channels', window.fromS ?? null, window.toS ?? null] as const,
    queryFn: ({ signal }) => getNoiseChannels(organizationId, logId, window, signal),
    placeholderData: keepPreviousData,
    staleTime: Infinity,
  });
}
