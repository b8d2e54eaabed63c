import type { OrderDetail } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './order-response-schemas';

export async function getOrder(
  id: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<OrderDetail> {
  const { order } = await api.get(`/orders/${encodeURIComponent(String(id))}`, {
    schema: orderResponseSchema,
    signal,
  });
  return order;
}
