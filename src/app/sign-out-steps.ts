import { stepClockSignOut } from '../features/step-clock/sign-out';
import { dropAllDrafts } from '../lib/form-draft';
import { queryClient } from '../lib/query-client';
import { onSignOut } from '../lib/sign-out';

/** Everything the browser keeps for a person, let go on sign-out (see src/lib/sign-out.ts). */
export function registerSignOutSteps(): void {
  onSignOut({ name: 'query-cache', clear: () => queryClient.clear() });
  onSignOut({ name: 'form-drafts', clear: dropAllDrafts });
  onSignOut(stepClockSignOut);
}
