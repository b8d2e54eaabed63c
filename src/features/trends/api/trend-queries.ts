import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { protocolListQuery } from '../../../lib/queries/protocols';
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
  /** The protocol filter reads the one protocol list (src/lib/queries/protocols.ts). */
  protocolChoices: () => queryOptions({ ...protocolListQuery(), staleTime: 5 * 60_000 }),
};
