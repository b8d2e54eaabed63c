import { useMutation } from '@tanstack/react-query';
import { paths } from '../../../config/paths';
import { setCurrentPersonId } from '../../../lib/current-person';
import { forgetWhySessionEnded } from '../../../lib/session-ended';
import { clearAfterSignOut, sendBeforeSignOut } from '../../../lib/sign-out';
import { logOut } from '../api/log-out';

/**
 * Signing out sends what the person still has queued (while their session works), ends the
 * session, lets every feature forget what it kept for them (src/lib/sign-out.ts; the service
 * worker's copies of API answers among them) and waits until they have, then loads the sign-in
 * page afresh: on a shared ward tablet nothing of the previous person's may stay in memory.
 */
export function useLogOut(personId: number) {
  return useMutation({
    mutationFn: async () => {
      await sendBeforeSignOut(personId);
      await logOut();
    },
    onSuccess: async () => {
      setCurrentPersonId(null);
      await clearAfterSignOut(personId);
      // Signed out on purpose: the sign-in page has nothing to explain.
      forgetWhySessionEnded();
      window.location.assign(paths.signIn.getHref());
    },
  });
}
