import { z } from 'zod';
import { protocolKinds } from '../../shared/protocol/protocol-schema';
import { api } from './api-client';

// What the auditor's protocol filters read from `GET /api/protocols`. One copy for every feature;
// each feature still keeps the answer under its own query keys.

const versionChoiceSchema = z.object({
  key: z.string(),
  version: z.number().int(),
  title: z.string(),
  status: z.string(),
});
export const protocolChoicesSchema = z.object({
  protocols: z.array(
    z.object({
      key: z.string(),
      kind: z.enum(protocolKinds),
      title: z.string(),
      versions: z.array(versionChoiceSchema),
    }),
  ),
});
export type ProtocolChoice = z.infer<typeof protocolChoicesSchema>['protocols'][number];

/** Protocol keys, titles and versions, for a protocol filter and a table's protocol names. */
export async function getProtocolChoices({ signal }: { signal?: AbortSignal } = {}): Promise<
  ProtocolChoice[]
> {
  const { protocols } = await api.get('/protocols', { schema: protocolChoicesSchema, signal });
  return protocols;
}
