import type { OrderListQuery } from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';
import { orderListResponseSchema, type OrderListResponse } from './order-response-schemas';

export function orderListSearch(query: OrderListQuery): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  return search.toString();
}

/** One page of orders, filtered and sorted by the server. */
export async function getOrders(
  query: OrderListQuery,
  { signal }: { signal?: AbortSignal } = {},
): Promise<OrderListResponse> {
  return api.get(`/orders?${orderListSearch(query)}`, { schema: orderListResponseSchema, signal });
}
