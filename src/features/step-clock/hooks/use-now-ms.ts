import { useCallback, useEffect, useRef, useState } from 'react';

/**
 * This device's clock, read again every `intervalMs`, at once when the tab comes back into view,
 * and at the exact moment the screen says a shown number will change (`wakeAt`, on this device's clock). Screens work
 * out what to show from this instant and the events, never by counting ticks, so a throttled or
 * sleeping tab is right on its first frame back, and a second changes on time, not up to a
 * tick late.
 */
export function useNowMs(intervalMs = 250): {
  nowMs: number;
  wakeAt: (deviceMs: number | null) => void;
} {
  const [nowMs, setNowMs] = useState(() => Date.now());
  const wakeTimer = useRef<ReturnType<typeof setTimeout> | null>(null);

  useEffect(() => {
    const update = () => setNowMs(Date.now());
    const timer = setInterval(update, intervalMs);
    document.addEventListener('visibilitychange', update);
    window.addEventListener('focus', update);
    window.addEventListener('pageshow', update);
    // A frozen tab (a sleeping tablet, a discarded background tab) fires "resume" when it wakes.
    document.addEventListener('resume', update);
    return () => {
      document.removeEventListener('resume', update);
      clearInterval(timer);
      if (wakeTimer.current !== null) clearTimeout(wakeTimer.current);
      document.removeEventListener('visibilitychange', update);
      window.removeEventListener('focus', update);
      window.removeEventListener('pageshow', update);
    };
  }, [intervalMs]);

  const wakeAt = useCallback(
    (atMs: number | null) => {
      if (wakeTimer.current !== null) clearTimeout(wakeTimer.current);
      wakeTimer.current = null;
      if (atMs === null) return;
      // Measured from now, not from the render that asked: the effect runs a little after it.
      const delayMs = atMs - Date.now();
      // The regular tick comes soon enough for anything further off.
      if (delayMs >= intervalMs) return;
      wakeTimer.current = setTimeout(
        () => {
          wakeTimer.current = null;
          setNowMs(Date.now());
        },
        Math.max(0, delayMs) + 2,
      );
    },
    [intervalMs],
  );

  return { nowMs, wakeAt };
}
