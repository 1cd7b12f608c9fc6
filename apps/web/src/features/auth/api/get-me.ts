import { Me } from '@torquetrail/contracts';
import { type QueryClient, queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest, isApiError } from '../../../lib/api-client';
import { authKeys, isMeQueryKey } from './keys';

/** The signed-in user, or `null` when nobody is signed in (401 is an answer here, not a failure). */
async function fetchMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await apiRequest('/api/auth/me', { schema: Me, signal });
  } catch (error) {
    if (isApiError(error, 401)) return null;
    throw error;
  }
}

const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me,
    queryFn: ({ signal }) => fetchMe(signal),
    staleTime: 5 * 60_000,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}

/** Starts reading the session as the app starts, before any page's code has loaded (the router's loader). */
export function prefetchMe(queryClient: QueryClient): void {
  void queryClient.prefetchQuery(meQueryOptions());
}

/** Drops every cached reply except `me`, so no data of one session outlives it. */
export function removeAllButMe(queryClient: QueryClient): void {
  queryClient.removeQueries({
    predicate: (query) => !isMeQueryKey(query.queryKey),
  });
}
