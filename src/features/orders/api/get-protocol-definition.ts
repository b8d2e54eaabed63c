import { api } from '../../../lib/api-client';
import {
  protocolDefinitionResponseSchema,
  type ProtocolVersionWithDefinition,
} from './order-response-schemas';

export async function getProtocolDefinition(
  key: string,
  version: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<ProtocolVersionWithDefinition> {
  const address = `/protocols/${encodeURIComponent(key)}/versions/${encodeURIComponent(String(version))}`;
  const { version: found } = await api.get(address, {
    schema: protocolDefinitionResponseSchema,
    signal,
  });
  return found;
}
