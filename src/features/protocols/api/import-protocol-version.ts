import { api, ApiRequestError, isApiRequestError } from '../../../lib/api-client';
import { versionResponseSchema, type VersionDetail } from './protocol-response-schemas';

/** Sends a protocol file as multipart form data (field `file`). */
export async function importProtocolVersion(file: File): Promise<VersionDetail> {
  const form = new FormData();
  form.append('file', file, file.name);
  try {
    const response = await api.upload('/protocols/imports', form, {
      schema: versionResponseSchema,
    });
    return response.version;
  } catch (error) {
    // A proxy answering 413 without our error body: the file's own limit says more.
    if (isApiRequestError(error) && error.code === 'http_413') {
      throw new ApiRequestError({
        status: 413,
        code: error.code,
        message: 'The file is too large; a protocol file is at most 1 MB.',
      });
    }
    throw error;
  }
}
