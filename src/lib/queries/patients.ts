import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { orderStatuses } from '../../../shared/schemas/orders';
import {
  eyes,
  patientMeasurementsSchema,
  patientSchema,
  type Patient,
  type PatientMeasurements,
} from '../../../shared/schemas/patients';
import { api } from '../api-client';
import type { Fetching } from './request';
import { segment } from './request';

/*
 * One cache for patients: the search (the patients screen and the order form's picker), one
 * patient with their treatments, and their last measurements.
 */

export const treatmentSchema = z.object({
  orderId: z.number(),
  revision: z.number(),
  eye: z.enum(eyes),
  kind: z.enum(['pdt', 'cxl']),
  protocol: z.object({ key: z.string(), version: z.number(), title: z.string() }),
  status: z.enum(orderStatuses),
  /** When the order was signed, or created if it never was (UTC, ISO 8601). */
  date: z.string(),
  daysSincePreviousSameKind: z.number().nullable(),
});
export type Treatment = z.infer<typeof treatmentSchema>;

export const patientHistorySchema = z.object({
  patient: patientSchema,
  eyes: z.object({ right: z.array(treatmentSchema), left: z.array(treatmentSchema) }),
});
export type PatientHistory = z.infer<typeof patientHistorySchema>;

export const patientsResponseSchema = z.object({ patients: z.array(patientSchema) });
export const patientResponseSchema = z.object({ patient: patientSchema });

export const patientKeys = {
  all: () => ['patients'] as const,
  searches: () => [...patientKeys.all(), 'search'] as const,
  search: (text: string) => [...patientKeys.searches(), text.trim()] as const,
  details: () => [...patientKeys.all(), 'detail'] as const,
  detail: (id: number) => [...patientKeys.details(), id] as const,
  measurements: (id: number) => [...patientKeys.detail(id), 'measurements'] as const,
};

/** Patients whose record number, family name or given name starts with `text` (at most 50). */
export async function searchPatients(text: string, { signal }: Fetching = {}): Promise<Patient[]> {
  const query = text.trim() ? `?q=${encodeURIComponent(text.trim())}` : '';
  const { patients } = await api.get(`/patients${query}`, {
    schema: patientsResponseSchema,
    signal,
  });
  return patients;
}

/** One patient with the treatments of each eye. */
export function getPatientHistory(id: number, { signal }: Fetching = {}): Promise<PatientHistory> {
  return api.get(`/patients/${segment(id)}`, { schema: patientHistorySchema, signal });
}

/** The patient's last recorded heights and weights, newest first, and the unit's weight-change rule. */
export function getPatientMeasurements(
  patientId: number,
  { signal }: Fetching = {},
): Promise<PatientMeasurements> {
  return api.get(`/patients/${segment(patientId)}/measurements`, {
    schema: patientMeasurementsSchema,
    signal,
  });
}

export const patientSearchQuery = (text: string) =>
  queryOptions({
    queryKey: patientKeys.search(text),
    queryFn: ({ signal }) => searchPatients(text, { signal }),
    // The previous results stay on screen while the next letters are looked up.
    placeholderData: keepPreviousData,
  });

export const patientQuery = (id: number) =>
  queryOptions({
    queryKey: patientKeys.detail(id),
    queryFn: ({ signal }) => getPatientHistory(id, { signal }),
  });

export const patientMeasurementsQuery = (patientId: number) =>
  queryOptions({
    queryKey: patientKeys.measurements(patientId),
    queryFn: ({ signal }) => getPatientMeasurements(patientId, { signal }),
  });
