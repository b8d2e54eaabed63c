import type { ReviewClassification } from '../../../../shared/schemas/reviews';
import { api } from '../../../lib/api-client';
import { deviationDetailSchema, type DeviationDetail } from './deviation-schemas';

export type Closure = { id: number; classification: ReviewClassification; comment: string };

/** Closes an open deviation with the auditor's judgement; answers with the deviation as it now stands. */
export async function closeDeviation({
  id,
  classification,
  comment,
}: Closure): Promise<DeviationDetail> {
  return api.post(
    `/deviations/${encodeURIComponent(String(id))}/closure`,
    { classification, comment },
    { schema: deviationDetailSchema },
  );
}
