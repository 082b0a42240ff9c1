import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { MembershipView } from '@schema/organizations';
import type { UserPublic } from '@schema/users';
import { api, isApiError } from '@frontend/lib/api-client';

/** Ids are numbers in JSON and strings in URLs; pages compare them with `sameId`. */
export type Id = number | string;

/** The wire shapes come from schema/ (type-only imports: no database code reaches the browser). */
export type SessionUser = UserPublic;

/** One organization the person belongs to, with their role there (GET /api/me). */
export type Membership = MembershipView;

export interface Me {
  user: SessionUser;
  memberships: Membership[];
}

/** GET /api/me. A 401 is an answer here, not a failure: it means "signed out" → null. */
export async function getMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await api.get<Me>('/api/me', { signal });
  } catch (error) {
    if (isApiError(error, 401)) return null;
    throw error;
  }
}

export function meQuery() {
  return queryOptions({ queryKey: ['me'] as const, queryFn: ({ signal }) => getMe(signal), staleTime: 60_000 });
}

/** The cache key of /api/me, typed so `setQueryData(meKey, …)` checks the value. */
export const meKey = meQuery().queryKey;

/** The signed-in person and their memberships, or null when signed out. */
export function useMe() {
  return useQuery(meQuery());
}

/** Whether two ids name the same record, whatever their JSON type. */
export function sameId(a: Id | null | undefined, b: Id | null | undefined): boolean {
  return a !== null && a !== undefined && b !== null && b !== undefined && String(a) === String(b);
}

/**
 * Drops every cached answer except /api/me itself, whose observers (the session layout)
 * must see the next value rather than be left holding a removed query.
 */
export function forgetEverythingButMe(queryClient: QueryClient): void {
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== meKey[0] });
}
