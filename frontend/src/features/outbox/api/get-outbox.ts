import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, isApiError } from '@frontend/lib/api-client';

/** One captured e-mail in the list (GET /api/outbox), newest first. */
export interface OutboxEntry {
  id: number | string;
  to: string;
  from: string;
  subject: string;
  receivedAt: string;
}

export const outboxKey = ['outbox'] as const;

/**
 * GET /api/outbox. The server answers 404 while no local e-mail capture runs (production):
 * that is "no outbox here", so it becomes null rather than an error.
 */
export async function getOutbox(signal?: AbortSignal): Promise<OutboxEntry[] | null> {
  try {
    return await api.get<OutboxEntry[]>('/api/outbox', { signal });
  } catch (error) {
    if (isApiError(error, 404)) return null;
    throw error;
  }
}

export function outboxQuery() {
  return queryOptions({ queryKey: [...outboxKey, 'list'] as const, queryFn: ({ signal }) => getOutbox(signal) });
}

/** Pass `enabled: false` for people without `outbox:read`, so they never ask. */
export function useOutbox(options: { enabled?: boolean; refetchInterval?: number } = {}) {
  return useQuery({ ...outboxQuery(), ...options });
}
