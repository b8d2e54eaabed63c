import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { SessionEventInput } from '../../shared/session/session-events';

// The rule for a shared tablet: a queued tap is sent only under the session of the person who
// made it. The queue and its sender run here without a browser: storage and fetch are stand-ins.

class MemoryStorage {
  private items = new Map<string, string>();
  getItem = (key: string) => this.items.get(key) ?? null;
  setItem = (key: string, value: string) => void this.items.set(key, String(value));
  removeItem = (key: string) => void this.items.delete(key);
  clear = () => this.items.clear();
  key = (i: number) => [...this.items.keys()][i] ?? null;
  get length() {
    return this.items.size;
  }
}

beforeAll(() => {
  const storage = new MemoryStorage();
  // Object.keys(localStorage) must list the stored keys, as in a browser.
  const proxy = new Proxy(storage, {
    ownKeys: () => [...(storage as unknown as { items: Map<string, string> }).items.keys()],
    getOwnPropertyDescriptor: (_t, key) => ({ enumerable: true, configurable: true, value: storage.getItem(String(key)) }),
  });
  vi.stubGlobal('localStorage', proxy);
});
afterEach(() => vi.unstubAllGlobals());

const tap = (n: number): SessionEventInput => ({
  idempotencyKey: `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`,
  clientTime: new Date(Date.UTC(2026, 2, 2, 9, 0, n)).toISOString(),
  type: 'drop-given',
  stepId: 'riboflavin-soak',
});

describe('queued step-clock taps on a shared tablet', () => {
  it('are shown and sent only to the person who made them; the next person’s session never sends them', async () => {
    const { setCurrentPersonId } = await import('../../src/lib/current-person');
    const { eventQueueFor, queuedOrderIds } = await import('../../src/features/step-clock/api/event-queue');
    const { eventSyncFor } = await import('../../src/features/step-clock/api/event-sync');
    const sent: string[] = [];
    vi.stubGlobal('fetch', async (_url: string, init: { body: string }) => {
      sent.push(JSON.parse(init.body).idempotencyKey);
      return new Response(null, { status: 503 });
    });

    setCurrentPersonId(11);
    const queue = eventQueueFor(4242);
    queue.add([tap(1), tap(2)]);
    expect(queuedOrderIds()).toContain(4242);
    expect(queue.ownerOf(tap(1).idempotencyKey)).toBe(11);

    // Nurse 11 signed out with the network down; nurse 12 signs in on the same tablet.
    setCurrentPersonId(12);
    expect(queue.list()).toEqual([]);
    expect(queue.heldForOthers()).toBe(2);
    const sync = eventSyncFor(4242, queue);
    sync.pump();
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(sent).toEqual([]);
    // Nurse 12's own tap goes out under her session (the server is down: it stays queued).
    queue.add([tap(3)]);
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(sent).toEqual([tap(3).idempotencyKey]);
    expect(queue.list().map((e) => e.idempotencyKey)).toEqual([tap(3).idempotencyKey]);

    // Nobody signed in: nothing may be queued or sent.
    setCurrentPersonId(null);
    expect(() => queue.add([tap(4)])).toThrow(/Nobody is signed in/);

    // Nurse 11 is back: her taps go out, under her session, oldest first.
    setCurrentPersonId(11);
    sent.length = 0;
    sync.sendAgain();
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(sent[0]).toBe(tap(1).idempotencyKey);
    expect(sent).not.toContain(tap(3).idempotencyKey);
  });
});
