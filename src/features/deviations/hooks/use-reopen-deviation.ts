import { useMutation, useQueryClient } from '@tanstack/react-query';
import { isApiRequestError } from '../../../lib/api-client';
import { deviationQueries } from '../api/deviation-queries';
import { reopenDeviation } from '../api/reopen-deviation';

export function useReopenDeviation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: reopenDeviation,
    onSuccess: (detail) => {
      queryClient.setQueryData(deviationQueries.detail(detail.deviation.id).queryKey, detail);
      return queryClient.invalidateQueries({ queryKey: deviationQueries.all() });
    },
    // Someone else changed it meanwhile (409): show it as it now stands.
    onError: (error, { id }) => {
      if (isApiRequestError(error) && error.status === 409)
        return queryClient.invalidateQueries({ queryKey: deviationQueries.detail(id).queryKey });
    },
  });
}
