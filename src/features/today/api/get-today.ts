import { z } from 'zod';
import { orderSummarySchema, type OrderSummary } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';

const todayResponseSchema = z.object({
  lists: z.array(
    z.object({ id: z.string(), title: z.string(), orders: z.array(orderSummarySchema) }),
  ),
  serverTime: z.string(),
});

export type Worklist = { id: string; title: string; orders: OrderSummary[] };

export type Today = {
  /** One list per duty of the roles the person holds, in the server's order. */
  lists: Worklist[];
  /** Server clock minus this device's clock, in ms; countdowns add it to Date.now(). */
  clockOffsetMs: number;
};

export async function getToday({ signal }: { signal?: AbortSignal } = {}): Promise<Today> {
  const sentAtMs = Date.now();
  const { lists, serverTime } = await api.get('/today', { schema: todayResponseSchema, signal });
  const receivedAtMs = Date.now();
  // The server read its clock somewhere between sending and receiving; the midpoint is the best guess.
  const serverMs = Date.parse(serverTime);
  return {
    lists,
    clockOffsetMs: Number.isNaN(serverMs) ? 0 : serverMs - (sentAtMs + receivedAtMs) / 2,
  };
}
