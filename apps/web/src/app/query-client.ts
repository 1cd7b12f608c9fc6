import { QueryCache, QueryClient } from '@tanstack/react-query';
import { authKeys, isMeQueryKey } from '../features/auth';
import { isApiError } from '../lib/api-client';

/**
 * The app's query cache. A 401 from any query means the session has ended: `me` becomes
 * signed-out, and the auth gate (require-auth.tsx) sends the user to sign in, remembering
 * the page. This lives here, in the app layer, not inside the fetch wrapper.
 */
export function createQueryClient(): QueryClient {
  const queryClient: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error, query) => {
        if (isApiError(error, 401) && !isMeQueryKey(query.queryKey)) queryClient.setQueryData(authKeys.me, null);
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // A 4xx will not change on its own; network trouble and 5xx may.
        retry: (failureCount, error) =>
          !(isApiError(error) && error.status >= 400 && error.status < 500) && failureCount < 2,
      },
    },
  });
  return queryClient;
}
