import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { getProtocolChoices } from './get-protocol-choices';
import { getTrends, type TrendFilter } from './get-trends';

/** The trends feature's query keys and options, general → specific. */
export const trendQueries = {
  all: () => ['trends'] as const,
  months: (filter: TrendFilter) =>
    queryOptions({
      queryKey: [...trendQueries.all(), 'months', filter] as const,
      queryFn: ({ signal }) => getTrends(filter, { signal }),
      placeholderData: keepPreviousData,
    }),
  protocolChoices: () =>
    queryOptions({
      queryKey: [...trendQueries.all(), 'protocol-choices'] as const,
      queryFn: ({ signal }) => getProtocolChoices({ signal }),
      staleTime: 5 * 60_000,
    }),
};
