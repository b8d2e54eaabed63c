import { useEffect, useState } from 'react';

export type WakeLockStatus = 'on' | 'unsupported' | 'refused' | 'off';

interface ScreenWakeLockSentinel {
  released: boolean;
  release: () => Promise<void>;
  addEventListener: (type: 'release', listener: () => void) => void;
}
interface ScreenWakeLock {
  request: (type: 'screen') => Promise<ScreenWakeLockSentinel>;
}

/**
 * Keeps the tablet's screen on while a session runs. The browser drops the lock whenever the
 * tab is hidden, so it is asked for again each time the tab comes back. Browsers without it, or
 * that refuse it (battery saver), are told apart so the screen can say so.
 */
export function useWakeLock(active: boolean): WakeLockStatus {
  const [status, setStatus] = useState<WakeLockStatus>('off');
  // Off again as soon as the session stops needing it, decided while rendering.
  const [wasActive, setWasActive] = useState(active);
  if (wasActive !== active) {
    setWasActive(active);
    if (!active) setStatus('off');
  }
  const supported = Boolean((navigator as Navigator & { wakeLock?: ScreenWakeLock }).wakeLock);

  useEffect(() => {
    const wakeLock = (navigator as Navigator & { wakeLock?: ScreenWakeLock }).wakeLock;
    if (!active || !wakeLock) return;
    let sentinel: ScreenWakeLockSentinel | null = null;
    let cancelled = false;

    const acquire = async () => {
      if (document.visibilityState !== 'visible' || (sentinel && !sentinel.released)) return;
      try {
        const lock = await wakeLock.request('screen');
        if (cancelled) {
          void lock.release().catch(() => undefined);
          return;
        }
        sentinel = lock;
        setStatus('on');
        lock.addEventListener('release', () => {
          if (!cancelled) setStatus('off');
        });
      } catch {
        if (!cancelled) setStatus('refused');
      }
    };
    const onVisibility = () => void acquire();

    void acquire();
    document.addEventListener('visibilitychange', onVisibility);
    return () => {
      cancelled = true;
      document.removeEventListener('visibilitychange', onVisibility);
      if (sentinel && !sentinel.released) void sentinel.release().catch(() => undefined);
    };
  }, [active]);

  if (!active) return 'off';
  return supported ? status : 'unsupported';
}
