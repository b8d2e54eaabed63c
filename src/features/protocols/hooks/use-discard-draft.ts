import { useMutation, useQueryClient } from '@tanstack/react-query';
import { discardDraft } from '../api/discard-draft';
import { refreshAfterChange } from './refresh-after-change';

export function useDiscardDraft() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: discardDraft,
    onSuccess: (saved) => refreshAfterChange(queryClient, saved),
  });
}
