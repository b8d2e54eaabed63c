import { queryOptions } from '@tanstack/react-query';
import { deviationKeys, deviationListQuery, deviationQuery } from '../../../lib/queries/deviations';
import { orderQuery } from '../../../lib/queries/orders';
import { protocolListQuery, protocolVersionQuery } from '../../../lib/queries/protocols';

/** The deviations feature's queries, composed from the one cache per resource in src/lib/queries. */
export const deviationQueries = {
  all: deviationKeys.all,
  lists: deviationKeys.lists,
  list: deviationListQuery,
  details: deviationKeys.details,
  detail: deviationQuery,

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
