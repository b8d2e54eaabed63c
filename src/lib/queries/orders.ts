import { keepPreviousData, queryOptions, type QueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  cancellableOrdersResponseSchema,
  orderDetailSchema,
  orderSummarySchema,
  type OrderDetail,
  type OrderListQuery,
} from '../../../shared/schemas/orders';
import { api } from '../api-client';
import { patientKeys } from './patients';
import type { Fetching } from './request';
import { searchOf, segment } from './request';
import { sessionKeys } from './sessions';
import { todayKeys } from './today';

/*
 * One cache for orders. Every screen that shows an order (the form, the detail, the pharmacist's
 * check, the step clock, the reviews and the printed record) reads it through `orderQuery`, so a
 * change made on one screen is what the next one shows.
 */

export const orderListResponseSchema = z.object({
  orders: z.array(orderSummarySchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type OrderListResponse = z.infer<typeof orderListResponseSchema>;

export const orderResponseSchema = z.object({ order: orderDetailSchema });

/** Orders' keys, general → specific. */
export const orderKeys = {
  all: () => ['orders'] as const,
  lists: () => [...orderKeys.all(), 'list'] as const,
  list: (query: OrderListQuery) => [...orderKeys.lists(), query] as const,
  details: () => [...orderKeys.all(), 'detail'] as const,
  detail: (id: number) => [...orderKeys.details(), id] as const,
  /** Orders that may still be cancelled, by identity only (the administrator's list). */
  cancellable: () => [...orderKeys.lists(), 'cancellable'] as const,
  /** The patient's other open orders and recent treatments that a signature is held to. */
  signingFacts: (patientId: number) => [...orderKeys.all(), 'signing-facts', patientId] as const,
};

export const orderListSearch = (query: OrderListQuery): string => searchOf(query);

/** One page of orders, filtered and sorted by the server. */
export function getOrders(query: OrderListQuery, { signal }: Fetching = {}) {
  return api.get(`/orders?${orderListSearch(query)}`, { schema: orderListResponseSchema, signal });
}

/** One order as the signed-in person may see it (for a pharmacist before their check, without the plan). */
export async function getOrder(id: number, { signal }: Fetching = {}): Promise<OrderDetail> {
  const { order } = await api.get(`/orders/${segment(id)}`, {
    schema: orderResponseSchema,
    signal,
  });
  return order;
}

export const orderListQuery = (query: OrderListQuery) =>
  queryOptions({
    queryKey: orderKeys.list(query),
    queryFn: ({ signal }) => getOrders(query, { signal }),
    // The current page stays visible while the next one loads, so the table does not jump.
    placeholderData: keepPreviousData,
  });

/** Orders not yet in their session, with only what identifies each (no figures, no answers). */
export const cancellableOrdersQuery = () =>
  queryOptions({
    queryKey: orderKeys.cancellable(),
    queryFn: ({ signal }) =>
      api.get('/orders/cancellable', { schema: cancellableOrdersResponseSchema, signal }),
  });

export const orderQuery = (id: number) =>
  queryOptions({
    queryKey: orderKeys.detail(id),
    queryFn: ({ signal }) => getOrder(id, { signal }),
  });

/**
 * After any change to an order: the saved copy is known (when the answer carries it), and
 * everything that shows its status may have moved: the order lists, Today (and the pharmacist's
 * part of it), the patient's history and the session. `alsoChanged` are orders the change touched
 * too (the revision an amendment supersedes). Nothing here is waited for: a mutation's own
 * callbacks run at once, before the screen that started it re-renders without it.
 */
export function refreshAfterOrderChange(
  queryClient: QueryClient,
  order: OrderDetail | { id: number },
  alsoChanged: number[] = [],
): void {
  if ('patient' in order) queryClient.setQueryData(orderKeys.detail(order.id), order);
  else void queryClient.invalidateQueries({ queryKey: orderKeys.detail(order.id) });
  for (const id of alsoChanged) {
    void queryClient.invalidateQueries({ queryKey: orderKeys.detail(id) });
    void queryClient.invalidateQueries({ queryKey: sessionKeys.detail(id) });
  }
  const patientId = 'patient' in order ? order.patient.id : null;
  void queryClient.invalidateQueries({ queryKey: orderKeys.lists() });
  void queryClient.invalidateQueries({
    queryKey:
      patientId === null
        ? [...orderKeys.all(), 'signing-facts']
        : orderKeys.signingFacts(patientId),
  });
  void queryClient.invalidateQueries({ queryKey: todayKeys.all() });
  void queryClient.invalidateQueries({ queryKey: sessionKeys.detail(order.id) });
  void queryClient.invalidateQueries({
    queryKey: patientId === null ? patientKeys.details() : patientKeys.detail(patientId),
  });
}
