import { queryOptions } from '@tanstack/react-query';
import { orderKeys, orderQuery } from '../../../lib/queries/orders';
import { protocolVersionQuery } from '../../../lib/queries/protocols';
import { todayQuery, type Today } from '../../../lib/queries/today';
import { drugParameters } from './get-protocol-drug';

/** The pharmacist's part of Today: orders to check, to prepare, and already prepared. */
export type PharmacyWorklists = {
  waitingForCheck: Today['lists'][number]['orders'];
  waitingForPreparation: Today['lists'][number]['orders'];
  prepared: Today['lists'][number]['orders'];
  /** Server clock minus this device's clock, in ms; countdowns add it to Date.now(). */
  clockOffsetMs: number;
};

function pharmacyWorklists({ lists, clockOffsetMs }: Today): PharmacyWorklists {
  const pick = (id: string) => lists.find((list) => list.id === id)?.orders ?? [];
  return {
    waitingForCheck: pick('pharmacist-checks'),
    waitingForPreparation: pick('pharmacist-preparation'),
    prepared: pick('pharmacist-prepared'),
    clockOffsetMs,
  };
}

/**
 * The dose-checks feature's queries, composed from the one cache per resource in src/lib/queries:
 * the worklists are the pharmacist's part of Today, the order is the one cached order.
 */
export const doseCheckQueries = {
  worklists: () =>
    queryOptions({
      ...todayQuery(),
      select: pharmacyWorklists,
      // Orders arrive as clinicians sign them; the list keeps up without a reload.
      refetchInterval: 60_000,
    }),
  orders: orderKeys.details,
  order: orderQuery,
  protocolDrug: (key: string, version: number) =>
    queryOptions({
      ...protocolVersionQuery({ key, version }),
      select: drugParameters,
      // An approved protocol version never changes.
      staleTime: Number.POSITIVE_INFINITY,
    }),
};
