import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SessionEventInput } from '../../shared/session/session-events';

// The step clock's kept taps on the real store (an in-memory IndexedDB) with the real sender:
// sent in the order made, each once, kept across a reload while the server cannot take them, and
// let go once a fresh copy of the session shows them. Keys, times and ids are made up; nothing
// clinical is checked here.

afterEach(() => vi.unstubAllGlobals());

const tap = (n: number): SessionEventInput => ({
  idempotencyKey: `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`,
  clientTime: new Date(Date.UTC(2026, 2, 2, 10, 0, n)).toISOString(),
  type: 'drop-given',
  stepId: 'riboflavin-soak',
});
const keyOf = (n: number) => tap(n).idempotencyKey;

/** A page load: fresh modules; the IndexedDB stays. */
async function loadPage() {
  vi.resetModules();
  const person = await import('../../src/lib/current-person');
  const store = await import('../../src/features/step-clock/api/tap-store');
  const sync = await import('../../src/features/step-clock/api/event-sync');
  const sessions = await import('../../src/lib/queries/sessions');
  return { ...person, ...store, ...sync, ...sessions };
}

const untilReady = async (store: { ready: () => boolean }) => {
  await vi.waitFor(() => expect(store.ready()).toBe(true), { timeout: 5_000 });
};
const settle = () => new Promise((resolve) => setTimeout(resolve, 60));

const json = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

/** A server that takes each tap after `delayMs` (or answers `status`), recording the keys it got. */
function server({ status = 201, delayMs = 5 }: { status?: number; delayMs?: number } = {}) {
  const sent: string[] = [];
  let stored = 0;
  const events: unknown[] = [];
  vi.stubGlobal('fetch', async (url: string, init?: { body?: string }) => {
    const orderId = Number(/orders\/(\d+)\//.exec(url)?.[1]);
    if (!init?.body) {
      // GET /orders/:id/session: the events stored so far.
      return json(200, {
        orderId,
        status: 'in-session',
        events,
        record: null,
        deviations: [],
        serverTime: new Date().toISOString(),
      });
    }
    const event = JSON.parse(init.body) as SessionEventInput;
    sent.push(event.idempotencyKey);
    await new Promise((resolve) => setTimeout(resolve, delayMs));
    if (status !== 201)
      return json(status, {
        error: { code: 'db_down', message: 'The database is not answering.' },
      });
    stored += 1;
    const storedEvent = { ...event, id: stored, serverTime: event.clientTime, recordedBy: 3 };
    events.push(storedEvent);
    return json(201, {
      orderId,
      status: 'in-session',
      event: storedEvent,
      eventCount: stored,
      replayed: false,
      record: null,
      deviations: [],
      serverTime: event.clientTime,
    });
  });
  return sent;
}

describe('kept taps and their sender', () => {
  it('sends taps in the order they were made, each once, however often the sender is woken', async () => {
    const page = await loadPage();
    const sent = server({ delayMs: 15 });
    page.setCurrentPersonId(31);
    const store = page.tapStoreFor(5101);
    await untilReady(store);
    const sync = page.eventSyncFor(5101, store);
    store.add([tap(1), tap(2)]);
    sync.pump();
    store.add([tap(3)]);
    sync.pump();
    sync.pump();
    await vi.waitFor(
      () => expect(store.taps().every((kept) => kept.state === 'stored')).toBe(true),
      { timeout: 5_000 },
    );
    expect(sent).toEqual([keyOf(1), keyOf(2), keyOf(3)]);
  });

  it('keeps unsent taps across a reload, in order, and sends them once the server takes them', async () => {
    let page = await loadPage();
    server({ status: 503 });
    page.setCurrentPersonId(32);
    let store = page.tapStoreFor(5102);
    await untilReady(store);
    store.add([tap(4), tap(5), tap(6)]);
    await settle();
    expect(store.taps().map((kept) => kept.state)).toEqual(['unsent', 'unsent', 'unsent']);

    // The tablet reloads; the server is back.
    page = await loadPage();
    const sent = server();
    page.setCurrentPersonId(32);
    store = page.tapStoreFor(5102);
    await untilReady(store);
    expect(store.taps().map((kept) => kept.key)).toEqual([keyOf(4), keyOf(5), keyOf(6)]);
    page.eventSyncFor(5102, store).pump();
    await vi.waitFor(
      () => expect(store.taps().every((kept) => kept.state === 'stored')).toBe(true),
      { timeout: 5_000 },
    );
    expect(sent).toEqual([keyOf(4), keyOf(5), keyOf(6)]);
  });

  it('lets stored taps go when any screen fetches a fresh copy of the session that shows them', async () => {
    const page = await loadPage();
    server();
    page.setCurrentPersonId(33);
    const store = page.tapStoreFor(5103);
    await untilReady(store);
    const sync = page.eventSyncFor(5103, store);
    store.add([tap(7), tap(8)]);
    sync.pump();
    await vi.waitFor(
      () => expect(store.taps().map((kept) => kept.state)).toEqual(['stored', 'stored']),
      { timeout: 5_000 },
    );
    // The order's screen (not the step clock) reads the session through the one session query.
    await page.getSession(5103);
    expect(store.taps()).toEqual([]);
  });
});
