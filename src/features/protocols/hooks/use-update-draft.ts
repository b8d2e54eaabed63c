import { useMutation, useQueryClient } from '@tanstack/react-query';
import { updateDraft } from '../api/update-draft';
import { refreshAfterChange } from './refresh-after-change';

export function useUpdateDraft() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateDraft,
    onSuccess: (saved) => refreshAfterChange(queryClient, saved),
  });
}
