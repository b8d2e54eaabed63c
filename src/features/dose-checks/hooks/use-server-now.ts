import { useQuery } from '@tanstack/react-query';
import { useSyncExternalStore } from 'react';
import { doseCheckQueries } from '../api/dose-check-queries';

/*
 * One ticker for every countdown on the page. Each tick only asks React to read the clock again;
 * the time shown is always worked out from the clock, never by counting ticks, so a sleeping
 * tablet or a slow tab is right again the moment it wakes.
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

/** Server clock minus this device's clock, in ms, from /api/today (0 until it has answered). */
export function useClockOffsetMs(): number {
  return useQuery(doseCheckQueries.worklists()).data?.clockOffsetMs ?? 0;
}

/** The server's "now" in ms, re-read every second: this device's clock corrected by the offset. */
export function useServerNowMs(): number {
  const offsetMs = useClockOffsetMs();
  useSyncExternalStore(subscribe, currentSecond, currentSecond);
  return Date.now() + offsetMs;
}
