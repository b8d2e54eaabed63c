import { api } from '../../../lib/api-client';
import { sessionStateSchema, type SessionState } from './dose-record-schemas';

/** The order's session as the server derived it: the dose record and the deviations found. */
export async function getSession(
  orderId: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<SessionState> {
  return api.get(`/orders/${encodeURIComponent(String(orderId))}/session`, {
    schema: sessionStateSchema,
    signal,
  });
}
