import {
  buildTreatmentBundle,
  resourceIdsOf,
  type FhirBundle,
} from '../../shared/fhir/treatment-bundle';
import { fhirSystems } from '../../shared/fhir/codes';
import { FhirAnswerError, type FhirPatientCandidate } from '../../shared/fhir/patient-from-fhir';
import type { AuditRepository } from '../audit/repository';
import type { Reader, ReadAudit } from '../audit/service';
import type { Clock } from '../clock';
import type { Transaction } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import { FhirUnavailableError, type FhirGateway } from './client';
import type { FhirRepository } from './repository';

/** What went wrong with the FHIR server, as a person at the desk can act on it. */
export function fhirProblem(error: unknown, what: string): unknown {
  if (error instanceof FhirUnavailableError)
    return new AppError(
      502,
      'fhir_unavailable',
      `The hospital's FHIR server is not available (${error.message}). Nothing was taken from it: ${what}`,
    );
  if (error instanceof FhirAnswerError)
    return new AppError(
      502,
      'fhir_bad_answer',
      `The hospital's FHIR server sent an answer Luxtempo cannot use (${error.message}). Nothing was taken from it: ${what}`,
    );
  return error;
}

const notConfigured = () =>
  new AppError(
    404,
    'fhir_not_configured',
    'This unit has no FHIR server set up (FHIR_BASE_URL is not set): patients are entered by hand and treatment records are not sent.',
  );

