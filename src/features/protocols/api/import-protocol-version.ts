import { z } from 'zod';
import { ApiRequestError } from '../../../lib/api-client';
import { versionResponseSchema, type VersionDetail } from './protocol-response-schemas';

const errorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
  }),
});

/**
 * Sends a protocol file as multipart form data (field `file`). The shared API client speaks JSON
 * only, so this one call uses fetch itself, but it fails with the same ApiRequestError so the
 * screen treats its errors like any other.
 */
export async function importProtocolVersion(file: File): Promise<VersionDetail> {
  const form = new FormData();
  form.append('file', file, file.name);
  let response: Response;
  try {
    response = await fetch('/api/protocols/imports', { method: 'POST', body: form, credentials: 'same-origin', headers: { Accept: 'application/json' } });
  } catch {
    throw new ApiRequestError({
      status: 0,
      code: 'network_unreachable',
      message: 'The Luxtempo server could not be reached. Check the network connection and try again.',
    });
  }
  const payload: unknown = await response.json().catch(() => undefined);
  if (!response.ok) {
    const body = errorBodySchema.safeParse(payload);
    if (body.success) throw new ApiRequestError({ status: response.status, ...body.data.error });
    throw new ApiRequestError({
      status: response.status,
      code: `http_${response.status}`,
      message:
        response.status === 401
          ? 'Your session has ended. Sign in again, then import the file once more.'
          : response.status === 413
            ? 'The file is too large; a protocol file is at most 1 MB.'
            : `The file was not accepted (HTTP ${response.status}). Try again in a moment.`,
    });
  }
  const parsed = versionResponseSchema.safeParse(payload);
  if (!parsed.success) {
    throw new ApiRequestError({
      status: response.status,
      code: 'unexpected_response',
      message: 'The server answered in a form this screen does not understand. Reload the page; if it persists, tell your administrator.',
    });
  }
  return parsed.data.version;
}
