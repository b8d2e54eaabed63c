import { api } from '../../../lib/api-client';
import { deviationDetailSchema, type DeviationDetail } from './deviation-schemas';

export type Reopening = { id: number; comment: string };

/** Reopens a closed deviation; the earlier judgement stays in its history. */
export async function reopenDeviation({ id, comment }: Reopening): Promise<DeviationDetail> {
  return api.post(
    `/deviations/${encodeURIComponent(String(id))}/reopening`,
    { comment },
    { schema: deviationDetailSchema },
  );
}
