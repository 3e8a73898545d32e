import { QueryClient } from '@tanstack/react-query';

import { isApiError } from './api-error';
import { STALE } from './stale-times';

/** Retries only what can heal by itself (network, 5xx); a 4xx answer will not change on retry. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: { staleTime: STALE.seconds.thirty, retry: shouldRetry, refetchOnWindowFocus: true },
      mutations: { retry: false },
    },
  });
}
