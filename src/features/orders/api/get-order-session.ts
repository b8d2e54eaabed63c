import { api } from '../../../lib/api-client';
import { orderSessionResponseSchema, type OrderSession } from './order-response-schemas';

export async function getOrderSession(
  id: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<OrderSession> {
  return api.get(`/orders/${encodeURIComponent(String(id))}/session`, {
    schema: orderSessionResponseSchema,
    signal,
  });
}
