import type { OrderDetail } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './order-response-schemas';

/** The signature's one meaning: "I order this treatment as shown". The password is asked again. */
export async function signOrder({
  id,
  password,
  version,
}: {
  id: number;
  password: string;
  version: number;
}): Promise<OrderDetail> {
  const { order } = await api.post(
    `/orders/${encodeURIComponent(String(id))}/signature`,
    { password, meaning: 'ordered', version },
    { schema: orderResponseSchema },
  );
  return order;
}
