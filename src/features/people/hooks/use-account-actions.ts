import { useMutation, useQueryClient } from '@tanstack/react-query';
import { decideRoleRequest, endSessions, sendPasswordLink } from '../api/account-actions';
import { peopleQueries } from '../api/people-queries';

export function useSendPasswordLink() {
  return useMutation({ mutationFn: sendPasswordLink });
}

export function useEndSessions() {
  return useMutation({ mutationFn: endSessions });
}

export function useDecideRoleRequest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: decideRoleRequest,
    // Both the list and the waiting requests change.
    onSettled: () => queryClient.invalidateQueries({ queryKey: peopleQueries.all() }),
  });
}
