import { useMutation, useQueryClient } from '@tanstack/react-query';
import { orderQueries } from '../api/order-queries';
import { uploadAttachment } from '../api/upload-attachment';

export function useUploadAttachment() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadAttachment,
    onSuccess: (_attachment, { orderId }) =>
      queryClient.invalidateQueries({ queryKey: orderQueries.detail(orderId).queryKey }),
  });
}
