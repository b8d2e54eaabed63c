import { api, ApiRequestError, isApiRequestError } from '../../../lib/api-client';
import { attachmentResponseSchema, type Attachment } from './order-response-schemas';

export const attachmentMaxBytes = 10 * 1024 * 1024;

/** Sends one report as multipart form data (field `file`). */
export async function uploadAttachment({
  orderId,
  file,
}: {
  orderId: number;
  file: File;
}): Promise<Attachment> {
  const body = new FormData();
  body.append('file', file, file.name);
  try {
    const { attachment } = await api.upload(
      `/orders/${encodeURIComponent(String(orderId))}/attachments`,
      body,
      { schema: attachmentResponseSchema },
    );
    return attachment;
  } catch (error) {
    throw withAttachmentWording(error);
  }
}

/**
 * Our server names the problem itself; a proxy in front of it answers 413 or 415 with no body,
 * and then the limits of this upload say more than the general wording does.
 */
function withAttachmentWording(error: unknown): unknown {
  if (!isApiRequestError(error)) return error;
  const message =
    error.code === 'http_413'
      ? 'The file is larger than 10 MB.'
      : error.code === 'http_415'
        ? 'Only PDF, PNG and JPEG reports can be attached.'
        : null;
  return message
    ? new ApiRequestError({
        status: error.status,
        code: error.code,
        message,
        fields: error.fields,
        retryAfterS: error.retryAfterS,
      })
    : error;
}
