import { z } from 'zod';
import {
  patientSchema,
  type CreatePatient,
  type Patient,
} from '../../../../shared/schemas/patients';
import { api } from '../../../lib/api-client';

const patientResponseSchema = z.object({ patient: patientSchema });

export async function createPatient(input: CreatePatient): Promise<Patient> {
  const { patient } = await api.post('/patients', input, { schema: patientResponseSchema });
  return patient;
}
