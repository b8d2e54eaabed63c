import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useSyncExternalStore } from 'react';
import type { SessionEventLike } from '../../../../shared/session/dose-record';
import type { SessionEventInput } from '../../../../shared/session/session-events';
import { serverNowMs } from '../api/clock-offset';
import { eventQueueFor, newIdempotencyKey } from '../api/event-queue';
import { eventSyncFor, type SyncState } from '../api/event-sync';
import { withRecordedEvent } from '../api/session-state-schema';
import { stepClockQueries } from '../api/step-clock-queries';

/** What a tap says, without the key and time the tablet adds. */
export type EventBody = SessionEventInput extends infer E ? (E extends unknown ? Omit<E, 'idempotencyKey' | 'clientTime'> : never) : never;

const noTaps: readonly SessionEventInput[] = [];
const notSending: SyncState = { sending: false, offline: false, retryAtMs: null, refused: null };
const unchanging = () => () => undefined;

/**
 * The session's events as the clock must see them: the stored ones plus the taps still queued
 * on this tablet. Recording a tap queues it first, then sends it; the clock uses it at once.
 * Someone only watching (`records: false`) sees the stored events alone and sends nothing: taps a
 * nurse left queued on a shared tablet are hers to send, and the server would refuse them anyway.
 */
export function useSessionEvents(orderId: number, { records }: { records: boolean }) {
  const queryClient = useQueryClient();
  const session = useQuery(stepClockQueries.session(orderId));
  const queue = records ? eventQueueFor(orderId) : null;
  const sync = queue ? eventSyncFor(orderId, queue) : null;
  const unsent = useSyncExternalStore(queue?.subscribe ?? unchanging, queue?.list ?? (() => noTaps), queue?.list ?? (() => noTaps));
  const syncState = useSyncExternalStore(sync?.subscribe ?? unchanging, sync?.state ?? (() => notSending), sync?.state ?? (() => notSending));

  useEffect(() => {
    if (!sync) return;
    const { queryKey } = stepClockQueries.session(orderId);
    const detach = sync.attach((answer) => {
      const current = queryClient.getQueryData(queryKey);
      const merged = current ? withRecordedEvent(current, answer) : null;
      if (merged) queryClient.setQueryData(queryKey, merged.state);
      // Nothing loaded yet, or another tablet stored events this one has not seen: fetch them all.
      if (!merged?.complete) void queryClient.invalidateQueries({ queryKey });
    });
    // Taps left from before a reload go out now.
    sync.pump();
    return detach;
  }, [orderId, queryClient, sync]);

  const events = useMemo<SessionEventLike[]>(() => {
    const stored = session.data?.events ?? [];
    const storedKeys = new Set(stored.map((event) => event.idempotencyKey));
    return [...stored, ...unsent.filter((event) => !storedKeys.has(event.idempotencyKey))];
  }, [session.data, unsent]);

  const latestEventMs = useRef(0);
  latestEventMs.current = events.reduce((latest, event) => Math.max(latest, Date.parse(event.clientTime) || 0), 0);

  /**
   * Records one tap (several events made by one tap get times a millisecond apart, so they sort
   * in the order given). `atMs` is the moment of the tap on the server's clock, when it was
   * taken before a confirmation.
   */
  const record = useCallback(
    (bodies: readonly EventBody[], atMs?: number): SessionEventInput[] => {
      // Never before the last event: the replay orders by time, and a tap cannot precede the one before it.
      const firstMs = Math.max(Math.round(atMs ?? serverNowMs()), latestEventMs.current + 1);
      const made = bodies.map((body, index) => ({ ...body, idempotencyKey: newIdempotencyKey(), clientTime: new Date(firstMs + index).toISOString() }) as SessionEventInput);
      if (!queue || !sync) throw new Error('A watcher cannot record taps.');
      latestEventMs.current = firstMs + made.length - 1;
      queue.add(made);
      sync.pump();
      return made;
    },
    [queue, sync],
  );

  return {
    session,
    events,
    unsent,
    syncState,
    storageIsPersistent: queue?.persistent() ?? true,
    record,
    sendAgain: sync?.sendAgain ?? (() => undefined),
    discardRefused: sync?.discardRefused ?? (() => undefined),
  };
}
