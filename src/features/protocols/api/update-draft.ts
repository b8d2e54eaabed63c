import { api } from '../../../lib/api-client';
import { versionResponseSchema, type VersionDetail } from './protocol-response-schemas';
import { versionAddress, type VersionRef } from './version-address';

/** Replaces a draft's definition; the server validates it and refuses anything but a draft. */
export async function updateDraft({
  key,
  version,
  definition,
}: VersionRef & { definition: unknown }): Promise<VersionDetail> {
  const response = await api.put(
    versionAddress(key, version),
    { definition },
    { schema: versionResponseSchema },
  );
  return response.version;
}
