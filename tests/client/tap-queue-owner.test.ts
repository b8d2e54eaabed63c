import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SessionEventInput } from '../../shared/session/session-events';

// The rule for a shared tablet: a kept tap is counted, listed and sent only under the session of
// the person who made it. The tap store runs here on an in-memory IndexedDB; fetch is a stand-in.
// Keys, times and ids are made up; nothing clinical is checked here.

afterEach(() => vi.unstubAllGlobals());

const tap = (n: number): SessionEventInput => ({
  idempotencyKey: `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`,
  clientTime: new Date(Date.UTC(2026, 2, 2, 9, 0, n)).toISOString(),
  type: 'drop-given',
  stepId: 'riboflavin-soak',
});
const keys = (taps: readonly { key: string }[]) => taps.map((item) => item.key);

/** A page load: fresh modules (no store, sender or signed-in person in memory); the IndexedDB stays. */
async function loadPage() {
  vi.resetModules();
  const person = await import('../../src/lib/current-person');
  const store = await import('../../src/features/step-clock/api/tap-store');
  const sync = await import('../../src/features/step-clock/api/event-sync');
  return { ...person, ...store, ...sync };
}

const untilReady = async (store: { ready: () => boolean }) => {
  await vi.waitFor(() => expect(store.ready()).toBe(true));
};
/** Lets the store's writes reach IndexedDB and the sender try what it will. */
const settle = () => new Promise((resolve) => setTimeout(resolve, 60));

