import type { OrderDetail } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './deviation-schemas';

/** The order behind a deviation: patient, protocol version and the frozen plan. */
export async function getTreatmentOrder(
  id: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<OrderDetail> {
  const { order } = await api.get(`/orders/${encodeURIComponent(String(id))}`, {
    schema: orderResponseSchema,
    signal,
  });
  return order;
}
