import { queryOptions } from '@tanstack/react-query';
import { getSessionOrder } from './get-session-order';
import { getSessionProtocol } from './get-session-protocol';
import { getSessionState } from './get-session-state';
import { newerSessionState, type SessionState } from './session-state-schema';

/** The step clock's query keys and options, general → specific. */
export const stepClockQueries = {
  all: () => ['step-clock'] as const,
  orders: () => [...stepClockQueries.all(), 'order'] as const,
  order: (orderId: number) =>
    queryOptions({
      queryKey: [...stepClockQueries.orders(), orderId] as const,
      queryFn: ({ signal }) => getSessionOrder(orderId, { signal }),
    }),
  protocol: (key: string, version: number) =>
    queryOptions({
      queryKey: [...stepClockQueries.all(), 'protocol', key, version] as const,
      queryFn: ({ signal }) => getSessionProtocol(key, version, { signal }),
      // An approved protocol version never changes.
      staleTime: Number.POSITIVE_INFINITY,
    }),
  sessions: () => [...stepClockQueries.all(), 'session'] as const,
  session: (orderId: number) =>
    queryOptions({
      queryKey: [...stepClockQueries.sessions(), orderId] as const,
      queryFn: ({ signal }) => getSessionState(orderId, { signal }),
      // Another tablet may record taps too, and each answer re-measures the clock offset.
      refetchInterval: 15_000,
      staleTime: 5_000,
      structuralSharing: (previous, next) =>
        newerSessionState(previous as SessionState | undefined, next as SessionState),
    }),
};
