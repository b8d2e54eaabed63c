import {
  patientMeasurementsSchema,
  type PatientMeasurements,
} from '../../../../shared/schemas/patients';
import { api } from '../../../lib/api-client';

/** The patient's last recorded heights and weights, newest first, and the unit's weight-change rule. */
export async function getPatientMeasurements(
  patientId: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<PatientMeasurements> {
  return api.get(`/patients/${encodeURIComponent(String(patientId))}/measurements`, {
    schema: patientMeasurementsSchema,
    signal,
  });
}
