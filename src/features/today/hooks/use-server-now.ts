import { useSyncExternalStore } from 'react';

/*
 * One ticker for every countdown on Today. A tick only asks React to read the clock again; the
 * time shown is always worked out from the clock, never by counting ticks, so a tablet that
 * slept is right again the moment it wakes.
 */
const listeners = new Set<() => void>();
let timer: ReturnType<typeof setTimeout> | null = null;

function scheduleTick() {
  // Aligned to the next whole second so every countdown on screen changes together.
  timer = setTimeout(
    () => {
      for (const listener of listeners) listener();
      scheduleTick();
    },
    1000 - (Date.now() % 1000) + 5,
  );
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  if (timer === null) scheduleTick();
  return () => {
    listeners.delete(listener);
    if (listeners.size === 0 && timer !== null) {
      clearTimeout(timer);
      timer = null;
    }
  };
}

const currentSecond = () => Math.floor(Date.now() / 1000);

/** The server's "now" in ms, re-read every second: this device's clock corrected by the offset /api/today reported. */
export function useServerNowMs(clockOffsetMs: number): number {
  useSyncExternalStore(subscribe, currentSecond, currentSecond);
  return Date.now() + clockOffsetMs;
}
