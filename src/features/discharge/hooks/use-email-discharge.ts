import { useMutation } from '@tanstack/react-query';
import { emailDischarge } from '../api/email-discharge';

/** Queues the advice e-mail; never retried on its own, so the patient gets it once per press. */
export function useEmailDischarge(orderId: number) {
  return useMutation({ mutationFn: () => emailDischarge(orderId) });
}
