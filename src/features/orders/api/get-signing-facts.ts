import {
  signingFactsSchema,
  type SigningFacts,
  type SigningFactsQuery,
} from '../../../../shared/schemas/orders';
import { api } from '../../../lib/api-client';

/**
 * What the server knows that a signature would be held to beyond the form: the days since this
 * eye's last treatment of the kind (inside the protocol's interval) and the patient's other open
 * orders for the eye and kind.
 */
export async function getSigningFacts(
  query: SigningFactsQuery,
  { signal }: { signal?: AbortSignal } = {},
): Promise<SigningFacts> {
  const params = new URLSearchParams({
    patientId: String(query.patientId),
    eye: query.eye,
    protocol: query.protocol,
    version: String(query.version),
    ...(query.orderId ? { orderId: String(query.orderId) } : {}),
  });
  return api.get(`/orders/signing-facts?${params.toString()}`, {
    schema: signingFactsSchema,
    signal,
  });
}
