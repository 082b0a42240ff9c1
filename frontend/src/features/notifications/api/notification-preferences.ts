import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { NotificationPreferencesUpdate, NotificationPreferencesView } from '@schema/notifications';
import { api } from '@frontend/lib/api-client';

const preferencesKey = ['me', 'notification-preferences'] as const;

/** GET /api/me/notification-preferences (any signed-in user). */
export function notificationPreferencesQuery() {
  return queryOptions({
    queryKey: preferencesKey,
    queryFn: ({ signal }) => api.get<NotificationPreferencesView>('/api/me/notification-preferences', { signal }),
  });
}

export function useNotificationPreferences() {
  return useQuery(notificationPreferencesQuery());
}

/** PUT /api/me/notification-preferences; the answer is the whole view, kept as the cache. */
export function useUpdateNotificationPreferences() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (update: NotificationPreferencesUpdate) => api.put<NotificationPreferencesView>('/api/me/notification-preferences', update),
    onSuccess: (view) => client.setQueryData(preferencesKey, view),
  });
}
