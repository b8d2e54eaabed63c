import { api } from '../../../lib/api-client';
import { versionResponseSchema, type VersionDetail } from './protocol-response-schemas';
import { versionAddress, type VersionRef } from './version-address';

export async function retireVersion({
  key,
  version,
  reason,
}: VersionRef & { reason: string }): Promise<VersionDetail> {
  const response = await api.post(
    `${versionAddress(key, version)}/retirement`,
    { reason },
    { schema: versionResponseSchema },
  );
  return response.version;
}
