import { api } from '../../../lib/api-client';
import { protocolChoicesResponseSchema, type ProtocolChoices } from './order-response-schemas';

export async function getProtocolChoices({
  signal,
}: { signal?: AbortSignal } = {}): Promise<ProtocolChoices> {
  const { protocols } = await api.get('/protocols', {
    schema: protocolChoicesResponseSchema,
    signal,
  });
  return protocols;
}
