import { useMutation, useQueryClient } from '@tanstack/react-query';
import { cancelOrder } from '../api/cancel-order';
import { refreshAfterOrderChange } from '../../../lib/queries/orders';

export function useCancelOrder() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: cancelOrder,
    onSuccess: (order) => refreshAfterOrderChange(queryClient, order),
  });
}
