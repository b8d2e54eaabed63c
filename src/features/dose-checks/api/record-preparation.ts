import { type OrderDetail, type PreparationEntry } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from '../../../lib/queries/orders';

export async function recordPreparation({
  orderId,
  entry,
}: {
  orderId: number;
  entry: PreparationEntry;
}): Promise<OrderDetail> {
  const { order } = await api.post(
    `/orders/${encodeURIComponent(String(orderId))}/preparation`,
    entry,
    { schema: orderResponseSchema },
  );
  return order;
}
