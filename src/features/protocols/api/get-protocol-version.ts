import { api } from '../../../lib/api-client';
import { versionResponseSchema, type VersionDetail } from './protocol-response-schemas';
import { versionAddress, type VersionRef } from './version-address';

export async function getProtocolVersion(
  { key, version }: VersionRef,
  { signal }: { signal?: AbortSignal } = {},
): Promise<VersionDetail> {
  const response = await api.get(versionAddress(key, version), {
    schema: versionResponseSchema,
    signal,
  });
  return response.version;
}
