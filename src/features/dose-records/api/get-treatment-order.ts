import type { OrderDetail } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from './dose-record-schemas';

/** The order: patient, protocol version, the frozen plan and the pharmacy's preparation. */
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
