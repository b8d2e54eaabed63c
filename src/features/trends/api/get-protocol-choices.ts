import { api } from '../../../lib/api-client';
import { protocolChoicesSchema, type ProtocolChoice } from './trend-schemas';

/** Protocol keys and titles, for the protocol filter. */
export async function getProtocolChoices({ signal }: { signal?: AbortSignal } = {}): Promise<
  ProtocolChoice[]
> {
  const { protocols } = await api.get('/protocols', { schema: protocolChoicesSchema, signal });
  return protocols;
}
