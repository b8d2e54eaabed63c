import { useMutation, useQueryClient } from '@tanstack/react-query';
import { doseCheckQueries } from '../api/dose-check-queries';
import { recordPreparation } from '../api/record-preparation';

export function useRecordPreparation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordPreparation,
    onSuccess: (order) => {
      queryClient.setQueryData(doseCheckQueries.order(order.id).queryKey, order);
      return queryClient.invalidateQueries({ queryKey: doseCheckQueries.worklists().queryKey });
    },
  });
}
