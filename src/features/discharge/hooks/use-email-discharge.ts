import { useMutation, useQueryClient } from '@tanstack/react-query';
import { outboxKeys } from '../../../lib/queries/outbox';
import { emailDischarge } from '../api/email-discharge';

/** Queues the advice e-mail; never retried on its own, so the patient gets it once per press. */
export function useEmailDischarge(orderId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => emailDischarge(orderId),
    // The queued e-mail joins the outbox.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: outboxKeys.all() }),
  });
}
