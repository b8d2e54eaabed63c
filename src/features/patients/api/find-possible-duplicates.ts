import { z } from 'zod';
import {
  patientSchema,
  type Patient,
  type PossibleDuplicatesQuery,
} from '../../../../shared/schemas/patients';
import { api } from '../../../lib/api-client';

const patientsResponseSchema = z.object({ patients: z.array(patientSchema) });

/** Patients who already have this name and date of birth. */
export async function findPossibleDuplicates(
  query: PossibleDuplicatesQuery,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Patient[]> {
  const params = new URLSearchParams(query);
  const { patients } = await api.get(`/patients/possible-duplicates?${params.toString()}`, {
    schema: patientsResponseSchema,
    signal,
  });
  return patients;
}
