import { z } from 'zod';
import { fhirSystems } from './codes';

/** The parts of a FHIR R4 Patient that Luxtempo reads; anything else in it is ignored. */
const fhirPatientSchema = z.object({
  resourceType: z.literal('Patient'),
  id: z.string().regex(/^[A-Za-z0-9\-.]{1,64}$/, 'Patient.id must be a FHIR id'),
  identifier: z
    .array(z.object({ system: z.string().optional(), value: z.string().optional() }))
    .optional(),
  name: z
    .array(
      z.object({
        use: z.string().optional(),
        family: z.string().optional(),
        given: z.array(z.string()).optional(),
      }),
    )
    .optional(),
  birthDate: z
    .string()
    .regex(/^\d{4}(-\d{2}(-\d{2})?)?$/, 'Patient.birthDate must be a FHIR date')
    .optional(),
});

/** A search answer: a Bundle of type searchset whose entries are Patients. */
const searchsetSchema = z.object({
  resourceType: z.literal('Bundle', { error: 'the answer is not a FHIR Bundle' }),
  type: z.literal('searchset', { error: 'the Bundle is not a search result (type searchset)' }),
  entry: z
    .array(
      z.object({
        resource: z.unknown(),
        search: z.object({ mode: z.string().optional() }).optional(),
      }),
    )
    .optional(),
});

/** A hospital patient as the "add patient" form takes it. */
export interface FhirPatientCandidate {
  fhirId: string;
  /** The unit's record number (identifier system fhirSystems.recordNumber); null when it has none. */
  recordNumber: string | null;
  givenName: string;
  familyName: string;
  /** A full date (YYYY-MM-DD), or null when the hospital holds only a year or month. */
  dateOfBirth: string | null;
}

export class FhirAnswerError extends Error {}

function describe(error: z.ZodError): string {
  const issue = error.issues[0]!;
  const where = issue.path.length ? ` (at ${issue.path.join('.')})` : '';
  return `${issue.message}${where}`;
}

/** Reads one Patient resource, or throws FhirAnswerError naming what is wrong with it. */
export function patientFromFhir(resource: unknown): FhirPatientCandidate {
  const parsed = fhirPatientSchema.safeParse(resource);
  if (!parsed.success) throw new FhirAnswerError(`not a usable Patient: ${describe(parsed.error)}`);
  const p = parsed.data;
  const name = p.name?.find((n) => n.use === 'official') ?? p.name?.[0];
  const recordNumber =
    p.identifier?.find((i) => i.system === fhirSystems.recordNumber)?.value?.trim() || null;
  return {
    fhirId: p.id,
    recordNumber,
    givenName: (name?.given ?? []).join(' ').trim(),
    familyName: name?.family?.trim() ?? '',
    dateOfBirth: p.birthDate && p.birthDate.length === 10 ? p.birthDate : null,
  };
}

/** The Patients of a search answer; a malformed answer throws FhirAnswerError saying why. */
export function patientsFromSearchset(answer: unknown): FhirPatientCandidate[] {
  const parsed = searchsetSchema.safeParse(answer);
  if (!parsed.success) throw new FhirAnswerError(describe(parsed.error));
  return (parsed.data.entry ?? [])
    .filter((e) => e.search?.mode !== 'include' && e.search?.mode !== 'outcome')
    .map((e, i) => {
      try {
        return patientFromFhir(e.resource);
      } catch (error) {
        throw new FhirAnswerError(`entry ${i}: ${(error as Error).message}`);
      }
    });
}

/** Whether a transaction answer is one: a Bundle of type transaction-response with one entry per request. */
export function checkTransactionResponse(answer: unknown, entries: number): void {
  const parsed = z
    .object({
      resourceType: z.literal('Bundle', { error: 'the answer is not a FHIR Bundle' }),
      type: z.literal('transaction-response', {
        error: 'the Bundle is not a transaction-response',
      }),
      entry: z.array(z.object({ response: z.object({ status: z.string() }) })),
    })
    .safeParse(answer);
  if (!parsed.success) throw new FhirAnswerError(describe(parsed.error));
  if (parsed.data.entry.length !== entries)
    throw new FhirAnswerError(
      `the transaction-response has ${parsed.data.entry.length} entries for ${entries} requests`,
    );
  const failed = parsed.data.entry.find((e) => !/^2\d\d/.test(e.response.status));
  if (failed) throw new FhirAnswerError(`an entry answered ${failed.response.status}`);
}
