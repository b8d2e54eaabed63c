import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import { sessionEventSchema, type SessionEventInput } from '../../../../shared/session/session-events';
import type { FieldProblem } from '../../../lib/api-client';

/**
 * The taps this tablet has made, kept in IndexedDB per order. A tap is written here before it
 * is sent, so a reload, a lost network, a restarted browser or a flat battery loses nothing.
 *
 * - `unsent`: waiting for the server; counts on the clock meanwhile.
 * - `stored`: the server has it. Kept until a fresh copy of the session from the server shows
 *   it, so a reload without network (which opens the last copy the service worker kept) still
 *   counts a tap stored after that copy was made.
 * - `refused`: the server said no (not a failure that waiting cures). Never counted on the
 *   clock and never shown as stored; kept with the server's reason until the nurse sends it
 *   again or discards it.
 */
export type TapState = 'unsent' | 'stored' | 'refused';

export interface Refusal {
  status: number;
  message: string;
  fields: FieldProblem[];
}

export interface KeptTap {
  key: string;
  orderId: number;
  event: SessionEventInput;
  state: TapState;
  /** Device clock when the tablet kept it; with the tap's own time it orders the queue. */
  keptAtMs: number;
  refusal: Refusal | null;
}

export interface TapStore {
  /** False until the taps kept before this page loaded have been read: until then the clock must not be drawn. */
  ready: () => boolean;
  /** Every kept tap of the order, oldest first; the same array until something changes. */
  taps: () => readonly KeptTap[];
  add: (events: readonly SessionEventInput[]) => void;
  markStored: (key: string) => void;
  markRefused: (key: string, refusal: Refusal) => void;
  /** A refused tap goes back to the queue, to be sent again. */
  requeue: (key: string) => void;
  discard: (key: string) => void;
  /** The server's own copy now holds these stored taps: the local copy has done its job. */
  forgetStored: (keysOnServer: ReadonlySet<string>) => void;
  subscribe: (listener: () => void) => () => void;
  /** False when the browser refuses storage: taps then live in this page only. */
  persistent: () => boolean;
}

interface TapDb extends DBSchema {
  taps: { key: string; value: KeptTap; indexes: { 'by-order': number } };
}

const dbName = 'luxtempo-step-clock';
/** Where taps were kept before IndexedDB (one localStorage entry per order); read once, then removed. */
const legacyPrefix = 'luxtempo.step-clock.unsent.';
const channelName = 'luxtempo-step-clock-taps';

let dbPromise: Promise<IDBPDatabase<TapDb> | null> | null = null;
const stores = new Map<number, TapStore>();
const channel = typeof BroadcastChannel === 'function' ? new BroadcastChannel(channelName) : null;

function database(): Promise<IDBPDatabase<TapDb> | null> {
  dbPromise ??= (async () => {
    try {
      const db = await openDB<TapDb>(dbName, 1, {
        upgrade(upgrading) {
          const taps = upgrading.createObjectStore('taps', { keyPath: 'key' });
          taps.createIndex('by-order', 'orderId');
        },
      });
      await moveLegacyQueues(db);
      await forgetOldStoredTaps(db);
      return db;
    } catch {
      return null;
    }
  })();
  return dbPromise;
}

/** Queues left in localStorage by the earlier version move into IndexedDB once; a tap already there is not doubled. */
async function moveLegacyQueues(db: IDBPDatabase<TapDb>): Promise<void> {
  let keys: string[];
  try {
    keys = Object.keys(globalThis.localStorage ?? {}).filter((key) => key.startsWith(legacyPrefix));
  } catch {
    return;
  }
  for (const storageKey of keys) {
    const orderId = Number(storageKey.slice(legacyPrefix.length));
    const raw = globalThis.localStorage.getItem(storageKey);
    let items: unknown = [];
    try {
      items = JSON.parse(raw ?? '[]');
    } catch {
      // Unreadable: nothing to move, and nothing a person could recover from it either.
    }
    const events = Array.isArray(items) ? items.flatMap((item) => { const parsed = sessionEventSchema.safeParse(item); return parsed.success ? [parsed.data] : []; }) : [];
    if (Number.isInteger(orderId) && events.length > 0) {
      const tx = db.transaction('taps', 'readwrite');
      for (const [index, event] of events.entries()) {
        if (!(await tx.store.get(event.idempotencyKey))) {
          await tx.store.put({ key: event.idempotencyKey, orderId, event, state: 'unsent', keptAtMs: Date.now() + index, refusal: null });
        }
      }
      await tx.done;
    }
    // Removed only after the taps are safely in IndexedDB.
    globalThis.localStorage.removeItem(storageKey);
  }
}

/** A stored tap's local copy matters only until the session is fetched again; a day on, the session is long over. */
const storedCopyKeptMs = 24 * 3_600_000;

