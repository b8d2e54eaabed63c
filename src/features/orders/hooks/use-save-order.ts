import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AmendOrder, OrderDetail, OrderDraft } from '../../../../shared/schemas/orders';
import { amendOrder } from '../api/amend-order';
import { createOrder } from '../api/create-order';
import { updateOrder } from '../api/update-order';
import { refreshAfterOrderChange } from '../../../lib/queries/orders';

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

/** Saves a new draft, an edited draft, or an amendment (a new revision of a signed order). */
export function useSaveOrder() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: save,
    onSuccess: (order, request) =>
      refreshAfterOrderChange(queryClient, order, request.mode === 'amend' ? [request.id] : []),
  });
}
