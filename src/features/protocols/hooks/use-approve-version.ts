import { useMutation, useQueryClient } from '@tanstack/react-query';
import { approveVersion } from '../api/approve-version';
import { refreshAfterChange } from './refresh-after-change';

export function useApproveVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: approveVersion,
    onSuccess: (saved) => refreshAfterChange(queryClient, saved),
  });
}
