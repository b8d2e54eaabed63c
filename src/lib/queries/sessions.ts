import { queryOptions } from '@tanstack/react-query';
import { api } from '../api-client';
import { offlineCopyHeader } from '../offline-cache';
import { recordServerTime } from '../server-clock';
import type { Fetching } from './request';
import { segment } from './request';
import { newerSessionState, sessionStateSchema, type SessionState } from './session-schema';

/*
 * One cache for treatment sessions (an order's events, derived record and live deviations), read
 * by the step clock, the order's detail and the printed record alike.
 */

export const sessionKeys = {
  all: () => ['sessions'] as const,
  detail: (orderId: number) => [...sessionKeys.all(), orderId] as const,
};

type FreshSessionListener = (orderId: number, state: SessionState) => void;
const freshListeners = new Set<FreshSessionListener>();

/** Told of every session answer fresh from the server (not an offline copy). */
export function onFreshSession(listener: FreshSessionListener): () => void {
  freshListeners.add(listener);
  return () => freshListeners.delete(listener);
}

/**
 * The session as stored. A fresh answer also re-measures the server clock and is told to the
 * listeners (the tablet drops its own copies of taps the server now shows). An offline copy
 * (served by the service worker without network) does neither: its serverTime is as old as the
 * copy, and the offset measured before stays in force.
 */
export async function getSession(
  orderId: number,
  { signal }: Fetching = {},
): Promise<SessionState> {
  const sentAtMs = Date.now();
  let offlineCopy = false;
  const state = await api.get(`/orders/${segment(orderId)}/session`, {
    schema: sessionStateSchema,
    signal,
    onHeaders: (headers) => {
      offlineCopy = headers.has(offlineCopyHeader);
    },
  });
  if (!offlineCopy) {
    recordServerTime(state.serverTime, sentAtMs, Date.now());
    for (const listener of freshListeners) listener(orderId, state);
  }
  return state;
}

export const sessionQuery = (orderId: number) =>
  queryOptions({
    queryKey: sessionKeys.detail(orderId),
    queryFn: ({ signal }) => getSession(orderId, { signal }),
    // Of two answers the one with fewer events is the older one and never replaces the newer.
    structuralSharing: (previous, next) =>
      newerSessionState(previous as SessionState | undefined, next as SessionState),
  });
