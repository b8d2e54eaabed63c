import { z } from 'zod';
import { patientSchema, type Patient } from '../../../../shared/schemas/patients';
import { api } from '../../../lib/api-client';

const patientsResponseSchema = z.object({ patients: z.array(patientSchema) });

/** Patients whose record number, family name or given name starts with `text` (at most 50). */
export async function searchPatients(
  text: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Patient[]> {
  const query = text.trim() ? `?q=${encodeURIComponent(text.trim())}` : '';
  const { patients } = await api.get(`/patients${query}`, {
    schema: patientsResponseSchema,
    signal,
  });
  return patients;
}
