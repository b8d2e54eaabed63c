import { matchPath } from 'react-router-dom';
import { paths } from '../config/paths';
import { takeOverMessage } from './sw-messages';

/** How long nobody has touched the page before a waiting new version may take over. */
export const updateIdleMs = 60_000;

export interface PageActivity {
  /** The client route the page shows. */
  pathname: string;
  /** Milliseconds since the last tap, click or key on the page. */
  idleMs: number;
  /** Taps of the person signed in that the server has not stored yet. */
  unsentTaps: number;
}

/**
 * A new app version installed while a page runs waits until the page is idle: not on a step
 * clock (a session may be running there, offline perhaps, and its code and files must stay one
 * version), no tap left to send, and nobody touching the screen for a minute. Then it takes over
 * and the page reloads into it; drafts and unsent taps are kept across reloads anyway.
 */
export function mayTakeUpdate(activity: PageActivity): boolean {
  return (
    matchPath(paths.stepClock.path, activity.pathname) === null &&
    activity.unsentTaps === 0 &&
    activity.idleMs >= updateIdleMs
  );
}

/**
 * Watches for a waiting new version and lets it take over once `mayTakeUpdate` allows, then
 * reloads so that the page runs the code that matches the files the new worker serves.
 */
export function takeUpdatesWhenIdle(
  registration: ServiceWorkerRegistration,
  unsentTaps: () => Promise<number>,
  checkEveryMs = 15_000,
): void {
  let lastInputAt = Date.now();
  for (const type of ['pointerdown', 'keydown'] as const)
    window.addEventListener(type, () => (lastInputAt = Date.now()), {
      capture: true,
      passive: true,
    });
  let asked = false;
  navigator.serviceWorker.addEventListener('controllerchange', () => {
    if (asked) window.location.reload();
  });
  setInterval(() => {
    const waiting = registration.waiting;
    if (!waiting || asked || !navigator.serviceWorker.controller) return;
    void unsentTaps().then((count) => {
      const activity = {
        pathname: window.location.pathname,
        idleMs: Date.now() - lastInputAt,
        unsentTaps: count,
      };
      if (!mayTakeUpdate(activity) || registration.waiting !== waiting) return;
      asked = true;
      waiting.postMessage(takeOverMessage);
    });
  }, checkEveryMs);
}
