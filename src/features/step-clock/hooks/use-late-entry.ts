import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionEventInput } from '../../../../shared/session/session-events';
import { recordSessionEvent } from '../api/record-session-event';
import { stepClockQueries } from '../api/step-clock-queries';
import { newIdempotencyKey } from '../api/tap-store';
import type { EventBody } from './use-session-events';

/**
 * A missed tap entered afterwards at its real time, with the reason it is late. Sent at once
 * rather than queued with the taps: it is a considered entry, and the server's answer (the time
 * does not fit the session, for instance) belongs in the dialog where it was typed.
 */
export function useLateEntry(orderId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ body, atMs, reason }: { body: EventBody; atMs: number; reason: string }) =>
      recordSessionEvent(orderId, {
        ...body,
        idempotencyKey: newIdempotencyKey(),
        clientTime: new Date(atMs).toISOString(),
        lateEntryReason: reason,
      } as SessionEventInput),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: stepClockQueries.session(orderId).queryKey }),
  });
}
