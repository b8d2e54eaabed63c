import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

// How the client estimates the server's clock from an answer's serverTime (src/lib/server-clock.ts)
// and shows it (src/lib/server-now.ts). Times are made up; nothing clinical is checked here.

const t0 = Date.parse('2026-03-02T09:00:00.000Z');
const iso = (ms: number) => new Date(ms).toISOString();

/** A fresh page: no offset measured yet, nothing kept. */
async function loadPage() {
  vi.resetModules();
  return import('../../src/lib/server-clock');
}

describe('one answer', () => {
  it('puts the server’s reading at the midpoint of the round trip', async () => {
    const { offsetFromAnswer } = await loadPage();
    // Sent at t0, back at t0 + 200 ms; the server read 10:00:05.100, i.e. 5 s ahead of the midpoint.
    expect(offsetFromAnswer(iso(t0 + 100 + 5_000), t0, t0 + 200)).toBe(5_000);
    expect(offsetFromAnswer(iso(t0 - 2_000 + 50), t0, t0 + 100)).toBe(-2_000);
  });

  it('gives no offset for an unreadable time', async () => {
    const { offsetFromAnswer } = await loadPage();
    expect(offsetFromAnswer('not a time', t0, t0 + 100)).toBeNull();
  });
});

describe('choosing among answers', () => {
  beforeEach(() => vi.stubGlobal('localStorage', undefined));
  afterEach(() => vi.unstubAllGlobals());

  it('is 0 until the first answer, then follows a fast answer at once', async () => {
    const clock = await loadPage();
    expect(clock.serverOffsetMs()).toBe(0);
    clock.recordServerTime(iso(t0 + 50 + 3_000), t0, t0 + 100);
    expect(clock.serverOffsetMs()).toBe(3_000);
    // The device clock was corrected: the next fast answer is followed, not averaged away.
    clock.recordServerTime(iso(t0 + 60_050 + 1_000), t0 + 60_000, t0 + 60_100);
    expect(clock.serverOffsetMs()).toBe(1_000);
  });

  it('lets a slow answer give way to the fastest recent one', async () => {
    const clock = await loadPage();
    clock.recordServerTime(iso(t0 + 50 + 3_000), t0, t0 + 100);
    // 4 s there and back: its midpoint could be 2 s off, so the 100 ms answer's offset stays.
    clock.recordServerTime(iso(t0 + 12_000 + 4_500), t0 + 10_000, t0 + 14_000);
    expect(clock.serverOffsetMs()).toBe(3_000);
  });

  it('forgets answers older than the window, so a slow answer is then the best there is', async () => {
    const clock = await loadPage();
    clock.recordServerTime(iso(t0 + 50 + 3_000), t0, t0 + 100);
    const later = t0 + 11 * 60_000;
    clock.recordServerTime(iso(later + 2_000 + 4_500), later, later + 4_000);
    expect(clock.serverOffsetMs()).toBe(4_500);
  });

  it('tells its listeners when the offset changes, and only then', async () => {
    const clock = await loadPage();
    const heard = vi.fn();
    clock.subscribeServerOffset(heard);
    clock.recordServerTime(iso(t0 + 50 + 3_000), t0, t0 + 100);
    clock.recordServerTime(iso(t0 + 1_050 + 3_000), t0 + 1_000, t0 + 1_100);
    expect(heard).toHaveBeenCalledTimes(1);
  });

  it('keeps the offset on the device, so a reload without network times taps alike', async () => {
    const kept = new Map<string, string>();
    vi.stubGlobal('localStorage', {
      getItem: (key: string) => kept.get(key) ?? null,
      setItem: (key: string, value: string) => void kept.set(key, value),
    });
    (await loadPage()).recordServerTime(iso(t0 + 50 + 7_000), t0, t0 + 100);
    expect((await loadPage()).serverOffsetMs()).toBe(7_000);
  });
});

describe('the server’s now on screen', () => {
  afterEach(() => vi.useRealTimers());

  it('is read once per whole second, so every render within a second agrees', async () => {
    vi.useFakeTimers();
    vi.setSystemTime(t0 + 200);
    const { deviceNowMs } = await import('../../src/lib/server-now');
    expect(deviceNowMs()).toBe(t0 + 200);
    vi.setSystemTime(t0 + 900);
    expect(deviceNowMs()).toBe(t0 + 200);
    vi.setSystemTime(t0 + 1_010);
    expect(deviceNowMs()).toBe(t0 + 1_010);
  });
});
