import { sessionEventSchema, type SessionEventInput } from '../../../../shared/session/session-events';
import { currentPersonId } from '../../../lib/current-person';

/**
 * Taps not yet stored by the server, kept in this browser's storage per order. A tap is written
 * here before it is sent, so a reload, a lost network or a flat battery loses nothing; it leaves
 * only once the server has answered that it is stored.
 *
 * Each tap is kept with the id of the person who made it. Only that person's session ever sends
 * it: on a shared tablet, taps one nurse could not send before signing out wait for her to sign
 * in again and are never sent (or shown) under the next person's session.
 */
export interface EventQueue {
  /** The signed-in person's own taps; the same array until something changes (what useSyncExternalStore needs). */
  list: () => readonly SessionEventInput[];
  /** Who made a queued tap (null for a tap queued before taps named their person). */
  ownerOf: (idempotencyKey: string) => number | null | undefined;
  /** Taps of other people, held here for them. */
  heldForOthers: () => number;
  add: (events: readonly SessionEventInput[]) => void;
  remove: (idempotencyKey: string) => void;
  subscribe: (listener: () => void) => () => void;
  /** False when the browser refuses storage (private mode, storage full): taps then live in this page only. */
  persistent: () => boolean;
}

const storagePrefix = 'luxtempo.step-clock.unsent.';
const queues = new Map<number, EventQueue>();

/** A queued tap and the person who made it. */
type QueuedTap = { by: number | null; event: SessionEventInput };

function readStorage(key: string): QueuedTap[] | null {
  try {
    const raw = globalThis.localStorage?.getItem(key);
    if (raw === null || raw === undefined) return [];
    const value: unknown = JSON.parse(raw);
    if (!Array.isArray(value)) return [];
    return value.flatMap((item: unknown) => {
      const wrapped = typeof item === 'object' && item !== null && 'event' in item;
      const parsed = sessionEventSchema.safeParse(wrapped ? (item as { event: unknown }).event : item);
      const by = wrapped ? (item as { by?: unknown }).by : null;
      return parsed.success ? [{ by: typeof by === 'number' ? by : null, event: parsed.data }] : [];
    });
  } catch {
    return null;
  }
}

/** The orders with taps queued in this browser, whoever made them. */
export function queuedOrderIds(): number[] {
  try {
    return Object.keys(globalThis.localStorage ?? {})
      .filter((key) => key.startsWith(storagePrefix))
      .map((key) => Number(key.slice(storagePrefix.length)))
      .filter((id) => Number.isInteger(id) && id > 0);
  } catch {
    return [];
  }
}

function createEventQueue(orderId: number): EventQueue {
  const key = `${storagePrefix}${orderId}`;
  const listeners = new Set<() => void>();
  const stored = readStorage(key);
  let items: readonly QueuedTap[] = stored ?? [];
  let persistent = stored !== null;
  // The signed-in person's view of the queue, rebuilt only when the queue or the person changes.
  let own: { for: number | null; of: readonly QueuedTap[]; list: readonly SessionEventInput[] } = { for: null, of: [], list: [] };
  const ownList = () => {
    const person = currentPersonId();
    if (own.for !== person || own.of !== items) own = { for: person, of: items, list: items.filter((item) => person !== null && item.by === person).map((item) => item.event) };
    return own.list;
  };

  const notify = () => {
    for (const listener of listeners) listener();
  };
  const write = (next: readonly QueuedTap[]) => {
    items = next;
    try {
      if (next.length === 0) globalThis.localStorage.removeItem(key);
      else globalThis.localStorage.setItem(key, JSON.stringify(next));
      persistent = true;
    } catch {
      persistent = false;
    }
    notify();
  };

  // Another tab of the same session sent or added taps: follow it.
  globalThis.addEventListener?.('storage', (event) => {
    if (event.key !== key) return;
    const fresh = readStorage(key);
    if (fresh === null) return;
    items = fresh;
    notify();
  });

  return {
    list: ownList,
    ownerOf: (idempotencyKey) => items.find((item) => item.event.idempotencyKey === idempotencyKey)?.by,
    heldForOthers: () => items.filter((item) => item.by === null || item.by !== currentPersonId()).length,
    add: (events) => {
      const by = currentPersonId();
      if (by === null) throw new Error('Nobody is signed in: a tap cannot be queued.');
      write([...items, ...events.map((event) => ({ by, event }))]);
    },
    remove: (idempotencyKey) => {
      if (items.some((item) => item.event.idempotencyKey === idempotencyKey)) write(items.filter((item) => item.event.idempotencyKey !== idempotencyKey));
    },
    subscribe: (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    persistent: () => persistent,
  };
}

/** One queue per order for the whole page, however many components read it. */
export function eventQueueFor(orderId: number): EventQueue {
  let queue = queues.get(orderId);
  if (!queue) {
    queue = createEventQueue(orderId);
    queues.set(orderId, queue);
  }
  return queue;
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
