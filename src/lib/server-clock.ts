/**
 * How far the server's clock is ahead of this device's, measured from the `serverTime` of every
 * session answer: the server read its clock somewhere between our send and our receipt, so the
 * midpoint is the best guess, good to half the round trip. Kept on the device, so a reload
 * without network still times taps the way the server would.
 */

interface OffsetSample {
  offsetMs: number;
  roundTripMs: number;
  measuredAtMs: number;
}

// The step clock's estimate, kept under the name it always had so a tablet keeps its measurement.
const storageKey = 'luxtempo.step-clock.server-offset';
/** Recent answers kept to judge a new one by. */
const windowSize = 5;
const windowMs = 10 * 60_000;

const listeners = new Set<() => void>();
let recent: OffsetSample[] = [];
let chosen: OffsetSample | null = readStored();

function readStored(): OffsetSample | null {
  try {
    const raw = globalThis.localStorage?.getItem(storageKey);
    if (!raw) return null;
    const value = JSON.parse(raw) as Partial<OffsetSample>;
    if (
      typeof value.offsetMs !== 'number' ||
      typeof value.roundTripMs !== 'number' ||
      typeof value.measuredAtMs !== 'number'
    )
      return null;
    return {
      offsetMs: value.offsetMs,
      roundTripMs: value.roundTripMs,
      measuredAtMs: value.measuredAtMs,
    };
  } catch {
    return null;
  }
}

/**
 * Server clock minus this device's clock (ms) from one answer: the server read its clock
 * somewhere between our send and our receipt, so the midpoint is the best guess. Null when the
 * answer's time is unreadable.
 */
export function offsetFromAnswer(
  serverTimeIso: string,
  sentAtMs: number,
  receivedAtMs: number,
): number | null {
  const serverMs = Date.parse(serverTimeIso);
  if (!Number.isFinite(serverMs)) return null;
  return Math.round(serverMs - (sentAtMs + receivedAtMs) / 2);
}

/**
 * The newest answer wins when it came back about as fast as the best recent one, so a device
 * clock that was corrected is followed at once; a slow answer (its midpoint could be off by half
 * its round trip) gives way to the fastest of the last few.
 */
export function recordServerTime(
  serverTimeIso: string,
  sentAtMs: number,
  receivedAtMs: number,
): void {
  const offsetMs = offsetFromAnswer(serverTimeIso, sentAtMs, receivedAtMs);
  if (offsetMs === null) return;
  const sample: OffsetSample = {
    offsetMs,
    roundTripMs: Math.max(0, receivedAtMs - sentAtMs),
    measuredAtMs: receivedAtMs,
  };
  recent = [
    ...recent.filter(
      (s) => receivedAtMs - s.measuredAtMs <= windowMs && s.measuredAtMs <= receivedAtMs,
    ),
    sample,
  ].slice(-windowSize);
  const fastest = recent.reduce((best, s) => (s.roundTripMs < best.roundTripMs ? s : best));
  const next = sample.roundTripMs <= fastest.roundTripMs * 2 + 20 ? sample : fastest;
  const changed = chosen?.offsetMs !== next.offsetMs;
  chosen = next;
  try {
    globalThis.localStorage?.setItem(storageKey, JSON.stringify(next));
  } catch {
    // Storage full or blocked: the offset still holds for this page.
  }
  if (changed) for (const listener of listeners) listener();
}

/** Server clock minus device clock, in ms; 0 until the first answer. */
export function serverOffsetMs(): number {
  return chosen?.offsetMs ?? 0;
}

/** The server's "now" by this device's clock. */
export function serverNowMs(): number {
  return Date.now() + serverOffsetMs();
}

export function subscribeServerOffset(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}
