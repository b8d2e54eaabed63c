import { api } from '../../../lib/api-client';
import { versionResponseSchema, type VersionDetail } from './protocol-response-schemas';
import type { VersionRef } from './version-address';

/** A new draft, numbered one above the protocol's highest version, holding a copy of `from`. */
export async function createDraft(from: VersionRef): Promise<VersionDetail> {
  const { version } = await api.post(
    '/protocols/drafts',
    { from },
    { schema: versionResponseSchema },
  );
  return version;
}
