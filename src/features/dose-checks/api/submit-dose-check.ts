import { type DoseCheckEntry, type OrderDetail } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderResponseSchema } from '../../../lib/queries/orders';

/**
 * Sends the pharmacist's own figures. A match answers with the order, plan revealed; a mismatch
 * is a 422 naming the figures that differ (never the plan's values).
 */
export async function submitDoseCheck({
  orderId,
  entry,
}: {
  orderId: number;
  entry: DoseCheckEntry;
}): Promise<OrderDetail> {
  const { order } = await api.post(
    `/orders/${encodeURIComponent(String(orderId))}/dose-checks`,
    entry,
    { schema: orderResponseSchema },
  );
  return order;
}
