import { protocolApprovalMeaning } from '../../../../shared/protocol/approval-signature';
import { api } from '../../../lib/api-client';
import { versionResponseSchema, type VersionDetail } from './protocol-response-schemas';
import { versionAddress, type VersionRef } from './version-address';

/** An approval is an electronic signature: the password again, and the meaning shown beside it. */
export async function approveVersion({
  key,
  version,
  password,
}: VersionRef & { password: string }): Promise<VersionDetail> {
  const response = await api.post(
    `${versionAddress(key, version)}/approvals`,
    { password, meaning: protocolApprovalMeaning },
    { schema: versionResponseSchema },
  );
  return response.version;
}
