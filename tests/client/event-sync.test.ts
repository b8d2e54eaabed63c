import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { eventSyncFor } from '../../src/features/step-clock/api/event-sync';
import { setCurrentPersonId } from '../../src/lib/current-person';
import type { KeptTap, Refusal, TapStore } from '../../src/features/step-clock/api/tap-store';
import type { SessionEventInput } from '../../shared/session/session-events';

// How the tablet sends its kept taps: what waiting can cure is retried, a refusal is kept apart
// with the server's reason. Times and keys are made up; nothing clinical is checked here.

/** The nurse signed in on the tablet, who made every tap here. */
const nurseId = 7;
const startMs = Date.parse('2026-03-02T09:00:00.000Z');
const drop = (n: number): SessionEventInput => ({
  type: 'drop-given',
  stepId: 'riboflavin-soak',
  idempotencyKey: `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`,
  clientTime: new Date(startMs + n * 1000).toISOString(),
});

/** The store's contract in memory: what the sender needs, nothing persisted; every tap is the signed-in nurse's. */
function memoryStore(orderId: number, events: SessionEventInput[]): TapStore {
  let taps: KeptTap[] = events.map((event, index) => ({
    key: event.idempotencyKey,
    orderId,
    by: nurseId,
    event,
    state: 'unsent',
    keptAtMs: index,
    refusal: null,
  }));
  const listeners = new Set<() => void>();
  const change = (key: string, update: (tap: KeptTap) => KeptTap) => {
    taps = taps.map((tap) => (tap.key === key ? update(tap) : tap));
    for (const listener of listeners) listener();
  };
  return {
    ready: () => true,
    taps: () => taps,
    ownerOf: (key) => taps.find((tap) => tap.key === key)?.by,
    heldForOthers: () => 0,
    heldUnowned: () => 0,
    add: () => undefined,
    markStored: (key) => change(key, (tap) => ({ ...tap, state: 'stored' })),
    markRefused: (key, refusal: Refusal) =>
      change(key, (tap) => ({ ...tap, state: 'refused', refusal })),
    requeue: (key) => change(key, (tap) => ({ ...tap, state: 'unsent', refusal: null })),
    discard: () => undefined,
    forgetStored: () => undefined,
    subscribe: (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    persistent: () => true,
  };
}

const stored = (orderId: number, event: SessionEventInput) =>
  new Response(
    JSON.stringify({
      orderId,
      status: 'in-session',
      event: { ...event, id: 1, serverTime: event.clientTime, recordedBy: 3 },
      eventCount: 1,
      replayed: false,
      record: null,
      deviations: [],
      serverTime: event.clientTime,
    }),
    { status: 201, headers: { 'Content-Type': 'application/json' } },
  );
const refusedWith = (
  status: number,
  code: string,
  message: string,
  headers: Record<string, string> = {},
) =>
  new Response(JSON.stringify({ error: { code, message } }), {
    status,
    headers: { 'Content-Type': 'application/json', ...headers },
  });

/** Answers each POST in turn from `script`, keyed by the tap's idempotency key; records what was sent. */
function scriptedServer(orderId: number, script: Record<string, (Response | 'network-down')[]>) {
  const sent: string[] = [];
  vi.stubGlobal('fetch', async (_url: string, init: RequestInit) => {
    const event = JSON.parse(String(init.body)) as SessionEventInput;
    sent.push(event.idempotencyKey);
    const next = script[event.idempotencyKey]?.shift() ?? stored(orderId, event);
    if (next === 'network-down') throw new TypeError('Failed to fetch');
    return next;
  });
  return sent;
}

const stateOf = (store: TapStore) =>
  store.taps().map((tap) => [tap.event.idempotencyKey.slice(-2), tap.state]);

describe('sending kept taps', () => {
  beforeEach(() => {
    vi.useFakeTimers();
    setCurrentPersonId(nurseId);
  });
  afterEach(() => {
    vi.useRealTimers();
    vi.unstubAllGlobals();
  });

  it('when the server is down (503) or unreachable, the tap stays unsent and goes again later with the same key', async () => {
    const orderId = 101;
    const [a, b] = [drop(1), drop(2)];
    const store = memoryStore(orderId, [a, b]);
    const sent = scriptedServer(orderId, {
      [a.idempotencyKey]: [
        refusedWith(503, 'db_down', 'The database is not answering.'),
        'network-down',
      ],
    });
    const sync = eventSyncFor(orderId, store);

    sync.pump();
    await vi.advanceTimersByTimeAsync(0);
    expect(stateOf(store)).toEqual([
      ['01', 'unsent'],
      ['02', 'unsent'],
    ]);
    expect(sync.state().retryAtMs).not.toBeNull();
    await vi.advanceTimersByTimeAsync(1_300);
    expect(stateOf(store)).toEqual([
      ['01', 'unsent'],
      ['02', 'unsent'],
    ]);
    expect(sync.state().offline).toBe(true);
    await vi.advanceTimersByTimeAsync(2_500);
    expect(stateOf(store)).toEqual([
      ['01', 'stored'],
      ['02', 'stored'],
    ]);
    expect(sent).toEqual([a.idempotencyKey, a.idempotencyKey, a.idempotencyKey, b.idempotencyKey]);
  });

  it('when the server asks to wait (429, Retry-After 5 s), nothing goes before those 5 s', async () => {
    const orderId = 102;
    const a = drop(1);
    const store = memoryStore(orderId, [a]);
    const sent = scriptedServer(orderId, {
      [a.idempotencyKey]: [
        refusedWith(429, 'rate_limited', 'Too many requests.', { 'Retry-After': '5' }),
      ],
    });
    eventSyncFor(orderId, store).pump();
    await vi.advanceTimersByTimeAsync(4_900);
    expect(sent).toHaveLength(1);
    expect(stateOf(store)).toEqual([['01', 'unsent']]);
    await vi.advanceTimersByTimeAsync(200);
    expect(stateOf(store)).toEqual([['01', 'stored']]);
  });

  it('when the server refuses a tap (409), it is kept as refused with the reason, never retried on its own, and later taps still go', async () => {
    const orderId = 103;
    const [a, b, c] = [drop(1), drop(2), drop(3)];
    const store = memoryStore(orderId, [a, b, c]);
    const sent = scriptedServer(orderId, {
      [b.idempotencyKey]: [
        refusedWith(409, 'session_ended', 'The session for order 103 is stopped.'),
      ],
    });
    const sync = eventSyncFor(orderId, store);

    sync.pump();
    await vi.advanceTimersByTimeAsync(60_000);
    expect(stateOf(store)).toEqual([
      ['01', 'stored'],
      ['02', 'refused'],
      ['03', 'stored'],
    ]);
    expect(store.taps()[1]!.refusal).toEqual({
      status: 409,
      message: 'The session for order 103 is stopped.',
      fields: [],
    });
    expect(sent).toEqual([a.idempotencyKey, b.idempotencyKey, c.idempotencyKey]);

    // Sent again by the nurse: the same key, once.
    sync.sendAgain(b.idempotencyKey);
    await vi.advanceTimersByTimeAsync(0);
    expect(stateOf(store)).toEqual([
      ['01', 'stored'],
      ['02', 'stored'],
      ['03', 'stored'],
    ]);
    expect(sent.filter((key) => key === b.idempotencyKey)).toHaveLength(2);
  });

  it('a 400 naming a field is a refusal too, and keeps the field’s message', async () => {
    const orderId = 104;
    const a = drop(1);
    const store = memoryStore(orderId, [a]);
    scriptedServer(orderId, {
      [a.idempotencyKey]: [
        new Response(
          JSON.stringify({
            error: {
              code: 'bad_request',
              message: 'The event is too old to belong to this session.',
              fields: [
                { path: 'clientTime', message: 'clientTime must lie within the last 12 hours' },
              ],
            },
          }),
          {
            status: 400,
            headers: { 'Content-Type': 'application/json' },
          },
        ),
      ],
    });
    eventSyncFor(orderId, store).pump();
    await vi.advanceTimersByTimeAsync(0);
    expect(store.taps()[0]!.state).toBe('refused');
    expect(store.taps()[0]!.refusal?.fields).toEqual([
      { path: 'clientTime', message: 'clientTime must lie within the last 12 hours' },
    ]);
  });
});
