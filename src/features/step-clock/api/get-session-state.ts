import { api } from '../../../lib/api-client';
import { offlineCopyHeader } from '../../../lib/offline-cache';
import { recordServerTime } from './clock-offset';
import { sessionStateSchema, type SessionState } from './session-state-schema';
import { forgetStoredTaps } from './tap-store';

/**
 * The session as stored: events, derived record, live deviations. A fresh answer also re-measures
 * the clock offset and lets the tablet drop its own copies of taps the server now shows. An
 * offline copy (served by the service worker without network) does neither: its serverTime is
 * as old as the copy, and the offset measured before stays in force.
 */
export async function getSessionState(
  orderId: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<SessionState> {
  const sentAtMs = Date.now();
  let offlineCopy = false;
  const state = await api.get(`/orders/${encodeURIComponent(String(orderId))}/session`, {
    schema: sessionStateSchema,
    signal,
    onHeaders: (headers) => {
      offlineCopy = headers.has(offlineCopyHeader);
    },
  });
  if (!offlineCopy) {
    recordServerTime(state.serverTime, sentAtMs, Date.now());
    forgetStoredTaps(orderId, new Set(state.events.map((event) => event.idempotencyKey)));
  }
  return state;
}
