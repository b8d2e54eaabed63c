import { useMutation, useQueryClient } from '@tanstack/react-query';
import { authQueries } from '../api/auth-queries';
import { logIn } from '../api/log-in';

export function useLogIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: logIn,
    onSuccess: (user) => {
      // Nothing cached for an earlier person may show to this one.
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authQueries.all()[0] });
      queryClient.setQueryData(authQueries.session().queryKey, user);
    },
  });
}
