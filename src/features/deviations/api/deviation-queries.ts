import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { AuditFilter } from '../../../../shared/schemas/reviews';
import { orderQuery } from '../../../lib/queries/orders';
import { protocolListQuery, protocolVersionQuery } from '../../../lib/queries/protocols';
import { getDeviation } from './get-deviation';
import { getDeviations } from './get-deviations';

/** The deviations feature's query keys and options, general → specific. */
export const deviationQueries = {
  all: () => ['deviations'] as const,
  lists: () => [...deviationQueries.all(), 'list'] as const,
  list: (filter: AuditFilter) =>
    queryOptions({
      queryKey: [...deviationQueries.lists(), filter] as const,
      queryFn: ({ signal }) => getDeviations(filter, { signal }),
      // The current page stays on screen while the next one loads.
      placeholderData: keepPreviousData,
    }),
  details: () => [...deviationQueries.all(), 'detail'] as const,
  detail: (id: number) =>
    queryOptions({
      queryKey: [...deviationQueries.details(), id] as const,
      queryFn: ({ signal }) => getDeviation(id, { signal }),
    }),

  /** What the review screens read from other resources: their one cache in src/lib/queries. */
  order: orderQuery,
  protocolChoices: () => queryOptions({ ...protocolListQuery(), staleTime: 5 * 60_000 }),
  protocolSteps: (key: string, version: number) =>
    queryOptions({
      ...protocolVersionQuery({ key, version }),
      // An approved version never changes.
      staleTime: Infinity,
    }),
};
