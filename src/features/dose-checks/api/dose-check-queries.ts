import { queryOptions } from '@tanstack/react-query';
import { getOrder } from './get-order';
import { getPharmacyWorklists } from './get-pharmacy-worklists';
import { getProtocolDrug } from './get-protocol-drug';

/** The dose-checks feature's query keys and options, general → specific. */
export const doseCheckQueries = {
  all: () => ['dose-checks'] as const,
  worklists: () =>
    queryOptions({
      queryKey: [...doseCheckQueries.all(), 'worklists'] as const,
      queryFn: ({ signal }) => getPharmacyWorklists({ signal }),
      // Orders arrive as clinicians sign them; the list keeps up without a reload.
      refetchInterval: 60_000,
    }),
  orders: () => [...doseCheckQueries.all(), 'order'] as const,
  order: (id: number) =>
    queryOptions({
      queryKey: [...doseCheckQueries.orders(), id] as const,
      queryFn: ({ signal }) => getOrder(id, { signal }),
    }),
  protocolDrug: (key: string, version: number) =>
    queryOptions({
      queryKey: [...doseCheckQueries.all(), 'protocol', key, version] as const,
      queryFn: ({ signal }) => getProtocolDrug(key, version, { signal }),
      // An approved protocol version never changes.
      staleTime: Number.POSITIVE_INFINITY,
    }),
};
