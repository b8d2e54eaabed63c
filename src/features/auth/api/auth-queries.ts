import { queryOptions } from '@tanstack/react-query';
import { getSession } from './get-session';

/** The auth feature's query keys and options; everything about the session goes through here. */
export const authQueries = {
  all: () => ['auth'] as const,
  session: () =>
    queryOptions({
      queryKey: [...authQueries.all(), 'session'] as const,
      queryFn: ({ signal }) => getSession({ signal }),
      // Re-checked when the tab regains focus, so an expired session shows sign-in promptly.
      staleTime: 60_000,
      retry: 1,
    }),
};