async function forgetOldStoredTaps(db: IDBPDatabase<TapDb>): Promise<void> {
  const tx = db.transaction('taps', 'readwrite');
  for (let cursor = await tx.store.openCursor(); cursor; cursor = await cursor.continue()) {
    if (cursor.value.state === 'stored' && cursor.value.keptAtMs < Date.now() - storedCopyKeptMs) await cursor.delete();
  }
  await tx.done;
}

const byTime = (a: KeptTap, b: KeptTap) => Date.parse(a.event.clientTime) - Date.parse(b.event.clientTime) || a.keptAtMs - b.keptAtMs;

function createTapStore(orderId: number): TapStore {
  const listeners = new Set<() => void>();
  let taps: readonly KeptTap[] = [];
  let loaded = false;
  let persistent = true;

  const notify = () => {
    for (const listener of listeners) listener();
  };
  const set = (next: KeptTap[]) => {
    taps = next.sort(byTime);
    notify();
  };

  /** Writes the changed taps (or deletes), then tells other tabs of this browser. */
  const persist = async (changed: readonly KeptTap[], deleted: readonly string[] = []) => {
    const db = await database();
    if (!db) {
      persistent = false;
      notify();
      return;
    }
    try {
      const tx = db.transaction('taps', 'readwrite');
      await Promise.all([...changed.map((tap) => tx.store.put(tap)), ...deleted.map((key) => tx.store.delete(key))]);
      await tx.done;
      channel?.postMessage(orderId);
    } catch {
      persistent = false;
      notify();
    }
  };

  const reload = async () => {
    const db = await database();
    if (!db) {
      persistent = false;
      loaded = true;
      notify();
      return;
    }
    try {
      const kept = await db.getAllFromIndex('taps', 'by-order', orderId);
      // Taps made in this page before the read finished are kept too.
      const fromDb = new Map(kept.map((tap) => [tap.key, tap]));
      const onlyHere = loaded ? [] : taps.filter((tap) => !fromDb.has(tap.key));
      loaded = true;
      set([...fromDb.values(), ...onlyHere]);
    } catch {
      persistent = false;
      loaded = true;
      notify();
    }
  };
  void reload();
  // Another tab of this browser changed the taps of this order: follow it.
  channel?.addEventListener('message', (message: MessageEvent<unknown>) => {
    if (message.data === orderId) void reload();
  });

  const change = (key: string, update: (tap: KeptTap) => KeptTap) => {
    const tap = taps.find((item) => item.key === key);
    if (!tap) return;
    const next = update(tap);
    set(taps.map((item) => (item.key === key ? next : item)));
    void persist([next]);
  };

  return {
    ready: () => loaded,
    taps: () => taps,
    add: (events) => {
      const nowMs = Date.now();
      const made = events.map((event, index): KeptTap => ({ key: event.idempotencyKey, orderId, event, state: 'unsent', keptAtMs: nowMs + index, refusal: null }));
      set([...taps, ...made]);
      void persist(made);
    },
    markStored: (key) => change(key, (tap) => ({ ...tap, state: 'stored', refusal: null })),
    markRefused: (key, refusal) => change(key, (tap) => ({ ...tap, state: 'refused', refusal })),
    requeue: (key) => change(key, (tap) => ({ ...tap, state: 'unsent', refusal: null })),
    discard: (key) => {
      if (!taps.some((tap) => tap.key === key)) return;
      set(taps.filter((tap) => tap.key !== key));
      void persist([], [key]);
    },
    forgetStored: (keysOnServer) => {
      const seen = taps.filter((tap) => tap.state === 'stored' && keysOnServer.has(tap.key)).map((tap) => tap.key);
      if (seen.length === 0) return;
      set(taps.filter((tap) => !seen.includes(tap.key)));
      void persist([], seen);
    },
    subscribe: (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    persistent: () => persistent,
  };
}

/** One store per order for the whole page, however many components read it. */
export function tapStoreFor(orderId: number): TapStore {
  let store = stores.get(orderId);
  if (!store) {
    store = createTapStore(orderId);
    stores.set(orderId, store);
  }
  return store;
}

/** A version-4 UUID; crypto.randomUUID exists only in secure contexts, getRandomValues everywhere. */
export function newIdempotencyKey(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  bytes[6] = ((bytes[6] ?? 0) & 0x0f) | 0x40;
  bytes[8] = ((bytes[8] ?? 0) & 0x3f) | 0x80;
  const hex = Array.from(bytes, (byte) => byte.toString(16).padStart(2, '0')).join('');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

/** A fresh copy of the session from the server holds these taps: this page's store (if it has one) may let its copies go. */
export function forgetStoredTaps(orderId: number, keysOnServer: ReadonlySet<string>): void {
  stores.get(orderId)?.forgetStored(keysOnServer);
}
