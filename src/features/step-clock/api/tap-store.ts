import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import {
  sessionEventSchema,
  type SessionEventInput,
} from '../../../../shared/session/session-events';
import type { FieldProblem } from '../../../lib/api-client';
import { currentPersonId } from '../../../lib/current-person';
import { onFreshSession } from '../../../lib/queries/sessions';

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
 *
 * Each tap is kept with the id of the person who made it. On a shared tablet only that person's
 * session ever counts, lists or sends it: taps one nurse could not send before signing out wait
 * for her to sign in again, and the next person sees only that they are there.
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
  /** Who made the tap; null for a tap kept before taps named their person that nobody's session could claim (held, never sent). */
  by: number | null;
  event: SessionEventInput;
  state: TapState;
  /** Device clock when the tablet kept it; with the tap's own time it orders the queue. */
  keptAtMs: number;
  refusal: Refusal | null;
}

export interface TapStore {
  /** False until the taps kept before this page loaded have been read: until then the clock must not be drawn. */
  ready: () => boolean;
  /** The signed-in person's kept taps of the order, oldest first; the same array until something (or the person) changes. */
  taps: () => readonly KeptTap[];
  /** Who made a kept tap (null: nobody known), undefined when the tablet does not keep it. */
  ownerOf: (key: string) => number | null | undefined;
  /** Unsent or refused taps of this order that another person made here: held for them, never sent under this session. */
  heldForOthers: () => number;
  /** Unsent or refused taps of this order whose maker is not known: held, never sent. */
  heldUnowned: () => number;
  /** Keeps the signed-in person's taps; refuses (throws) when nobody is signed in. */
  add: (events: readonly SessionEventInput[]) => void;
  markStored: (key: string) => void;
  markRefused: (key: string, refusal: Refusal) => void;
  /** A refused tap of the signed-in person goes back to the queue, to be sent again. */
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

/**
 * Queues left in localStorage by earlier versions move into IndexedDB once; a tap already there
 * is not doubled. A tap the earlier version kept with its person's id keeps it. One kept before
 * taps named their person is given to the person whose session is open now, if one is: that
 * version sent its queue under whichever session opened the clock, so this sends it as it would
 * have. With nobody signed in it stays without an owner, held and never sent.
 */
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
    const openSession = currentPersonId();
    const legacy = Array.isArray(items)
      ? items.flatMap((item) => legacyTap(item, openSession))
      : [];
    if (Number.isInteger(orderId) && legacy.length > 0) {
      const tx = db.transaction('taps', 'readwrite');
      for (const [index, { by, event }] of legacy.entries()) {
        if (!(await tx.store.get(event.idempotencyKey))) {
          await tx.store.put({
            key: event.idempotencyKey,
            orderId,
            by,
            event,
            state: 'unsent',
            keptAtMs: Date.now() + index,
            refusal: null,
          });
        }
      }
      await tx.done;
    }
    // Removed only after the taps are safely in IndexedDB.
    globalThis.localStorage.removeItem(storageKey);
  }
}

/**
 * One item of an earlier version's queue: a bare event (before taps named their person) or
 * `{ by, event }`. Unreadable items are dropped. `openSession` is who is signed in now, if anyone.
 */
export function legacyTap(
  item: unknown,
  openSession: number | null,
): { by: number | null; event: SessionEventInput }[] {
  const wrapped = typeof item === 'object' && item !== null && 'event' in item;
  const parsed = sessionEventSchema.safeParse(wrapped ? (item as { event: unknown }).event : item);
  if (!parsed.success) return [];
  const by = wrapped ? (item as { by?: unknown }).by : null;
  return [
    { by: typeof by === 'number' && Number.isInteger(by) ? by : openSession, event: parsed.data },
  ];
}

/** A stored tap's local copy matters only until the session is fetched again; a day on, the session is long over. */
const storedCopyKeptMs = 24 * 3_600_000;

