import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api';
import { clearOnAccountChange } from './auth';
import { noteServerError, noteServerSuccess } from './serviceStatus';

/** Only outages are worth retrying; a 4xx answer will not change by asking again. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (!isApiError(error)) return failureCount < 1;
  return [0, 502, 503, 504].includes(error.status) && failureCount < 1;
}

export function createQueryClient(): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({ onError: noteServerError, onSuccess: noteServerSuccess }),
    mutationCache: new MutationCache({ onError: noteServerError, onSuccess: noteServerSuccess }),
    defaultOptions: {
      queries: { retry: shouldRetry, staleTime: 30_000, refetchOnWindowFocus: false },
      mutations: { retry: false },
    },
  });
}

export const queryClient = createQueryClient();
clearOnAccountChange(() => queryClient.clear());
