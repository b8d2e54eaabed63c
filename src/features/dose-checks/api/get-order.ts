import { z } from 'zod';
import { orderDetailSchema, type OrderDetail } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';

const orderResponseSchema = z.object({ order: orderDetailSchema });

/** One order as the signed-in person may see it: for a pharmacist before their check, without the plan. */
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
