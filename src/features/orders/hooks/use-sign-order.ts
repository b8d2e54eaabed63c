import { useMutation, useQueryClient } from '@tanstack/react-query';
import { signOrder } from '../api/sign-order';
import { refreshAfterOrderChange } from '../../../lib/queries/orders';

export function useSignOrder() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOrder,
    // Signing an amendment supersedes the revision before it.
    onSuccess: (order) =>
      refreshAfterOrderChange(
        queryClient,
        order,
        order.previousRevisionId ? [order.previousRevisionId] : [],
      ),
  });
}
