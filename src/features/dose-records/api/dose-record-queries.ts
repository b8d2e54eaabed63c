import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { DoseRecordFilter } from '../../../../shared/schemas/reviews';
import { orderQuery } from '../../../lib/queries/orders';
import { protocolListQuery, protocolVersionQuery } from '../../../lib/queries/protocols';
import { sessionQuery } from '../../../lib/queries/sessions';
import { getDoseRecords } from './get-dose-records';

/** The dose-records feature's query keys and options, general → specific. */
export const doseRecordQueries = {
  all: () => ['dose-records'] as const,
  lists: () => [...doseRecordQueries.all(), 'list'] as const,
  list: (filter: DoseRecordFilter) =>
    queryOptions({
      queryKey: [...doseRecordQueries.lists(), filter] as const,
      queryFn: ({ signal }) => getDoseRecords(filter, { signal }),
      placeholderData: keepPreviousData,
    }),

  /** What the printed record reads from other resources: their one cache in src/lib/queries. */
  order: orderQuery,
  session: sessionQuery,
  protocolChoices: () => queryOptions({ ...protocolListQuery(), staleTime: 5 * 60_000 }),
  protocolSteps: (key: string, version: number) =>
    queryOptions({ ...protocolVersionQuery({ key, version }), staleTime: Infinity }),
};
