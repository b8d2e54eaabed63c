import { api } from '../../../lib/api-client';
import { protocolStepsSchema, type ProtocolSteps } from './dose-record-schemas';

export async function getProtocolSteps(
  key: string,
  version: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<ProtocolSteps> {
  const address = `/protocols/${encodeURIComponent(key)}/versions/${encodeURIComponent(String(version))}`;
  const { version: found } = await api.get(address, { schema: protocolStepsSchema, signal });
  return found;
}
