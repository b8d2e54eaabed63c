import type { AmendOrder, OrderDetail } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './order-response-schemas';

/** Starts the next revision of a signed order, as a draft; the signed one stays readable. */
export async function amendOrder({
  id,
  amendment,
  version,
}: {
  id: number;
  amendment: AmendOrder;
  version: number;
}): Promise<OrderDetail> {
  const { order } = await api.post(
    `/orders/${encodeURIComponent(String(id))}/amendments`,
    { ...amendment, version },
    { schema: orderResponseSchema },
  );
  return order;
}
