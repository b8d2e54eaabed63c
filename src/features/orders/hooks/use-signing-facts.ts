import { useQuery } from '@tanstack/react-query';
import type { SigningFacts } from '../../../../shared/schemas/orders';
import type { Eye } from '../../../../shared/schemas/patients';
import { orderQueries } from '../api/order-queries';

/**
 * The server's facts a signature of this order would be held to (recent treatment of the eye,
 * other open orders), once patient, eye and protocol version are chosen; null until then.
 */
export function useSigningFacts(
  patientId: number | null,
  eye: Eye | '',
  protocol: { key: string; version: number } | null,
  orderId: number | undefined,
): SigningFacts | null {
  const ready = patientId !== null && eye !== '' && protocol !== null;
  const query = useQuery({
    ...orderQueries.signingFacts({
      patientId: patientId ?? 0,
      eye: eye === '' ? 'right' : eye,
      protocol: protocol?.key ?? '',
      version: protocol?.version ?? 0,
      orderId,
    }),
    enabled: ready,
  });
  return ready ? (query.data ?? null) : null;
}
