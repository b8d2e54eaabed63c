import { z } from 'zod';
import {
  orderDetailSchema,
  type OrderDetail,
  type PreparationEntry,
} from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';

const orderResponseSchema = z.object({ order: orderDetailSchema });

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
