import { QueryClient, type QueryKey } from '@tanstack/react-query';
import { ApiError } from './api-client';

export function createQueryClient() {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // A 4xx will not fix itself by asking again.
        retry: (count, error) => !(error instanceof ApiError && error.status >= 400 && error.status < 500) && count < 2,
        refetchOnWindowFocus: true,
      },
    },
  });
}

/**
 * Reads the queries under `queryKey` again from this moment, for a live room just joined: what is
 * cached, or a first load still under way, may have been read before the join. A plain invalidation
 * would wait for such a load instead (a query without data shares its running fetch), so it is
 * cancelled first.
 */
export async function readAgainFromNow(queryClient: QueryClient, queryKey: QueryKey) {
  await queryClient.cancelQueries({ queryKey });
  await queryClient.invalidateQueries({ queryKey });
}
