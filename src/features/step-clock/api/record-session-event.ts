import type { SessionEventInput } from '../../../../shared/session/session-events';
import { api } from '../../../lib/api-client';
import { recordServerTime } from './clock-offset';
import { recordedEventResponseSchema, type RecordedEventResponse } from './session-state-schema';

/**
 * Sends one tapped event. Its idempotency key makes a resend harmless: the server answers 200
 * with the stored event instead of storing it twice.
 */
export async function recordSessionEvent(
  orderId: number,
  event: SessionEventInput,
): Promise<RecordedEventResponse> {
  const sentAtMs = Date.now();
  const response = await api.post(
    `/orders/${encodeURIComponent(String(orderId))}/session-events`,
    event,
    { schema: recordedEventResponseSchema },
  );
  recordServerTime(response.serverTime, sentAtMs, Date.now());
  return response;
}
