import { z } from 'zod';
import {
  protocolVersionSchema,
  type ProtocolVersion,
} from '../../../../shared/protocol/protocol-schema';
import { api } from '../../../lib/api-client';

const versionResponseSchema = z.object({
  version: z.object({ definition: protocolVersionSchema }),
});

/** The exact protocol version the order points at: its steps, cautions, light and CXL settings. */
export async function getSessionProtocol(
  key: string,
  version: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<ProtocolVersion> {
  const address = `/protocols/${encodeURIComponent(key)}/versions/${encodeURIComponent(String(version))}`;
  const response = await api.get(address, { schema: versionResponseSchema, signal });
  return response.version.definition;
}
