import type { SessionEventInput } from '../../../../shared/session/session-events';
import { isApiRequestError, type FieldProblem } from '../../../lib/api-client';
import { currentPersonId } from '../../../lib/current-person';
import { eventQueueFor, queuedOrderIds, type EventQueue } from './event-queue';
import { recordSessionEvent } from './record-session-event';
import type { RecordedEventResponse } from './session-state-schema';

export interface SyncState {
  sending: boolean;
  /** The browser says it is offline, or the last send could not reach the server. */
  offline: boolean;
  /** When the next try is due after a failure (device clock, ms). */
  retryAtMs: number | null;
  /** The server refused the oldest tap; the queue waits until the nurse sends it again or discards it. */
  refused: { event: SessionEventInput; message: string; fields: FieldProblem[] } | null;
}

export interface EventSync {
  state: () => SyncState;
  subscribe: (listener: () => void) => () => void;
  /** Sends what is queued, oldest first, one at a time. */
  pump: () => void;
  /** The screen's handler for each stored answer (it brings the cached session up to date). */
  attach: (onStored: (response: RecordedEventResponse) => void) => () => void;
  sendAgain: () => void;
  discardRefused: () => void;
}

const firstRetryMs = 1_000;
const longestRetryMs = 30_000;
const syncs = new Map<number, EventSync>();

/** A failure that waiting can cure: no answer, a busy or broken server, a lapsed sign-in. */
function isTransient(error: unknown): boolean {
  if (!isApiRequestError(error)) return true;
  return error.status === 0 || error.status === 401 || error.status === 408 || error.status === 429 || error.status >= 500;
}

function createEventSync(orderId: number, queue: EventQueue): EventSync {
  const listeners = new Set<() => void>();
  const handlers = new Set<(response: RecordedEventResponse) => void>();
  let state: SyncState = { sending: false, offline: globalThis.navigator?.onLine === false, retryAtMs: null, refused: null };
  let running = false;
  let failures = 0;
  let retryTimer: ReturnType<typeof setTimeout> | null = null;

  const set = (changes: Partial<SyncState>) => {
    state = { ...state, ...changes };
    for (const listener of listeners) listener();
  };

  const scheduleRetry = (afterS: number | null) => {
    failures += 1;
    // Doubling back-off with a little spread, so tablets that lost the network together do not return together.
    const backoffMs = Math.min(longestRetryMs, firstRetryMs * 2 ** (failures - 1)) * (0.8 + Math.random() * 0.4);
    const delayMs = Math.max(backoffMs, (afterS ?? 0) * 1000);
    if (retryTimer !== null) clearTimeout(retryTimer);
    retryTimer = setTimeout(() => {
      retryTimer = null;
      void pump();
    }, delayMs);
    set({ retryAtMs: Date.now() + delayMs });
  };

  async function pump(): Promise<void> {
    if (running || state.refused) return;
    running = true;
    try {
      for (let next = queue.list()[0]; next; next = queue.list()[0]) {
        // The hook the sign-out rule hangs on: a tap goes out only under the session of the
        // person who made it (list() holds only theirs; this re-checks at the moment of sending).
        const person = currentPersonId();
        if (person === null || queue.ownerOf(next.idempotencyKey) !== person) break;
        if (globalThis.navigator?.onLine === false) {
          // The 'online' event brings us back; no point knocking while the browser says it is offline.
          set({ offline: true, sending: false });
          return;
        }
        set({ sending: true });
        try {
          const response = await recordSessionEvent(orderId, next);
          queue.remove(next.idempotencyKey);
          failures = 0;
          set({ offline: false, retryAtMs: null });
          for (const handler of handlers) handler(response);
        } catch (error) {
          if (isTransient(error)) {
            set({ offline: isApiRequestError(error) ? error.status === 0 : true, sending: false });
            scheduleRetry(isApiRequestError(error) ? error.retryAfterS : null);
          } else {
            const problem = isApiRequestError(error) ? error : null;
            set({ sending: false, refused: { event: next, message: problem?.message ?? 'The server refused this tap.', fields: problem?.fields ?? [] } });
          }
          return;
        }
      }
      set({ sending: false });
    } finally {
      running = false;
    }
  }

  const wake = () => {
    failures = 0;
    if (retryTimer !== null) clearTimeout(retryTimer);
    retryTimer = null;
    set({ offline: globalThis.navigator?.onLine === false, retryAtMs: null });
    void pump();
  };
  globalThis.addEventListener?.('online', wake);
  globalThis.addEventListener?.('offline', () => set({ offline: true }));
  globalThis.document?.addEventListener('visibilitychange', () => {
    if (document.visibilityState === 'visible' && queue.list().length > 0) wake();
  });
  // A tap written by another tab of this order is sent from here too; the key makes that harmless.
  queue.subscribe(() => {
    if (!running && retryTimer === null && queue.list().length > 0) void pump();
  });

  return {
    state: () => state,
    subscribe: (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    pump: () => void pump(),
    attach: (onStored) => {
      handlers.add(onStored);
      return () => handlers.delete(onStored);
    },
    sendAgain: () => {
      set({ refused: null });
      wake();
    },
    discardRefused: () => {
      const refused = state.refused;
      if (!refused) return;
      queue.remove(refused.event.idempotencyKey);
      set({ refused: null });
      wake();
    },
  };
}

/** One sender per order for the whole page, so two screens never send the same queue at once. */
export function eventSyncFor(orderId: number, queue: EventQueue): EventSync {
  let sync = syncs.get(orderId);
  if (!sync) {
    sync = createEventSync(orderId, queue);
    syncs.set(orderId, sync);
  }
  return sync;
}

/**
 * On sign-out, while the session still works: sends the person's queued taps for every order in
 * this browser, and resolves when all are stored or sending stopped (offline, refused, waiting to
 * retry). Whatever is left stays queued under the person's id, for their next sign-in here.
 */
export async function sendQueuedTapsOf(personId: number): Promise<void> {
  const pending = queuedOrderIds()
    .map((orderId) => ({ orderId, queue: eventQueueFor(orderId) }))
    .filter(({ queue }) => queue.list().length > 0 && currentPersonId() === personId);
  await Promise.all(
    pending.map(async ({ orderId, queue }) => {
      const sync = eventSyncFor(orderId, queue);
      sync.pump();
      for (;;) {
        await new Promise((resolve) => setTimeout(resolve, 100));
        const state = sync.state();
        if (queue.list().length === 0 || state.refused || state.offline || (!state.sending && state.retryAtMs !== null)) return;
      }
    }),
  );
}
