import { queryOptions } from '@tanstack/react-query';
import { getToday } from './get-today';

/** The today feature's query keys and options, general → specific. */
export const todayQueries = {
  all: () => ['today'] as const,
  worklists: () =>
    queryOptions({
      queryKey: [...todayQueries.all(), 'worklists'] as const,
      queryFn: ({ signal }) => getToday({ signal }),
      // Other people's work fills these lists: keep up without a reload, and never open on an old copy.
      refetchInterval: 30_000,
      refetchOnMount: 'always',
    }),
};
