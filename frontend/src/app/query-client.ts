import { meKey } from '@frontend/features/auth/api/get-me';
import { createQueryClient } from '@frontend/lib/query-client';

/**
 * The app's one query client. Route loaders read it (they run outside React), components
 * reach it through QueryClientProvider. A 401 on any query means the session ended: marking
 * the person signed out makes the session layout send them to the sign-in page.
 */
export const queryClient = createQueryClient(() => {
  queryClient.setQueryData(meKey, null);
});