/** A server that answers every tap with `status` and records the keys sent (201 answers as the server would). */
function server(status: number) {
  const sent: string[] = [];
  vi.stubGlobal('fetch', async (url: string, init: { body: string }) => {
    const event = JSON.parse(init.body) as SessionEventInput;
    sent.push(event.idempotencyKey);
    if (status !== 201)
      return new Response(
        JSON.stringify({ error: { code: 'db_down', message: 'The database is not answering.' } }),
        { status, headers: { 'Content-Type': 'application/json' } },
      );
    const orderId = Number(/orders\/(\d+)\//.exec(url)?.[1]);
    const body = {
      orderId,
      status: 'in-session',
      event: { ...event, id: 1, serverTime: event.clientTime, recordedBy: 3 },
      eventCount: 1,
      replayed: false,
      record: null,
      deviations: [],
      serverTime: event.clientTime,
    };
    return new Response(JSON.stringify(body), {
      status: 201,
      headers: { 'Content-Type': 'application/json' },
    });
  });
  return sent;
}

/** localStorage holding what an earlier version left, listed by Object.keys as in a browser. */
function legacyStorage(entries: Record<string, unknown>) {
  const items = new Map(
    Object.entries(entries).map(([key, value]) => [key, JSON.stringify(value)]),
  );
  const storage = {
    getItem: (key: string) => items.get(key) ?? null,
    setItem: (key: string, value: string) => void items.set(key, value),
    removeItem: (key: string) => void items.delete(key),
  };
  vi.stubGlobal(
    'localStorage',
    new Proxy(storage, {
      ownKeys: () => [...items.keys()],
      getOwnPropertyDescriptor: (_target, key) =>
        items.has(String(key))
          ? { enumerable: true, configurable: true, value: items.get(String(key)) }
          : undefined,
    }),
  );
  return items;
}

describe('kept step-clock taps on a shared tablet', () => {
  it('are counted, listed and sent only for the person who made them; the next person’s session never sends them', async () => {
    const page = await loadPage();
    const sent = server(503);
    page.setCurrentPersonId(11);
    const store = page.tapStoreFor(4242);
    await untilReady(store);
    store.add([tap(1), tap(2)]);
    expect(store.ownerOf(tap(1).idempotencyKey)).toBe(11);
    expect(keys(store.taps())).toEqual([tap(1).idempotencyKey, tap(2).idempotencyKey]);
    await settle();
    expect(await page.ordersWithUnsentTapsOf(11)).toContain(4242);
    sent.length = 0;

    // Nurse 11 signed out with the server down; nurse 12 signs in on the same tablet.
    page.setCurrentPersonId(12);
    expect(store.taps()).toEqual([]);
    expect(store.heldForOthers()).toBe(2);
    const sync = page.eventSyncFor(4242, store);
    sync.sendAgain(tap(1).idempotencyKey);
    store.discard(tap(1).idempotencyKey);
    await settle();
    expect(sent).toEqual([]);
    expect(store.heldForOthers()).toBe(2);

    // Nurse 12's own tap goes out under her session (the server is down: it stays unsent).
    store.add([tap(3)]);
    await settle();
    expect(sent).toEqual([tap(3).idempotencyKey]);
    expect(keys(store.taps())).toEqual([tap(3).idempotencyKey]);
    expect(await page.ordersWithUnsentTapsOf(12)).toEqual([4242]);

    // Nobody signed in: nothing may be kept, and nothing is sent.
    page.setCurrentPersonId(null);
    expect(() => store.add([tap(4)])).toThrow(/Nobody is signed in/);
    expect(store.heldForOthers()).toBe(3);

    // Nurse 11 is back: her taps go out, under her session, oldest first; nurse 12's does not.
    page.setCurrentPersonId(11);
    sent.length = 0;
    sync.sendAgain(tap(1).idempotencyKey);
    await settle();
    expect(sent[0]).toBe(tap(1).idempotencyKey);
    expect(sent).not.toContain(tap(3).idempotencyKey);
  });

  it('at sign-out, after a reload, the person’s unsent taps of every order are sent, and nobody else’s', async () => {
    let page = await loadPage();
    server(503);
    page.setCurrentPersonId(21);
    const first = page.tapStoreFor(5001);
    const second = page.tapStoreFor(5002);
    await untilReady(first);
    await untilReady(second);
    first.add([tap(11)]);
    second.add([tap(12)]);
    page.setCurrentPersonId(22);
    second.add([tap(13)]);
    await settle();

    // The tablet reloads; nurse 21 signs in and signs out at once, without opening any clock.
    page = await loadPage();
    const sent = server(201);
    page.setCurrentPersonId(22);
    await page.sendQueuedTapsOf(21);
    expect(sent).toEqual([]);
    page.setCurrentPersonId(21);
    await page.sendQueuedTapsOf(21);
    expect(sent.sort()).toEqual([tap(11).idempotencyKey, tap(12).idempotencyKey]);
    expect(await page.ordersWithUnsentTapsOf(21)).toEqual([]);
    expect(await page.ordersWithUnsentTapsOf(22)).toEqual([5002]);
  });

  it('a queue an earlier version left in localStorage moves once: named taps keep their person, unnamed ones go to the session open now', async () => {
    const legacyKey = 'luxtempo.step-clock.unsent.';
    const storage = legacyStorage({
      [`${legacyKey}7001`]: [tap(21), tap(22)],
      [`${legacyKey}7002`]: [
        { by: 32, event: tap(23) },
        { by: null, event: tap(24) },
        { nonsense: true },
      ],
    });
    const page = await loadPage();
    server(503);
    page.setCurrentPersonId(31);
    const unnamed = page.tapStoreFor(7001);
    const named = page.tapStoreFor(7002);
    await untilReady(unnamed);
    await untilReady(named);
    expect(unnamed.taps().map((item) => [item.key, item.by, item.state])).toEqual([
      [tap(21).idempotencyKey, 31, 'unsent'],
      [tap(22).idempotencyKey, 31, 'unsent'],
    ]);
    expect(keys(named.taps())).toEqual([tap(24).idempotencyKey]);
    expect(named.heldForOthers()).toBe(1);
    expect(named.ownerOf(tap(23).idempotencyKey)).toBe(32);
    expect([...storage.keys()]).toEqual([]);
  });

  it('with nobody signed in, a tap from before taps named their person has no owner: held, never sent', async () => {
    legacyStorage({ 'luxtempo.step-clock.unsent.8001': [tap(42)] });
    const page = await loadPage();
    const sent = server(201);
    // The store opens (and moves the old queue) while nobody is signed in.
    expect(await page.ordersWithUnsentTapsOf(51)).toEqual([]);
    page.setCurrentPersonId(51);
    const store = page.tapStoreFor(8001);
    await untilReady(store);
    expect(store.taps()).toEqual([]);
    expect(store.heldUnowned()).toBe(1);
    expect(store.ownerOf(tap(42).idempotencyKey)).toBeNull();
    page.eventSyncFor(8001, store).pump();
    await page.sendQueuedTapsOf(51);
    await settle();
    expect(sent).toEqual([]);

    expect(page.legacyTap(tap(41), null)).toEqual([{ by: null, event: tap(41) }]);
    expect(page.legacyTap({ by: 5, event: tap(41) }, null)).toEqual([{ by: 5, event: tap(41) }]);
    expect(page.legacyTap({ by: 'someone', event: tap(41) }, 9)).toEqual([
      { by: 9, event: tap(41) },
    ]);
    expect(page.legacyTap({ type: 'not-a-tap' }, 9)).toEqual([]);
  });
});
