import { QueryClientProvider } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { ErrorBoundary } from '../components/ui/error-boundary';
import { authQueries } from '../features/auth/api/auth-queries';
import { setUnauthorizedHandler } from '../lib/api-client';
import { setCurrentPersonId } from '../lib/current-person';
import { clearOfflineCopies } from '../lib/offline-cache';
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
  // The ended session's copies of API answers must not open for whoever signs in next.
  void clearOfflineCopies();
});

// Answers fetched before the service worker took over were not kept by it. The step clock's (the
// sessions, their orders and protocol versions, and who is signed in) are asked for again through it, so a first visit is enough to reopen the
// clock without network. Only these: refetching a screen with a half-typed form could reset it.
// The query modules (and the schemas they parse with) load only then, not with the sign-in page.
async function askAgainThroughServiceWorker() {
  const [{ orderKeys, orderQuery }, { protocolKeys }, { sessionKeys }] = await Promise.all([
    import('../lib/queries/orders'),
    import('../lib/queries/protocols'),
    import('../lib/queries/sessions'),
  ]);
  const sessionOrders = queryClient
    .getQueriesData({ queryKey: sessionKeys.all() })
    .map(([queryKey]) => queryKey[1]);
  void queryClient.invalidateQueries({ queryKey: sessionKeys.all() });
  for (const orderId of sessionOrders) {
    if (typeof orderId !== 'number') continue;
    void queryClient.invalidateQueries({ queryKey: orderKeys.detail(orderId), exact: true });
    const order = queryClient.getQueryData(orderQuery(orderId).queryKey);
    if (order)
      void queryClient.invalidateQueries({
        queryKey: protocolKeys.version(order.protocol),
        exact: true,
      });
  }
}
globalThis.navigator?.serviceWorker?.addEventListener('controllerchange', () => {
  void queryClient.invalidateQueries({ queryKey: authQueries.session().queryKey });
  void askAgainThroughServiceWorker().catch(() => undefined);
});

export function AppProvider({ children }: { children: ReactNode }) {
  return (
    <ErrorBoundary fallback={<CrashScreen />}>
      <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
    </ErrorBoundary>
  );
}