async function forgetOldStoredTaps(db: IDBPDatabase<TapDb>): Promise<void> {
  const tx = db.transaction('taps', 'readwrite');
  for (let cursor = await tx.store.openCursor(); cursor; cursor = await cursor.continue()) {
    if (cursor.value.state === 'stored' && cursor.value.keptAtMs < Date.now() - storedCopyKeptMs)
      await cursor.delete();
  }
  await tx.done;
}

const byTime = (a: KeptTap, b: KeptTap) =>
  Date.parse(a.event.clientTime) - Date.parse(b.event.clientTime) || a.keptAtMs - b.keptAtMs;

const waiting = (tap: KeptTap) => tap.state !== 'stored';

function createTapStore(orderId: number): TapStore {
  const listeners = new Set<() => void>();
  /** Every kept tap of the order, whoever made it. */
  let taps: readonly KeptTap[] = [];
  // The signed-in person's view, rebuilt only when the taps or the person change (useSyncExternalStore needs the same array).
  let own: { for: number | null; of: readonly KeptTap[]; taps: readonly KeptTap[] } = {
    for: null,
    of: [],
    taps: [],
  };
  const ownTaps = () => {
    const person = currentPersonId();
    if (own.for !== person || own.of !== taps)
      own = {
        for: person,
        of: taps,
        taps: taps.filter((tap) => person !== null && tap.by === person),
      };
    return own.taps;
  };
  const isOwn = (key: string) => ownTaps().some((tap) => tap.key === key);
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
      await Promise.all([
        ...changed.map((tap) => tx.store.put(tap)),
        ...deleted.map((key) => tx.store.delete(key)),
      ]);
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
    taps: ownTaps,
    ownerOf: (key) => taps.find((tap) => tap.key === key)?.by,
    heldForOthers: () => {
      const person = currentPersonId();
      return taps.filter((tap) => waiting(tap) && tap.by !== null && tap.by !== person).length;
    },
    heldUnowned: () => taps.filter((tap) => waiting(tap) && tap.by === null).length,
    add: (events) => {
      const by = currentPersonId();
      if (by === null) throw new Error('Nobody is signed in: a tap cannot be kept.');
      const nowMs = Date.now();
      const made = events.map((event, index): KeptTap => ({
        key: event.idempotencyKey,
        orderId,
        by,
        event,
        state: 'unsent',
        keptAtMs: nowMs + index,
        refusal: null,
      }));
      set([...taps, ...made]);
      void persist(made);
    },
    markStored: (key) => change(key, (tap) => ({ ...tap, state: 'stored', refusal: null })),
    markRefused: (key, refusal) => change(key, (tap) => ({ ...tap, state: 'refused', refusal })),
    requeue: (key) => {
      if (isOwn(key)) change(key, (tap) => ({ ...tap, state: 'unsent', refusal: null }));
    },
    discard: (key) => {
      if (!isOwn(key)) return;
      set(taps.filter((tap) => tap.key !== key));
      void persist([], [key]);
    },
    forgetStored: (keysOnServer) => {
      const seen = taps
        .filter((tap) => tap.state === 'stored' && keysOnServer.has(tap.key))
        .map((tap) => tap.key);
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

// Whichever screen fetched the session, a fresh copy lets this page's stores drop what it holds.
onFreshSession((orderId, state) =>
  forgetStoredTaps(orderId, new Set(state.events.map((event) => event.idempotencyKey))),
);

/** The orders for which this tablet keeps unsent taps made by this person (read from IndexedDB, every order). */
export async function ordersWithUnsentTapsOf(personId: number): Promise<number[]> {
  const db = await database();
  if (!db)
    return [...stores.entries()]
      .filter(
        ([, store]) =>
          currentPersonId() === personId && store.taps().some((tap) => tap.state === 'unsent'),
      )
      .map(([orderId]) => orderId);
  try {
    const all = await db.getAll('taps');
    return [
      ...new Set(
        all
          .filter((tap) => tap.by === personId && tap.state === 'unsent')
          .map((tap) => tap.orderId),
      ),
    ];
  } catch {
    return [];
  }
}
