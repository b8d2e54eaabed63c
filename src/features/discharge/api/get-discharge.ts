import { api } from '../../../lib/api-client';
import { dischargeResponseSchema, type Discharge } from './discharge-schemas';

/** The sheet of an order whose session has started; 409 `no_session` before that. */
export async function getDischarge(
  orderId: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Discharge> {
  const { discharge } = await api.get(`/orders/${encodeURIComponent(String(orderId))}/discharge`, {
    schema: dischargeResponseSchema,
    signal,
  });
  return discharge;
}
