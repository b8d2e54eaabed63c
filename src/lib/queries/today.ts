import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { treatmentListSchema, type TreatmentList } from '../../../shared/schemas/lists';
import { orderSummarySchema, type OrderSummary } from '../../../shared/schemas/orders';
import { api } from '../api-client';
import { offsetFromAnswer } from '../server-clock';
import type { Fetching } from './request';

/** One cache for Today: every worklist of the person's roles, the pharmacist's included. */

const todayResponseSchema = z.object({
  lists: z.array(
    z.object({ id: z.string(), title: z.string(), orders: z.array(orderSummarySchema) }),
  ),
  /** Today's treatment lists, slots in time order (an older server sends none). */
  treatmentLists: z.array(treatmentListSchema).default([]),
  serverTime: z.string(),
});

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