export function createFhirService(deps: {
  gateway: FhirGateway | null;
  fhir: FhirRepository;
  audit: AuditRepository;
  reads: ReadAudit;
  clock: Clock;
}) {
  const { gateway, fhir, audit } = deps;

  async function bundleFor(
    orderId: number,
    version: number,
    tx?: Transaction,
    previous?: FhirBundle,
  ): Promise<FhirBundle | null> {
    const facts = await fhir.treatmentFacts(orderId, tx);
    if (!facts) return null;
    return buildTreatmentBundle({
      ...facts,
      version,
      builtAt: deps.clock.now().toISOString(),
      previousResourceIds: previous ? resourceIdsOf(previous) : [],
    });
  }

  return {
    status: () => ({ enabled: gateway !== null, baseUrl: gateway?.baseUrl ?? null }),

    /**
     * Hospital patients by record number or by name, each marked with the Luxtempo patient it
     * already is (linked to it, or holding its record number).
     */
    async searchPatients(query: { recordNumber?: string; name?: string }) {
      if (!gateway) throw notConfigured();
      let found: FhirPatientCandidate[];
      try {
        found = await gateway.searchPatients(
          query.recordNumber
            ? { identifier: `${fhirSystems.recordNumber}|${query.recordNumber}` }
            : { name: query.name },
        );
      } catch (error) {
        throw fhirProblem(error, 'enter the patient by hand, or try again later.');
      }
      return {
        source: gateway.baseUrl,
        patients: await Promise.all(
          found.slice(0, 50).map(async (p) => ({
            ...p,
            luxtempoPatientId:
              (await fhir.patientLinkedTo(gateway.baseUrl, p.fhirId))?.id ??
              (p.recordNumber ? (await fhir.patientByRecordNumber(p.recordNumber))?.id : null) ??
              null,
          })),
        ),
      };
    },

    /**
     * The hospital's Patient for a new Luxtempo patient: read again on the server (never taken
     * from the browser), and its record number must be the one entered.
     */
    async sourceForNewPatient(fhirId: string, recordNumber: string) {
      if (!gateway) throw notConfigured();
      let p: FhirPatientCandidate;
      try {
        p = await gateway.readPatient(fhirId);
      } catch (error) {
        throw fhirProblem(error, 'save the patient without the link, or try again later.');
      }
      if (p.recordNumber !== recordNumber)
        throw AppError.badRequest('The record number is not the hospital record’s.', [
          {
            path: 'recordNumber',
            message: `recordNumber must be the hospital record's (${p.recordNumber ?? 'none'}) when the patient is taken from FHIR Patient/${fhirId}`,
          },
        ]);
      if (await fhir.patientLinkedTo(gateway.baseUrl, fhirId))
        throw AppError.conflict(
          'fhir_patient_linked',
          `FHIR Patient/${fhirId} is already linked to a Luxtempo patient; search for it instead.`,
        );
      return { fhirSource: gateway.baseUrl, fhirId, fhirReadAt: deps.clock.now() };
    },

    /** Reads a linked patient again and takes the hospital's names and date of birth. */
    async refreshPatient(actor: { id: number; ipAddress?: string | null }, patientId: number) {
      const patient = await fhir.patientById(patientId);
      if (!patient) throw AppError.notFound(`There is no patient with id ${patientId}.`);
      if (!patient.fhirId || !patient.fhirSource)
        throw AppError.conflict(
          'not_linked',
          `Patient ${patient.recordNumber} was entered by hand: there is no hospital record to read again.`,
        );
      if (!gateway) throw notConfigured();
      if (patient.fhirSource !== gateway.baseUrl)
        throw AppError.conflict(
          'other_fhir_server',
          `Patient ${patient.recordNumber} came from ${patient.fhirSource}, not from this unit's FHIR server (${gateway.baseUrl}).`,
        );
      let p: FhirPatientCandidate;
      try {
        p = await gateway.readPatient(patient.fhirId);
      } catch (error) {
        throw fhirProblem(error, 'the patient stays as it was.');
      }
      if (p.recordNumber !== patient.recordNumber)
        throw AppError.conflict(
          'record_number_changed',
          `The hospital record now carries record number ${p.recordNumber ?? '(none)'}, not ${patient.recordNumber}: nothing was changed; ask medical records.`,
        );
      if (!p.givenName || !p.familyName || !p.dateOfBirth)
        throw fhirProblem(
          new FhirAnswerError('the Patient lacks a name or a full date of birth'),
          'the patient stays as it was.',
        );
      const changes = {
        givenName: p.givenName,
        familyName: p.familyName,
        dateOfBirth: p.dateOfBirth,
      };
      const changed = Object.fromEntries(
        Object.entries(changes).filter(([k, v]) => patient[k as keyof typeof changes] !== v),
      );
      await fhir.updatePatient(patientId, { ...changes, fhirReadAt: deps.clock.now() });
      await audit.append({
        actorUserId: actor.id,
        action: 'patient.fhir-refreshed',
        entityType: 'patient',
        entityId: patientId,
        ipAddress: actor.ipAddress,
        details: { fhirId: patient.fhirId, changed },
      });
      return { changed: Object.keys(changed) };
    },

    /** The treatment's bundle as it stands now, for units that pull. */
    async currentBundle(orderId: number, reader: Reader): Promise<FhirBundle> {
      const latest = await fhir.latestFor(orderId);
      const bundle = await bundleFor(orderId, latest?.version ?? 1);
      if (!bundle)
        throw AppError.notFound(
          `Order ${orderId} has no treatment record yet: its bundle exists once its session has started.`,
        );
      await deps.reads.note(reader, {
        action: 'order.fhir-read',
        entityType: 'order',
        entityId: orderId,
        details: { version: latest?.version ?? 1 },
      });
      return bundle;
    },

    /**
     * Stores the next version of the order's bundle inside the caller's transaction (the one that
     * ended the session or changed its record); the worker sends it. Nothing when FHIR is off.
     */
    async enqueueTreatment(tx: Transaction, orderId: number, reason: string): Promise<void> {
      if (!gateway) return;
      const latest = await fhir.latestFor(orderId, tx);
      const version = (latest?.version ?? 0) + 1;
      const previous = latest ? (latest.bundle as unknown as FhirBundle) : undefined;
      const bundle = await bundleFor(orderId, version, tx, previous);
      if (!bundle) return;
      await fhir.enqueue(tx, {
        orderId,
        version,
        reason,
        bundle: bundle as unknown as Record<string, unknown>,
      });
    },

    /** The FHIR side of the outbox page. */
    async deliveries() {
      return (await fhir.newest(200)).map((d) => ({
        id: d.id,
        orderId: d.orderId,
        version: d.version,
        reason: d.reason,
        status: d.status,
        attempts: d.attempts,
        nextAttemptAt: d.nextAttemptAt.toISOString(),
        lastError: d.lastError,
        sentAt: d.sentAt?.toISOString() ?? null,
        createdAt: d.createdAt.toISOString(),
      }));
    },
  };
}

export type FhirService = ReturnType<typeof createFhirService>;
