import { ApiRequestError, type FieldProblem } from '../../../lib/api-client';
import { attachmentResponseSchema, type Attachment } from './order-response-schemas';

export const attachmentMaxBytes = 10 * 1024 * 1024;

/**
 * Sends one report as multipart form data. The shared client speaks JSON only, so this request is
 * made here, and its failures are turned into the same ApiRequestError the rest of the app reads.
 */
export async function uploadAttachment({ orderId, file }: { orderId: number; file: File }): Promise<Attachment> {
  const body = new FormData();
  body.append('file', file, file.name);
  let response: Response;
  try {
    response = await fetch(`/api/orders/${encodeURIComponent(String(orderId))}/attachments`, {
      method: 'POST',
      body,
      credentials: 'same-origin',
      headers: { Accept: 'application/json' },
    });
  } catch {
    throw new ApiRequestError({ status: 0, code: 'network_unreachable', message: 'The Luxtempo server could not be reached. Check the network connection and try again.' });
  }
  const payload: unknown = await response.json().catch(() => undefined);
  if (!response.ok) throw uploadError(response.status, payload);
  const parsed = attachmentResponseSchema.safeParse(payload);
  if (!parsed.success) {
    throw new ApiRequestError({ status: response.status, code: 'unexpected_response', message: 'The server answered in a form this screen does not understand. Reload the page.' });
  }
  return parsed.data.attachment;
}

function uploadError(status: number, payload: unknown): ApiRequestError {
  const error = (payload as { error?: { code?: unknown; message?: unknown; fields?: unknown } } | undefined)?.error;
  const fields = Array.isArray(error?.fields)
    ? (error.fields as unknown[]).filter((f): f is FieldProblem => typeof (f as FieldProblem)?.path === 'string' && typeof (f as FieldProblem)?.message === 'string')
    : [];
  if (typeof error?.code === 'string' && typeof error.message === 'string') {
    return new ApiRequestError({ status, code: error.code, message: error.message, fields });
  }
  const fallback =
    status === 413
      ? 'The file is larger than 10 MB.'
      : status === 415
        ? 'Only PDF, PNG and JPEG reports can be attached.'
        : status === 401
          ? 'Your session has ended. Sign in again to continue.'
          : `The upload was refused (HTTP ${status}).`;
  return new ApiRequestError({ status, code: `http_${status}`, message: fallback, fields });
}
