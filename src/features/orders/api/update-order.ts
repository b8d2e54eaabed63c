import type { OrderDetail, OrderDraft } from '../../../../shared/schemas/orders';
import { apiRequest } from '../../../lib/api-client';
import { orderResponseSchema } from './order-response-schemas';

/** Replaces a draft's content; the server refuses (409) once the order is signed. */
export async function updateOrder({ id, draft }: { id: number; draft: OrderDraft }): Promise<OrderDetail> {
  // The shared client has no `put` shortcut, so the request is spelled out.
  const { order } = await apiRequest(`/orders/${encodeURIComponent(String(id))}`, { method: 'PUT', body: draft, schema: orderResponseSchema });
  return order;
}
