import { z } from 'zod';
import { orderSummarySchema, type OrderSummary } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';

const todayResponseSchema = z.object({
  lists: z.array(
    z.object({ id: z.string(), title: z.string(), orders: z.array(orderSummarySchema) }),
  ),
  serverTime: z.string(),
});

export type PharmacyWorklists = {
  waitingForCheck: OrderSummary[];
  waitingForPreparation: OrderSummary[];
  prepared: OrderSummary[];
  /** Server clock minus this device's clock, in ms; countdowns add it to Date.now(). */
  clockOffsetMs: number;
};

/** The pharmacist's part of Today: orders to check, to prepare, and already prepared. */
export async function getPharmacyWorklists({
  signal,
}: { signal?: AbortSignal } = {}): Promise<PharmacyWorklists> {
  const sentAtMs = Date.now();
  const { lists, serverTime } = await api.get('/today', { schema: todayResponseSchema, signal });
  const receivedAtMs = Date.now();
  const pick = (id: string) => lists.find((list) => list.id === id)?.orders ?? [];
  // The server read its clock somewhere between sending and receiving; the midpoint is the best guess.
  const serverMs = Date.parse(serverTime);
  return {
    waitingForCheck: pick('pharmacist-checks'),
    waitingForPreparation: pick('pharmacist-preparation'),
    prepared: pick('pharmacist-prepared'),
    clockOffsetMs: Number.isNaN(serverMs) ? 0 : serverMs - (sentAtMs + receivedAtMs) / 2,
  };
}
