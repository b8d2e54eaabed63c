import type { Patient } from '../../../../shared/schemas/patients';
import { api } from '../../../lib/api-client';
import { patientResponseSchema, patientsResponseSchema } from './order-response-schemas';

/** Patients for the order form's picker: record number, family or given name starting with `text`. */
export async function findPatients(
  text: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Patient[]> {
  const { patients } = await api.get(`/patients?q=${encodeURIComponent(text.trim())}`, {
    schema: patientsResponseSchema,
    signal,
  });
  return patients;
}

/** One patient, for an order that names them already. */
export async function getPatient(
  id: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Patient> {
  const { patient } = await api.get(`/patients/${encodeURIComponent(String(id))}`, {
    schema: patientResponseSchema,
    signal,
  });
  return patient;
}
