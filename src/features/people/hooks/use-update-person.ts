import { useMutation, useQueryClient } from '@tanstack/react-query';
import { peopleQueries } from '../api/people-queries';
import { updatePerson } from '../api/update-person';

export function useUpdatePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePerson,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleQueries.all() }),
  });
}
