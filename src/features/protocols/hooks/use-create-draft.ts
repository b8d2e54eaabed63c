import { useMutation, useQueryClient } from '@tanstack/react-query';
import { createDraft } from '../api/create-draft';
import { refreshAfterChange } from './refresh-after-change';

export function useCreateDraft() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createDraft,
    onSuccess: (saved) => refreshAfterChange(queryClient, saved),
  });
}
