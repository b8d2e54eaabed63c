import { api } from '../../../lib/api-client';
import { deviationDetailSchema, type DeviationDetail } from './deviation-schemas';

/** One deviation with its session, participants, review history and whether I may review it. */
export async function getDeviation(
  id: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<DeviationDetail> {
  return api.get(`/deviations/${encodeURIComponent(String(id))}`, {
    schema: deviationDetailSchema,
    signal,
  });
}
