import { z } from 'zod';
import { heightUnits, weightUnits } from './calculation';

export const eyes = ['right', 'left'] as const;
export type Eye = (typeof eyes)[number];

const name = (field: string) =>
  z
    .string({ error: `${field} is required` })
    .trim()
    .min(1, `${field} must be 1 to 80 characters`)
    .max(80, `${field} must be 1 to 80 characters`);

export const createPatientSchema = z
  .strictObject({
    recordNumber: z
      .string({ error: 'recordNumber is required' })
      .trim()
      .regex(/^[A-Za-z0-9-]{3,20}$/, 'recordNumber must be 3 to 20 letters, digits or hyphens'),
    givenName: name('givenName'),
    familyName: name('familyName'),
    dateOfBirth: z.iso
      .date({ error: 'dateOfBirth must be a date (YYYY-MM-DD)' })
      .refine(
        (d) => d >= '1900-01-01' && d <= new Date().toISOString().slice(0, 10),
        'dateOfBirth must lie between 1900-01-01 and today',
      ),
    email: z
      .string()
      .trim()
      .toLowerCase()
      .max(254, 'email must be at most 254 characters')
      .email('email must be an e-mail address')
      .nullable()
      .optional(),
    emailConsent: z.boolean({ error: 'emailConsent must be true or false' }).default(false),
    /**
     * A patient with the same name and date of birth exists: adding this one anyway needs the
     * explicit confirmation that it is another person, and why (a reason of substance).
     */
    duplicateConfirmed: z
      .boolean({ error: 'duplicateConfirmed must be true or false' })
      .default(false),
    duplicateReason: z
      .string()
      .trim()
      .max(500, 'duplicateReason must be at most 500 characters')
      .nullable()
      .optional(),
    /** The hospital FHIR server's Patient id the form was filled from; the server reads it again. */
    fhirId: z
      .string()
      .regex(/^[A-Za-z0-9\-.]{1,64}$/, 'fhirId must be a FHIR id (1 to 64 letters, digits, - or .)')
      .optional(),
  })
  .refine((p) => !p.emailConsent || !!p.email, {
    message: 'email is required when the patient agrees to e-mail',
    path: ['email'],
  });
export type CreatePatient = z.infer<typeof createPatientSchema>;

/** GET /patients/possible-duplicates: who already has this name and date of birth. */
export const possibleDuplicatesQuerySchema = z.strictObject({
  givenName: createPatientSchema.shape.givenName,
  familyName: createPatientSchema.shape.familyName,
  dateOfBirth: z.iso.date({ error: 'dateOfBirth must be a date (YYYY-MM-DD)' }),
});
export type PossibleDuplicatesQuery = z.infer<typeof possibleDuplicatesQuerySchema>;

export const patientSchema = z.object({
  id: z.number().int(),
  recordNumber: z.string(),
  givenName: z.string(),
  familyName: z.string(),
  dateOfBirth: z.string(),
  email: z.string().nullable(),
  emailConsent: z.boolean(),
  /** Where the patient was taken from, when from the hospital's FHIR server. */
  fhirSource: z
    .object({ baseUrl: z.string(), id: z.string(), readAt: z.string().nullable() })
    .nullable()
    .optional(),
});
export type Patient = z.infer<typeof patientSchema>;

/** A height and weight recorded on a signed order: as typed, and in cm and kg. */
export const recordedMeasurementSchema = z.object({
  orderId: z.number().int(),
  /** When the order was signed. */
  measuredAt: z.string(),
  height: z.object({ value: z.number(), unit: z.enum(heightUnits) }).nullable(),
  heightCm: z.number().nullable(),
  weight: z.object({ value: z.number(), unit: z.enum(weightUnits) }).nullable(),
  weightKg: z.number().nullable(),
});
export type RecordedMeasurement = z.infer<typeof recordedMeasurementSchema>;

/** GET /api/patients/:id/measurements: the last ones, newest first, and the unit's weight-change rule. */
export const patientMeasurementsSchema = z.object({
  measurements: z.array(recordedMeasurementSchema),
  weightChangeRule: z.object({ maxPct: z.number(), withinDays: z.number() }),
});
export type PatientMeasurements = z.infer<typeof patientMeasurementsSchema>;
