import type { SignOutStep } from '../../lib/sign-out';
import { sendQueuedTapsOf } from './api/event-sync';

/**
 * What the step clock keeps for a person, and how it lets go on sign-out: queued taps are sent
 * first (what cannot be sent stays queued under the person's id, never sent by anyone else);
 * pre-treatment ticks and half-typed notes (sessionStorage) are dropped.
 */
export const stepClockSignOut: SignOutStep = {
  name: 'step-clock',
  send: sendQueuedTapsOf,
  clear: () => {
    for (const key of Object.keys(sessionStorage)) if (key.startsWith('luxtempo.step-clock.draft.')) sessionStorage.removeItem(key);
  },
};
