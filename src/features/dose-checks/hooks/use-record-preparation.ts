import { useMutation, useQueryClient } from '@tanstack/react-query';
import { refreshAfterOrderChange } from '../../../lib/queries/orders';
import { recordPreparation } from '../api/record-preparation';

export function useRecordPreparation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordPreparation,
    onSuccess: (order) => refreshAfterOrderChange(queryClient, order),
  });
}
