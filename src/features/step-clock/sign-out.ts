import type { SignOutStep } from '../../lib/sign-out';
import { sendQueuedTapsOf } from './api/event-sync';

/**
 * What the step clock does on sign-out: the person's unsent taps are sent first, while their
 * session still works. What cannot be sent stays in the tap store under the person's id, never
 * sent by anyone else. Ticks and typed reasons are kept drafts, dropped with the other drafts.
 */
export const stepClockSignOut: SignOutStep = {
  name: 'step-clock',
  send: sendQueuedTapsOf,
};
