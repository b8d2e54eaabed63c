import type { OrderDetail } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './order-response-schemas';

/** Cancels an order before its session, with the reason and the version of the order read. */
export async function cancelOrder({
  id,
  reason,
  version,
}: {
  id: number;
  reason: string;
  version: number;
}): Promise<OrderDetail> {
  const { order } = await api.post(
    `/orders/${encodeURIComponent(String(id))}/cancellation`,
    { reason, version },
    { schema: orderResponseSchema },
  );
  return order;
}
