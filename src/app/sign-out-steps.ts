import { stepClockSignOut } from '../features/step-clock/sign-out';
import { dropAllDrafts } from '../lib/form-draft';
import { clearOfflineCopies } from '../lib/offline-cache';
import { queryClient } from '../lib/query-client';
import { onSignOut } from '../lib/sign-out';

/** Everything the browser keeps for a person, let go on sign-out (see src/lib/sign-out.ts). */
export function registerSignOutSteps(): void {
  onSignOut({ name: 'query-cache', clear: () => queryClient.clear() });
  // The step clock's ticks and typed reasons are kept drafts too, so this drops them as well.
  onSignOut({ name: 'form-drafts', clear: dropAllDrafts });
  // The service worker's copies of this person's API answers (orders, sessions, who is signed in).
  onSignOut({ name: 'offline-copies', clear: clearOfflineCopies });
  onSignOut(stepClockSignOut);
}
