import { sessionEventSchema, type SessionEventInput } from '../../../../shared/session/session-events';

/**
 * Taps not yet stored by the server, kept in this browser's storage per order. A tap is written
 * here before it is sent, so a reload, a lost network or a flat battery loses nothing; it leaves
 * only once the server has answered that it is stored.
 */
export interface EventQueue {
  /** The same array until something changes (what useSyncExternalStore needs). */
  list: () => readonly SessionEventInput[];
  add: (events: readonly SessionEventInput[]) => void;
  remove: (idempotencyKey: string) => void;
  subscribe: (listener: () => void) => () => void;
  /** False when the browser refuses storage (private mode, storage full): taps then live in this page only. */
  persistent: () => boolean;
}

const storagePrefix = 'luxtempo.step-clock.unsent.';
const queues = new Map<number, EventQueue>();

function readStorage(key: string): SessionEventInput[] | null {
  try {
    const raw = globalThis.localStorage?.getItem(key);
    if (raw === null || raw === undefined) return [];
    const value: unknown = JSON.parse(raw);
    if (!Array.isArray(value)) return [];
    return value.flatMap((item) => {
      const parsed = sessionEventSchema.safeParse(item);
      return parsed.success ? [parsed.data] : [];
    });
  } catch {
    return null;
  }
}

function createEventQueue(orderId: number): EventQueue {
  const key = `${storagePrefix}${orderId}`;
  const listeners = new Set<() => void>();
  const stored = readStorage(key);
  let items: readonly SessionEventInput[] = stored ?? [];
  let persistent = stored !== null;

  const notify = () => {
    for (const listener of listeners) listener();
  };
  const write = (next: readonly SessionEventInput[]) => {
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
    list: () => items,
    add: (events) => write([...items, ...events]),
    remove: (idempotencyKey) => {
      if (items.some((item) => item.idempotencyKey === idempotencyKey)) write(items.filter((item) => item.idempotencyKey !== idempotencyKey));
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
