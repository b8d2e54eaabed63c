import { z } from 'zod';

export const eyes = ['right', 'left'] as const;
export type Eye = (typeof eyes)[number];

const name = (field: string) =>
  z.string({ error: `${field} is required` }).trim().min(1, `${field} must be 1 to 80 characters`).max(80, `${field} must be 1 to 80 characters`);

export const createPatientSchema = z.strictObject({
  recordNumber: z
    .string({ error: 'recordNumber is required' })
    .trim()
    .regex(/^[A-Za-z0-9-]{3,20}$/, 'recordNumber must be 3 to 20 letters, digits or hyphens'),
  givenName: name('givenName'),
  familyName: name('familyName'),
  dateOfBirth: z.iso.date({ error: 'dateOfBirth must be a date (YYYY-MM-DD)' }).refine((d) => d >= '1900-01-01' && d <= new Date().toISOString().slice(0, 10), 'dateOfBirth must lie between 1900-01-01 and today'),
  email: z.string().trim().toLowerCase().max(254, 'email must be at most 254 characters').email('email must be an e-mail address').nullable().optional(),
  emailConsent: z.boolean({ error: 'emailConsent must be true or false' }).default(false),
}).refine((p) => !p.emailConsent || !!p.email, { message: 'email is required when the patient agrees to e-mail', path: ['email'] });
export type CreatePatient = z.infer<typeof createPatientSchema>;

export const patientSchema = z.object({
  id: z.number().int(),
  recordNumber: z.string(),
  givenName: z.string(),
  familyName: z.string(),
  dateOfBirth: z.string(),
  email: z.string().nullable(),
  emailConsent: z.boolean(),
});
export type Patient = z.infer<typeof patientSchema>;
