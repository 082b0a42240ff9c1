import { useMutation, useQueryClient, type QueryKey } from '@tanstack/react-query';
import { api } from './api-client';

/**
 * A write to the organization's records that, once it succeeds, refreshes every cached list the
 * change can show up in (keys from query-keys.ts). The endpoint files state which keys they
 * touch; the pages never refresh by hand.
 */
export function useOrganizationMutation<Variables, Result>(
  organizationId: string,
  mutationFn: (variables: Variables) => Promise<Result>,
  touches: ReadonlyArray<(organizationId: string) => QueryKey>,
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: () => Promise.all(touches.map((key) => queryClient.invalidateQueries({ queryKey: key(organizationId) }))),
  });
}

/** POST …/archive or …/unarchive with the optional reason (every archivable record answers the same way). */
export function setArchived<Result>(recordPath: string, archived: boolean, reason: string | undefined): Promise<Result> {
  return api.post<Result>(`${recordPath}/${archived ? 'archive' : 'unarchive'}`, reason ? { reason } : {});
}
