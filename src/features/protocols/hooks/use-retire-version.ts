import { useMutation, useQueryClient } from '@tanstack/react-query';
import { retireVersion } from '../api/retire-version';
import { refreshAfterChange } from './refresh-after-change';

export function useRetireVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: retireVersion,
    onSuccess: (saved) => refreshAfterChange(queryClient, saved),
  });
}
