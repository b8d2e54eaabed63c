import { api } from '../../../lib/api-client';
import { recordServerTime } from './clock-offset';
import { sessionStateSchema, type SessionState } from './session-state-schema';

/** The session as stored: events, derived record, live deviations; also re-measures the clock offset. */
export async function getSessionState(orderId: number, { signal }: { signal?: AbortSignal } = {}): Promise<SessionState> {
  const sentAtMs = Date.now();
  const state = await api.get(`/orders/${encodeURIComponent(String(orderId))}/session`, { schema: sessionStateSchema, signal });
  recordServerTime(state.serverTime, sentAtMs, Date.now());
  return state;
}
