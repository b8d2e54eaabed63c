import type { SignOutStep } from '../../lib/sign-out';

/**
 * What the step clock does on sign-out: the person's unsent taps are sent first, while their
 * session still works. What cannot be sent stays in the tap store under the person's id, never
 * sent by anyone else. Ticks and typed reasons are kept drafts, dropped with the other drafts.
 * The sending code (and its schemas) loads only when someone signs out, not with the sign-in page;
 * the service worker keeps it, so this works offline too.
 */
export const stepClockSignOut: SignOutStep = {
  name: 'step-clock',
  send: async (personId) => (await import('./api/event-sync')).sendQueuedTapsOf(personId),
};
