import { api } from '../../../lib/api-client';
import { protocolChoicesSchema, type ProtocolChoice } from './deviation-schemas';

/** Protocol keys and their versions, for the protocol filter. */
export async function getProtocolChoices({ signal }: { signal?: AbortSignal } = {}): Promise<ProtocolChoice[]> {
  const { protocols } = await api.get('/protocols', { schema: protocolChoicesSchema, signal });
  return protocols;
}
