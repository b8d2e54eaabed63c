import { z } from 'zod';
import { cancelledOrderNoticeSchema, type OrderDetail } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './order-response-schemas';

/**
 * What a cancellation answers: the whole order to someone who may read it, only its number,
 * status and version to an administrator (who may cancel but not read orders).
 */
const cancelResponseSchema = z.union([
  orderResponseSchema,
  z.object({ order: cancelledOrderNoticeSchema }),
]);
export type CancelledOrder = OrderDetail | z.infer<typeof cancelledOrderNoticeSchema>;

/** Cancels an order before its session, with the reason and the version of the order read. */
export async function cancelOrder({
  id,
  reason,
  version,
}: {
  id: number;
  reason: string;
  version: number;
}): Promise<CancelledOrder> {
  const { order } = await api.post(
    `/orders/${encodeURIComponent(String(id))}/cancellation`,
    { reason, version },
    { schema: cancelResponseSchema },
  );
  return order;
}
