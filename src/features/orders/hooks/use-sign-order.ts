import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { refreshAfterOrderChange } from '../../../lib/queries/orders';
import { signOrder } from '../api/sign-order';

/** Signing, as a mutation on the one order cache; the hook below and the tests use it. */
export const signOrderMutation = (queryClient: QueryClient) => ({
  mutationFn: signOrder,
  // Signing an amendment supersedes the revision before it.
  onSuccess: (order: Awaited<ReturnType<typeof signOrder>>) =>
    refreshAfterOrderChange(
      queryClient,
      order,
      order.previousRevisionId ? [order.previousRevisionId] : [],
    ),
});

export function useSignOrder() {
  const queryClient = useQueryClient();
  return useMutation(signOrderMutation(queryClient));
}
