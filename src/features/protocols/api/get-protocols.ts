import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { protocolSummarySchema, type ProtocolSummary } from './protocol-response-schemas';

const protocolsResponseSchema = z.object({ protocols: z.array(protocolSummarySchema) });

export async function getProtocols({ signal }: { signal?: AbortSignal } = {}): Promise<
  ProtocolSummary[]
> {
  const { protocols } = await api.get('/protocols', { schema: protocolsResponseSchema, signal });
  return protocols;
}
