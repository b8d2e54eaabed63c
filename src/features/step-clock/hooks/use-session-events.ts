import { useQuery, useQueryClient } from '@tanstack/react-query';
import {
  useCallback,
  useEffect,
  useLayoutEffect,
  useMemo,
  useRef,
  useSyncExternalStore,
} from 'react';
import type { SessionEventLike } from '../../../../shared/session/dose-record';
import type { SessionEventInput } from '../../../../shared/session/session-events';
import { refreshAfterOrderChange } from '../../../lib/queries/orders';
import { serverNowMs } from '../../../lib/server-clock';
import { eventSyncFor, type SyncState } from '../api/event-sync';
import { withRecordedEvent } from '../../../lib/queries/session-schema';
import { stepClockQueries } from '../api/step-clock-queries';
import { newIdempotencyKey, tapStoreFor, type KeptTap } from '../api/tap-store';

/** What a tap says, without the key and time the tablet adds. */
export type EventBody = SessionEventInput extends infer E
  ? E extends unknown
    ? Omit<E, 'idempotencyKey' | 'clientTime'>
    : never
  : never;

const noTaps: readonly KeptTap[] = [];
const notSending: SyncState = { sending: false, offline: false, retryAtMs: null };
const unchanging = () => () => undefined;
const alwaysReady = () => true;
const none = () => 0;

/**
 * The session's events as the clock must see them: the stored ones plus the taps this tablet
 * keeps that are unsent or stored since the last copy of the session. Recording a tap keeps it
 * first, then sends it; the clock uses it at once. A tap the server refused is not counted.
 * Only the signed-in person's taps count, show and go out; another person's unsent taps on this
 * tablet are held for them and only their number is told.
 * Someone only watching (`records: false`) sees the stored events alone and sends nothing: taps a
 * nurse left queued on a shared tablet are hers to send, and the server would refuse them anyway.
 */
export function useSessionEvents(orderId: number, { records }: { records: boolean }) {
  const queryClient = useQueryClient();
  const session = useQuery(stepClockQueries.session(orderId));
  const store = records ? tapStoreFor(orderId) : null;
  const sync = store ? eventSyncFor(orderId, store) : null;
  const kept = useSyncExternalStore(
    store?.subscribe ?? unchanging,
    store?.taps ?? (() => noTaps),
    store?.taps ?? (() => noTaps),
  );
  const tapsReady = useSyncExternalStore(
    store?.subscribe ?? unchanging,
    store?.ready ?? alwaysReady,
    store?.ready ?? alwaysReady,
  );
  const heldForOthers = useSyncExternalStore(
    store?.subscribe ?? unchanging,
    store?.heldForOthers ?? none,
    store?.heldForOthers ?? none,
  );
  const heldUnowned = useSyncExternalStore(
    store?.subscribe ?? unchanging,
    store?.heldUnowned ?? none,
    store?.heldUnowned ?? none,
  );
  const syncState = useSyncExternalStore(
    sync?.subscribe ?? unchanging,
    sync?.state ?? (() => notSending),
    sync?.state ?? (() => notSending),
  );

  useEffect(() => {
    if (!sync) return;
    const { queryKey } = stepClockQueries.session(orderId);
    const detach = sync.attach((answer) => {
      const current = queryClient.getQueryData(queryKey);
      const merged = current ? withRecordedEvent(current, answer) : null;
      if (merged) queryClient.setQueryData(queryKey, merged.state);
      // A tap that moved the order (started, ended, stopped) changes what the order's screens show.
      if (current && answer.status !== current.status)
        refreshAfterOrderChange(queryClient, { id: orderId });
      // Nothing loaded yet, or another tablet stored events this one has not seen: fetch them all.
      if (!merged?.complete) void queryClient.invalidateQueries({ queryKey });
    });
    // Taps left from before a reload go out now (or as soon as they are read from storage).
    sync.pump();
    return detach;
  }, [orderId, queryClient, sync]);

  const unsent = useMemo(() => kept.filter((tap) => tap.state === 'unsent'), [kept]);
  const refused = useMemo(() => kept.filter((tap) => tap.state === 'refused'), [kept]);

  const events = useMemo<SessionEventLike[]>(() => {
    const stored = session.data?.events ?? [];
    const storedKeys = new Set(stored.map((event) => event.idempotencyKey));
    const local = kept
      .filter((tap) => tap.state !== 'refused' && !storedKeys.has(tap.key))
      .map((tap) => tap.event);
    return [...stored, ...local];
  }, [session.data, kept]);

  const latestOfEvents = useMemo(
    () => events.reduce((latest, event) => Math.max(latest, Date.parse(event.clientTime) || 0), 0),
    [events],
  );
  // Read when a tap is recorded (outside render); kept in step with the events once rendered.
  const latestEventMs = useRef(0);
  useLayoutEffect(() => {
    latestEventMs.current = latestOfEvents;
  }, [latestOfEvents]);

  /**
   * Records one tap (several events made by one tap get times a millisecond apart, so they sort
   * in the order given). `atMs` is the moment of the tap on the server's clock, when it was
   * taken before a confirmation.
   */
  const record = useCallback(
    (bodies: readonly EventBody[], atMs?: number): SessionEventInput[] => {
      // Never before the last event: the replay orders by time, and a tap cannot precede the one before it.
      const firstMs = Math.max(Math.round(atMs ?? serverNowMs()), latestEventMs.current + 1);
      const made = bodies.map(
        (body, index) =>
          ({
            ...body,
            idempotencyKey: newIdempotencyKey(),
            clientTime: new Date(firstMs + index).toISOString(),
          }) as SessionEventInput,
      );
      if (!store || !sync) throw new Error('A watcher cannot record taps.');
      latestEventMs.current = firstMs + made.length - 1;
      store.add(made);
      sync.pump();
      return made;
    },
    [store, sync],
  );

  return {
    session,
    events,
    /** False until the taps kept on this tablet have been read (a moment after a reload). */
    tapsReady,
    unsent,
    refused,
    /** Unsent or refused taps on this tablet made by someone else (held for them) or by nobody known (held). */
    held: { forOthers: heldForOthers, unowned: heldUnowned },
    syncState,
    storageIsPersistent: store?.persistent() ?? true,
    record,
    sendAgain: sync?.sendAgain ?? (() => undefined),
    discard: store?.discard ?? (() => undefined),
  };
}
