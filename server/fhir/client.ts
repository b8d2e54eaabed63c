import { Client, type FhirResource } from 'fhir-kit-client';
import type { FhirBundle } from '../../shared/fhir/treatment-bundle';
import {
  checkTransactionResponse,
  FhirAnswerError,
  patientFromFhir,
  patientsFromSearchset,
  type FhirPatientCandidate,
} from '../../shared/fhir/patient-from-fhir';

/** The FHIR server could not be reached, or answered with an error status. */
export class FhirUnavailableError extends Error {
  constructor(
    message: string,
    /** The HTTP status the server answered, when it answered at all. */
    readonly status: number | null = null,
  ) {
    super(message);
  }
}

export interface FhirGateway {
  baseUrl: string;
  searchPatients(query: { identifier?: string; name?: string }): Promise<FhirPatientCandidate[]>;
  readPatient(id: string): Promise<FhirPatientCandidate>;
  sendTransaction(bundle: FhirBundle): Promise<void>;
}

/** Talks to the hospital's FHIR R4 server through fhir-kit-client, with a time limit on each call. */
export function createFhirGateway(baseUrl: string, timeoutMs: number): FhirGateway {
  const client = new Client({ baseUrl });
  const options = () => ({ signal: AbortSignal.timeout(timeoutMs) });

  async function call<T>(what: string, run: () => Promise<T>): Promise<T> {
    try {
      return await run();
    } catch (error) {
      const response = (error as { response?: { status?: number; data?: unknown } }).response;
      if (response?.status && response.status >= 200 && response.status < 300)
        // A 2xx whose body is not JSON: fhir-kit-client refuses to parse it.
        throw new FhirAnswerError(`${what}: the answer is not JSON`);
      if (response?.status)
        throw new FhirUnavailableError(
          `${what}: the FHIR server answered HTTP ${response.status}`,
          response.status,
        );
      const name = (error as Error).name;
      throw new FhirUnavailableError(
        name === 'TimeoutError' || name === 'AbortError'
          ? `${what}: the FHIR server did not answer within ${timeoutMs} ms`
          : `${what}: the FHIR server could not be reached (${(error as Error).message})`,
      );
    }
  }

  return {
    baseUrl,
    async searchPatients(query) {
      const searchParams: Record<string, string> = {};
      if (query.identifier) searchParams.identifier = query.identifier;
      if (query.name) searchParams.name = query.name;
      const answer = await call('Patient search', () =>
        client.search({ resourceType: 'Patient', searchParams, options: options() }),
      );
      return patientsFromSearchset(answer);
    },
    async readPatient(id) {
      const answer = await call(`Patient/${id}`, () =>
        client.read({ resourceType: 'Patient', id, options: options() }),
      );
      const patient = patientFromFhir(answer);
      if (patient.fhirId !== id)
        throw new FhirAnswerError(
          `asked for Patient/${id}, the server sent Patient/${patient.fhirId}`,
        );
      return patient;
    },
    async sendTransaction(bundle) {
      const answer = await call('Transaction', () =>
        client.transaction({ body: bundle as unknown as FhirResource, options: options() }),
      );
      checkTransactionResponse(answer, bundle.entry.length);
    },
  };
}
