import { useMutation, useQueryClient } from '@tanstack/react-query';
import { doseCheckQueries } from '../api/dose-check-queries';
import { submitDoseCheck } from '../api/submit-dose-check';

export function useSubmitDoseCheck() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: submitDoseCheck,
    onSuccess: (order) => {
      queryClient.setQueryData(doseCheckQueries.order(order.id).queryKey, order);
      return queryClient.invalidateQueries({ queryKey: doseCheckQueries.worklists().queryKey });
    },
    // A refused check is recorded too (and a second one sends the order back): reload both.
    onError: (_error, { orderId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: doseCheckQueries.order(orderId).queryKey }),
        queryClient.invalidateQueries({ queryKey: doseCheckQueries.worklists().queryKey }),
      ]),
  });
}
