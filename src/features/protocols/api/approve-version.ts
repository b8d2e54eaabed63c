import { api } from '../../../lib/api-client';
import { versionResponseSchema, type VersionDetail } from './protocol-response-schemas';
import { versionAddress, type VersionRef } from './version-address';

export async function approveVersion({ key, version }: VersionRef): Promise<VersionDetail> {
  const response = await api.post(`${versionAddress(key, version)}/approvals`, undefined, { schema: versionResponseSchema });
  return response.version;
}
