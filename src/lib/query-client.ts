import { QueryClient } from '@tanstack/react-query';
import { isApiRequestError } from './api-client';

/** Retrying cannot fix a refused request (4xx); it can outlast a brief network or server blip. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiRequestError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      retry: shouldRetry,
      refetchOnWindowFocus: true,
    },
    mutations: {
      // A repeated write could do something twice; the person decides whether to resend.
      retry: false,
    },
  },
});
