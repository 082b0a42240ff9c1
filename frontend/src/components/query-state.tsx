import type { UseQueryResult } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { ErrorState, LoadingState } from './states';

/**
 * Loading, failed or ready: the three states every fetched section has. Shows the spinner on the
 * first load, the server's message with "Try again" on failure, and `children(data)` once there
 * is data (a later refetch keeps the old data on screen).
 */
export function QueryState<Data>({
  query,
  loading,
  errorTitle,
  children,
}: {
  query: UseQueryResult<Data>;
  loading: string;
  errorTitle: string;
  children: (data: Data) => ReactNode;
}) {
  if (query.data !== undefined) return <>{children(query.data)}</>;
  if (query.isError) return <ErrorState title={errorTitle} error={query.error} onRetry={() => query.refetch()} />;
  return <LoadingState label={loading} />;
}
