import type { OrderDetail, OrderDraft } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './order-response-schemas';

export async function createOrder(draft: OrderDraft): Promise<OrderDetail> {
  const { order } = await api.post('/orders', draft, { schema: orderResponseSchema });
  return order;
}
