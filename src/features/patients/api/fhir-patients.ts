import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { patientKeys } from '../../../lib/queries/patients';

/** Whether the unit has a hospital FHIR server (GET /api/fhir/status). */
const fhirStatusSchema = z.object({ enabled: z.boolean(), baseUrl: z.string().nullable() });

const fhirCandidateSchema = z.object({
  fhirId: z.string(),
  recordNumber: z.string().nullable(),
  givenName: z.string(),
  familyName: z.string(),
  dateOfBirth: z.string().nullable(),
  luxtempoPatientId: z.number().nullable(),
});
export type FhirCandidate = z.infer<typeof fhirCandidateSchema>;
const fhirSearchSchema = z.object({ source: z.string(), patients: z.array(fhirCandidateSchema) });

export const fhirStatusQuery = () =>
  queryOptions({
    queryKey: ['fhir', 'status'] as const,
    queryFn: ({ signal }) => api.get('/fhir/status', { schema: fhirStatusSchema, signal }),
    staleTime: 5 * 60_000,
  });

/** Searches the hospital's FHIR server through Luxtempo's server (never from the browser). */
export function searchFhirPatients(query: { recordNumber: string } | { name: string }) {
  return api.get(`/fhir/patients?${new URLSearchParams(query).toString()}`, {
    schema: fhirSearchSchema,
  });
}

export async function refreshFromFhir(patientId: number) {
  return api.post(`/patients/${patientId}/fhir-refresh`, undefined, {
    schema: z.object({ changed: z.array(z.string()) }),
  });
}

export const invalidatePatient = () => patientKeys.all();
