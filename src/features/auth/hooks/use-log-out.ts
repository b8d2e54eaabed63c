import { useMutation } from '@tanstack/react-query';
import { paths } from '../../../config/paths';
import { dropAllDrafts } from '../../../lib/form-draft';
import { clearOfflineCopies } from '../../../lib/offline-cache';
import { logOut } from '../api/log-out';

/**
 * Signing out loads the sign-in page afresh instead of routing in place: on a shared ward tablet
 * nothing of the previous person's data may stay in memory, and a full load guarantees that.
 * The service worker's copies of API answers are deleted first.
 */
export function useLogOut() {
  return useMutation({
    mutationFn: logOut,
    onSuccess: async () => {
      dropAllDrafts();
      // The service worker's copies of this person's API answers (orders, sessions, who is signed
      // in) go before the sign-in page loads; taps not yet stored stay, to be sent.
      await clearOfflineCopies();
      window.location.assign(paths.signIn.getHref());
    },
  });
}
