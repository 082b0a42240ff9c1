import { QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

/**
 * Builds the app's query client. Cached answers show at once and are read again whenever a
 * page mounts or the window regains focus (TanStack's defaults, kept on purpose: other people
 * change members and invitations while a page is open). Client errors (4xx) are answers, not
 * hiccups: retrying them only delays the message, so only network failures and 5xx are
 * retried, once.
 * `onUnauthorized` runs when any query meets a 401 (the session ended while the page was open).
 */
export function createQueryClient(onUnauthorized: () => void): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (isApiError(error, 401)) onUnauthorized();
      },
    }),
    defaultOptions: {
      queries: {
        retry: (failureCount, error) => {
          if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
          return failureCount < 1;
        },
      },
      mutations: { retry: false },
    },
  });
}
