import { useMutation, useQueryClient } from '@tanstack/react-query';
import { refreshAfterOrderChange } from '../../../lib/queries/orders';
import { submitDoseCheck } from '../api/submit-dose-check';

export function useSubmitDoseCheck() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: submitDoseCheck,
    onSuccess: (order) => refreshAfterOrderChange(queryClient, order),
    // A refused check is recorded too (and a second one sends the order back): reload it and the lists.
    onError: (_error, { orderId }) => refreshAfterOrderChange(queryClient, { id: orderId }),
  });
}
