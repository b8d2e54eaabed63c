import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { AmendOrder, OrderDetail, OrderDraft } from '../../../../shared/schemas/orders';
import { amendOrder } from '../api/amend-order';
import { createOrder } from '../api/create-order';
import { orderQueries } from '../api/order-queries';
import { updateOrder } from '../api/update-order';

export type SaveOrderRequest =
  | { mode: 'new'; draft: OrderDraft }
  | { mode: 'edit'; id: number; version: number; draft: OrderDraft }
  | { mode: 'amend'; id: number; version: number; amendment: AmendOrder };

function save(request: SaveOrderRequest): Promise<OrderDetail> {
  if (request.mode === 'new') return createOrder(request.draft);
  if (request.mode === 'edit')
    return updateOrder({ id: request.id, version: request.version, draft: request.draft });
  return amendOrder({ id: request.id, version: request.version, amendment: request.amendment });
}

/** After any change to an order: the saved detail is known, every list may have moved. */
export function refreshAfterOrderChange(
  queryClient: QueryClient,
  order: OrderDetail,
  alsoChanged: number[] = [],
) {
  queryClient.setQueryData(orderQueries.detail(order.id).queryKey, order);
  for (const id of alsoChanged)
    void queryClient.invalidateQueries({ queryKey: orderQueries.detail(id).queryKey });
  // The patient's other open orders and recent treatments, which the next order is held to.
  void queryClient.invalidateQueries({
    queryKey: [...orderQueries.all(), 'patient', order.patient.id, 'signing-facts'],
  });
  return queryClient.invalidateQueries({ queryKey: orderQueries.lists() });
}

/** Saves a new draft, an edited draft, or an amendment (a new revision of a signed order). */
export function useSaveOrder() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: save,
    onSuccess: (order, request) =>
      refreshAfterOrderChange(queryClient, order, request.mode === 'amend' ? [request.id] : []),
  });
}
