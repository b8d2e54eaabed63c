import { queryOptions } from '@tanstack/react-query';
import { orderKeys, orderQuery } from '../../../lib/queries/orders';
import { protocolVersionQuery } from '../../../lib/queries/protocols';
import { sessionKeys, sessionQuery } from '../../../lib/queries/sessions';

/**
 * The step clock's queries, composed from the one cache per resource in src/lib/queries: the
 * order and the session here are the ones the order's screen and the printed record show.
 */
export const stepClockQueries = {
  orders: orderKeys.details,
  order: orderQuery,
  protocol: (key: string, version: number) =>
    queryOptions({
      ...protocolVersionQuery({ key, version }),
      select: (found) => found.definition,
      // An approved protocol version never changes.
      staleTime: Number.POSITIVE_INFINITY,
    }),
  sessions: sessionKeys.all,
  session: (orderId: number) =>
    queryOptions({
      ...sessionQuery(orderId),
      // Another tablet may record taps too, and each answer re-measures the clock offset.
      refetchInterval: 15_000,
      staleTime: 5_000,
    }),
};
