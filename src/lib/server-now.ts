import { useSyncExternalStore } from 'react';

/*
 * One ticker for every countdown on a page. A tick only asks React to read the clock again; the
 * time shown is always worked out from the clock, never by counting ticks, so a tablet that
 * slept or a slow tab is right again the moment it wakes.
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

/*
 * This device's clock as the page reads it: once per whole second (the first read in that
 * second), so every render within a second agrees and React sees a steady value between ticks.
 */
let readSecond = Number.NaN;
let readMs = 0;
export function deviceNowMs(): number {
  const nowMs = Date.now();
  const second = Math.floor(nowMs / 1000);
  if (second !== readSecond) {
    readSecond = second;
    readMs = nowMs;
  }
  return readMs;
}

/** This device's clock in ms, re-read every second. */
export function useDeviceNowMs(): number {
  return useSyncExternalStore(subscribe, deviceNowMs, deviceNowMs);
}

/**
 * The server's "now" in ms, re-read every second: this device's clock corrected by the offset
 * (server clock minus device clock) measured from an answer such as Today's.
 */
export function useServerNowMs(clockOffsetMs: number): number {
  return useDeviceNowMs() + clockOffsetMs;
}
