import { useMutation, useQueryClient } from '@tanstack/react-query';
import { clearOfflineCopies } from '../../../lib/offline-cache';
import { forgetWhySessionEnded } from '../../../lib/session-ended';
import { authQueries } from '../api/auth-queries';
import { logIn } from '../api/log-in';

export function useLogIn() {
  const queryClient = useQueryClient();
  return useMutation({
    // The service worker's copies of API answers are emptied before the new person's screens load.
    mutationFn: async (credentials: Parameters<typeof logIn>[0]) => {
      const user = await logIn(credentials);
      await clearOfflineCopies();
      return user;
    },
    onSuccess: (user) => {
      // Why the last session ended has been said on the sign-in page; the new one starts clean.
      forgetWhySessionEnded();
      // Nothing cached for an earlier person may show to this one.
      queryClient.removeQueries({
        predicate: (query) => query.queryKey[0] !== authQueries.all()[0],
      });
      queryClient.setQueryData(authQueries.session().queryKey, user);
    },
  });
}
