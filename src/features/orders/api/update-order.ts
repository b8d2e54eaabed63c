import type { OrderDetail, OrderDraft } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './order-response-schemas';

/** Replaces a draft's content; the server refuses (409) once the order is signed. */
export async function updateOrder({ id, draft }: { id: number; draft: OrderDraft }): Promise<OrderDetail> {
  const { order } = await api.put(`/orders/${encodeURIComponent(String(id))}`, draft, { schema: orderResponseSchema });
  return order;
}
