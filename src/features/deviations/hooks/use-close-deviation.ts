import { useMutation, useQueryClient } from '@tanstack/react-query';
import { isApiRequestError } from '../../../lib/api-client';
import { refreshAfterReview } from '../../../lib/queries/deviations';
import { closeDeviation } from '../api/close-deviation';
import { deviationQueries } from '../api/deviation-queries';

export function useCloseDeviation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: closeDeviation,
    // The queue, the session's other deviations and the order's status all moved.
    onSuccess: (detail) => refreshAfterReview(queryClient, detail),
    // Someone else changed it meanwhile (409): show it as it now stands.
    onError: (error, { id }) => {
      if (isApiRequestError(error) && error.status === 409)
        return queryClient.invalidateQueries({ queryKey: deviationQueries.detail(id).queryKey });
    },
  });
}
