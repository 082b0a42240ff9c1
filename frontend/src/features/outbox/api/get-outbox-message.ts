import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { outboxKey, type OutboxEntry } from './get-outbox';

export interface OutboxMessage extends OutboxEntry {
  text: string | null;
  html: string | null;
  /** Attached files by name, type and size (bytes); the capture keeps their content. */
  attachments?: Array<{ filename: string; contentType: string; size: number }>;
}

/** GET /api/outbox/:id. */
export function getOutboxMessage(messageId: string, signal?: AbortSignal): Promise<OutboxMessage> {
  return api.get<OutboxMessage>(apiPath('/api/outbox', messageId), { signal });
}

export function outboxMessageQuery(messageId: string) {
  return queryOptions({
    queryKey: [...outboxKey, 'message', messageId] as const,
    queryFn: ({ signal }) => getOutboxMessage(messageId, signal),
    staleTime: Infinity, // a captured message never changes
  });
}

export function useOutboxMessage(messageId: string) {
  return useQuery(outboxMessageQuery(messageId));
}
