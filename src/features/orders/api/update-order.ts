import type { OrderDetail, OrderDraft } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './order-response-schemas';

/** Replaces a draft's content; the server refuses (409) once the order is signed or changed since `version` was read. */
export async function updateOrder({
  id,
  draft,
  version,
}: {
  id: number;
  draft: OrderDraft;
  version: number;
}): Promise<OrderDetail> {
  const { order } = await api.put(
    `/orders/${encodeURIComponent(String(id))}`,
    { ...draft, version },
    { schema: orderResponseSchema },
  );
  return order;
}
