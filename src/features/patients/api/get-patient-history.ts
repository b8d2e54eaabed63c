import { api } from '../../../lib/api-client';
import { patientHistorySchema, type PatientHistory } from './patient-response-schemas';

export async function getPatientHistory(
  id: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<PatientHistory> {
  return api.get(`/patients/${encodeURIComponent(String(id))}`, {
    schema: patientHistorySchema,
    signal,
  });
}
