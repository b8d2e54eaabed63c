import { isApiRequestError } from '../../../lib/api-client';
import { currentPersonId } from '../../../lib/current-person';
import { recordSessionEvent } from './record-session-event';
import type { RecordedEventResponse } from './session-state-schema';
import { ordersWithUnsentTapsOf, tapStoreFor, type TapStore } from './tap-store';

export interface SyncState {
  sending: boolean;
  /** The browser says it is offline, or the last send could not reach the server. */
  offline: boolean;
  /** When the next try is due after a failure (device clock, ms). */
  retryAtMs: number | null;
}

export interface EventSync {
  state: () => SyncState;
  subscribe: (listener: () => void) => () => void;
  /** Sends what is queued, oldest first, one at a time. */
  pump: () => void;
  /** The screen's handler for each stored answer (it brings the cached session up to date). */
  attach: (onStored: (response: RecordedEventResponse) => void) => () => void;
  /** A refused tap goes back in the queue and out again now. */
  sendAgain: (key: string) => void;
}

const firstRetryMs = 1_000;
const longestRetryMs = 30_000;
const syncs = new Map<number, EventSync>();

/**
 * A failure that waiting can cure: no answer, a busy or broken server (5xx), too many requests
 * (429), a timeout (408), a lapsed sign-in (401: sent again after the nurse signs in). Any other
 * answer is the server's refusal of this tap.
 */
export function isRetryable(error: unknown): boolean {
  if (!isApiRequestError(error)) return true;
  return (
    error.status === 0 ||
    error.status === 401 ||
    error.status === 408 ||
    error.status === 429 ||
    error.status >= 500
  );
}

function createEventSync(orderId: number, store: TapStore): EventSync {
  const listeners = new Set<() => void>();
  const handlers = new Set<(response: RecordedEventResponse) => void>();
  let state: SyncState = {
    sending: false,
    offline: globalThis.navigator?.onLine === false,
    retryAtMs: null,
  };
  let running = false;
  let failures = 0;
  let retryTimer: ReturnType<typeof setTimeout> | null = null;

  const set = (changes: Partial<SyncState>) => {
    state = { ...state, ...changes };
    for (const listener of listeners) listener();
  };
  const nextUnsent = () => store.taps().find((tap) => tap.state === 'unsent');

  const scheduleRetry = (afterS: number | null) => {
    failures += 1;
    // Doubling back-off with a little spread, so tablets that lost the network together do not return together.
    const backoffMs =
      Math.min(longestRetryMs, firstRetryMs * 2 ** (failures - 1)) * (0.8 + Math.random() * 0.4);
    const delayMs = Math.max(backoffMs, (afterS ?? 0) * 1000);
    if (retryTimer !== null) clearTimeout(retryTimer);
    retryTimer = setTimeout(() => {
      retryTimer = null;
      void pump();
    }, delayMs);
    set({ retryAtMs: Date.now() + delayMs });
  };

  async function pump(): Promise<void> {
    if (running || !store.ready()) return;
    running = true;
    try {
      for (let next = nextUnsent(); next; next = nextUnsent()) {
        // The hook the sign-out rule hangs on: a tap goes out only under the session of the
        // person who made it (taps() holds only theirs; this re-checks at the moment of sending).
        const person = currentPersonId();
        if (person === null || store.ownerOf(next.key) !== person) break;
        if (globalThis.navigator?.onLine === false) {
          // The 'online' event brings us back; no point knocking while the browser says it is offline.
          set({ offline: true, sending: false });
          return;
        }
        set({ sending: true });
        try {
          const response = await recordSessionEvent(orderId, next.event);
          store.markStored(next.key);
          failures = 0;
          set({ offline: false, retryAtMs: null });
          for (const handler of handlers) handler(response);
        } catch (error) {
          if (isRetryable(error)) {
            set({ offline: isApiRequestError(error) ? error.status === 0 : true, sending: false });
            scheduleRetry(isApiRequestError(error) ? error.retryAfterS : null);
            return;
          }
          // Refused: kept and shown with the server's reason, never as stored. Later taps are
          // still sent; the server judges each one on its own.
          const problem = isApiRequestError(error) ? error : null;
          store.markRefused(next.key, {
            status: problem?.status ?? 0,
            message: problem?.message ?? 'The server refused this tap.',
            fields: problem?.fields ?? [],
          });
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
    if (document.visibilityState === 'visible' && nextUnsent()) wake();
  });
  // Taps read from storage after a reload, or written by another tab of this order, are sent from
  // here too; the idempotency key makes a double send harmless.
  store.subscribe(() => {
    if (!running && retryTimer === null && nextUnsent()) void pump();
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
    sendAgain: (key) => {
      store.requeue(key);
      wake();
    },
  };
}

/** One sender per order for the whole page, so two screens never send the same queue at once. */
export function eventSyncFor(orderId: number, store: TapStore): EventSync {
  let sync = syncs.get(orderId);
  if (!sync) {
    sync = createEventSync(orderId, store);
    syncs.set(orderId, sync);
  }
  return sync;
}

/**
 * On sign-out, while the session still works: sends the person's unsent taps for every order this
 * tablet keeps taps of, and resolves when all are stored or sending stopped (offline, waiting to
 * retry; a refused tap stays refused). Whatever is left stays kept under the person's id, for
 * their next sign-in here. Nothing is sent unless the person's own session is the one open.
 */
export async function sendQueuedTapsOf(personId: number): Promise<void> {
  if (currentPersonId() !== personId) return;
  const orderIds = await ordersWithUnsentTapsOf(personId);
  await Promise.all(
    orderIds.map(async (orderId) => {
      const store = tapStoreFor(orderId);
      const sync = eventSyncFor(orderId, store);
      const unsentOfPerson = () =>
        store.taps().some((tap) => tap.state === 'unsent' && tap.by === personId);
      // Sends at once if the taps are read already, else as soon as they are (the store tells the sender).
      sync.pump();
      for (;;) {
        await new Promise((resolve) => setTimeout(resolve, 100));
        if (currentPersonId() !== personId) return;
        if (!store.ready()) continue;
        const state = sync.state();
        if (!unsentOfPerson() || state.offline || (!state.sending && state.retryAtMs !== null))
          return;
      }
    }),
  );
}
