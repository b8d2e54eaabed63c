import { useMutation, useQueryClient } from '@tanstack/react-query';
import { createPerson } from '../api/create-person';
import { peopleQueries } from '../api/people-queries';

export function useCreatePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createPerson,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleQueries.all() }),
  });
}
