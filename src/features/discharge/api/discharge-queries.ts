import { queryOptions } from '@tanstack/react-query';
import { getDischarge } from './get-discharge';

/** The discharge feature's query keys and options, general → specific. */
export const dischargeQueries = {
  all: () => ['discharge'] as const,
  sheets: () => [...dischargeQueries.all(), 'sheet'] as const,
  sheet: (orderId: number) =>
    queryOptions({
      queryKey: [...dischargeQueries.sheets(), orderId] as const,
      queryFn: ({ signal }) => getDischarge(orderId, { signal }),
      // While a session still runs its record grows; afterwards a refetch changes nothing.
      refetchInterval: (query) =>
        query.state.data?.record.outcome === 'in-progress' ? 30_000 : false,
    }),
};
