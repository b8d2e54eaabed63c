import { useMutation } from '@tanstack/react-query';
import { paths } from '../../../config/paths';
import { dropAllDrafts } from '../../../lib/form-draft';
import { logOut } from '../api/log-out';

/**
 * Signing out loads the sign-in page afresh instead of routing in place: on a shared ward tablet
 * nothing of the previous person's data may stay in memory, and a full load guarantees that.
 */
export function useLogOut() {
  return useMutation({
    mutationFn: logOut,
    onSuccess: () => {
      dropAllDrafts();
      window.location.assign(paths.signIn.getHref());
    },
  });
}
