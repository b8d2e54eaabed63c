import { queryOptions } from '@tanstack/react-query';
import type { TreatmentList } from '../../../shared/schemas/lists';
import type { OrderSummary } from '../../../shared/schemas/orders';
import { api, lazySchema } from '../api-client';
import { offsetFromAnswer } from '../server-clock';
import type { Fetching } from './request';

/** One cache for Today: every worklist of the person's roles, the pharmacist's included. */

// The answer's schema (zod and the order and list schemas) loads with the request, not with Today.
const todayResponseSchema = lazySchema(() =>
  import('./today-schema').then((m) => m.todayResponseSchema),
);

export type Worklist = { id: string; title: string; orders: OrderSummary[] };

export type Today = {
  /** One list per duty of the roles the person holds, in the server's order. */
  lists: Worklist[];
  treatmentLists: TreatmentList[];
  /** Server clock minus this device's clock, in ms; countdowns add it to Date.now(). */
  clockOffsetMs: number;
};

export const todayKeys = {
  all: () => ['today'] as const,
};

export async function getToday({ signal }: Fetching = {}): Promise<Today> {
  const sentAtMs = Date.now();
  const { lists, treatmentLists, serverTime } = await api.get('/today', {
    schema: todayResponseSchema,
    signal,
  });
  return {
    lists,
    treatmentLists,
    clockOffsetMs: offsetFromAnswer(serverTime, sentAtMs, Date.now()) ?? 0,
  };
}

export const todayQuery = () =>
  queryOptions({
    queryKey: todayKeys.all(),
    queryFn: ({ signal }) => getToday({ signal }),
    // Other people's work fills these lists: keep up without a reload.
    refetchInterval: 30_000,
  });
