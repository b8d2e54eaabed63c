import { useMutation, useQueryClient } from '@tanstack/react-query';
import { importProtocolVersion } from '../api/import-protocol-version';
import { refreshAfterChange } from './refresh-after-change';

export function useImportVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: importProtocolVersion,
    onSuccess: (saved) => refreshAfterChange(queryClient, saved),
  });
}
