import { api } from '../../../lib/api-client';
import { protocolChoicesSchema, type ProtocolChoice } from './dose-record-schemas';

/** Protocol keys, titles and versions, for the protocol filter and the table's protocol names. */
export async function getProtocolChoices({ signal }: { signal?: AbortSignal } = {}): Promise<ProtocolChoice[]> {
  const { protocols } = await api.get('/protocols', { schema: protocolChoicesSchema, signal });
  return protocols;
}
