import { QueryClientProvider } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { ErrorBoundary } from '../components/ui/error-boundary';
import { authQueries } from '../features/auth/api/auth-queries';
import { setUnauthorizedHandler } from '../lib/api-client';
import { setCurrentPersonId } from '../lib/current-person';
import { rememberWhySessionEnded } from '../lib/session-ended';
import { queryClient } from '../lib/query-client';
import { CrashScreen } from './crash-screen';
import { registerSignOutSteps } from './sign-out-steps';

registerSignOutSteps();

// A 401 from any call but sign-in means the session ended (expired, or signed out elsewhere).
// Marking the session empty makes the signed-in layout send the person to sign in, keeping
// the page they were on so they can return to it.
setUnauthorizedHandler((error) => {
  setCurrentPersonId(null);
  rememberWhySessionEnded(error.message);
  queryClient.setQueryData(authQueries.session().queryKey, null);
});

export function AppProvider({ children }: { children: ReactNode }) {
  return (
    <ErrorBoundary fallback={<CrashScreen />}>
      <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
    </ErrorBoundary>
  );
}
