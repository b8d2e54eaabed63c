import { treatmentStatuses } from '../../shared/orders/lifecycle';
import type { WeightChangeRule } from '../../shared/orders/weight-change';
import { formatCalendarDate } from '../../shared/format/figures';
import { reasonOfSubstanceProblem } from '../../shared/orders/reason-of-substance';
import type {
  CreatePatient,
  PossibleDuplicatesQuery,
  PatientMeasurements,
  Patient as PatientDto,
} from '../../shared/schemas/patients';
import type { AuditRepository } from '../audit/repository';
import type { Reader, ReadAudit } from '../audit/service';
import type { Patient } from '../db/entities/patient';
import { isDuplicateKey } from '../db/errors';
import { AppError } from '../http/app-error';
import type { OrderRepository } from '../orders/repository';
import type { PatientRepository } from './repository';

export function toPatientDto(p: Patient): PatientDto {
  return {
    id: p.id,
    recordNumber: p.recordNumber,
    givenName: p.givenName,
    familyName: p.familyName,
    dateOfBirth: p.dateOfBirth,
    email: p.email,
    emailConsent: p.emailConsent,
    fhirSource:
      p.fhirSource && p.fhirId
        ? { baseUrl: p.fhirSource, id: p.fhirId, readAt: p.fhirReadAt?.toISOString() ?? null }
        : null,
  };
}

/** How many recorded measurements a new order shows beside its inputs. */
const measurementsShown = 5;

export function createPatientService(
  patients: PatientRepository,
  orders: OrderRepository,
  audit: AuditRepository,
  reads: ReadAudit,
  weightChangeRule: WeightChangeRule,
  /** Reads the hospital's Patient again and checks it (server/fhir); absent, a FHIR link is refused. */
  fhirSourceFor?: (
    fhirId: string,
    recordNumber: string,
  ) => Promise<{ fhirSource: string; fhirId: string; fhirReadAt: Date }>,
) {
  return {
    /** The last heights and weights recorded on signed orders, newest first, with the rule a new weight is held to. */
    async measurements(id: number): Promise<PatientMeasurements> {
      if (!(await patients.findById(id)))
        throw AppError.notFound(`There is no patient with id ${id}.`);
      return {
        measurements: await patients.lastMeasurements(id, { limit: measurementsShown }),
        weightChangeRule,
      };
    },

    async search(text?: string) {
      return (await patients.search(text?.trim() || undefined, 50)).map(toPatientDto);
    },

    /** Patients who already have this name and date of birth: a new one may be the same person. */
    async possibleDuplicates(query: PossibleDuplicatesQuery) {
      return (
        await patients.findByNameAndBirth(query.givenName, query.familyName, query.dateOfBirth)
      ).map(toPatientDto);
    },

    async create(actor: { id: number; ipAddress?: string | null }, input: CreatePatient) {
      const taken = () =>
        AppError.conflict(
          'record_number_taken',
          `A patient with record number ${input.recordNumber} exists already; search for it instead of adding it again.`,
        );
      if (await patients.findByRecordNumber(input.recordNumber)) throw taken();
      const source = input.fhirId
        ? fhirSourceFor
          ? await fhirSourceFor(input.fhirId, input.recordNumber)
          : (() => {
              throw AppError.badRequest('This unit has no FHIR server set up.', [
                { path: 'fhirId', message: 'fhirId is accepted only when FHIR_BASE_URL is set' },
              ]);
            })()
        : { fhirSource: null, fhirId: null, fhirReadAt: null };
      // A second record for one person splits their history (and the retreatment interval and
      // duplicate-order checks with it): the same name and date of birth needs a confirmation.
      const sameness = await patients.findByNameAndBirth(
        input.givenName,
        input.familyName,
        input.dateOfBirth,
      );
      const duplicateReason = input.duplicateReason?.trim() || null;
      if (sameness.length > 0) {
        const records = sameness.map((p) => p.recordNumber).join(', ');
        const weak = input.duplicateConfirmed
          ? reasonOfSubstanceProblem(
              duplicateReason,
              undefined,
              'how you know this is another person',
            )
          : 'confirm that this is another person, and say how you know';
        if (weak) {
          throw new AppError(
            409,
            'possible_duplicate_patient',
            `A patient with the same name and date of birth exists already (record ${records}). Nothing was saved: open that record, or ${weak}.`,
            [
              {
                path: input.duplicateConfirmed ? 'duplicateReason' : 'duplicateConfirmed',
                message: `a patient named ${input.givenName} ${input.familyName}, born ${formatCalendarDate(input.dateOfBirth)}, exists already (record ${records}): ${weak}`,
              },
            ],
          );
        }
      }
      // Two people adding the same record at once: both pass the look-up, the unique key stops one.
      const {
        duplicateConfirmed: _confirmed,
        duplicateReason: _reason,
        fhirId: _fhirId,
        ...fields
      } = input;
      const patient = await patients
        .create({ ...fields, email: input.email ?? null, ...source })
        .catch((error: unknown) => {
          throw isDuplicateKey(error) ? taken() : error;
        });
      await audit.append({
        actorUserId: actor.id,
        action: 'patient.created',
        entityType: 'patient',
        entityId: patient.id,
        ipAddress: actor.ipAddress,
        details: {
          recordNumber: patient.recordNumber,
          ...(source.fhirId ? { fhirSource: source.fhirSource, fhirId: source.fhirId } : {}),
          ...(sameness.length > 0
            ? { possibleDuplicateOf: sameness.map((p) => p.id), duplicateReason }
            : {}),
        },
      });
      return toPatientDto(patient);
    },

    /**
     * The patient with every order per eye, newest first, and for each treatment the days since
     * the previous treatment of the same kind on the same eye.
     */
    async history(id: number, reader: Reader) {
      const patient = await patients.findById(id);
      if (!patient) throw AppError.notFound(`There is no patient with id ${id}.`);
      await reads.note(reader, {
        action: 'patient.viewed',
        entityType: 'patient',
        entityId: id,
        details: { recordNumber: patient.recordNumber },
      });
      const rows = await orders.listForPatient(id);
      const treatments = rows.map((o) => ({
        orderId: o.id,
        revision: o.revision,
        eye: o.eye,
        kind: o.protocolVersion.kind,
        protocol: {
          key: o.protocolVersion.key,
          version: o.protocolVersion.version,
          title: o.protocolVersion.title,
        },
        status: o.status,
        date: (o.signedAt ?? o.createdAt).toISOString(),
        daysSincePreviousSameKind: null as number | null,
      }));
      const counted = new Set<string>(treatmentStatuses);
      for (const eye of ['right', 'left'] as const) {
        for (const kind of ['pdt', 'cxl'] as const) {
          const series = treatments
            .filter((t) => t.eye === eye && t.kind === kind && counted.has(t.status))
            .sort((a, b) => a.date.localeCompare(b.date));
          for (let i = 1; i < series.length; i++) {
            series[i]!.daysSincePreviousSameKind = Math.floor(
              (Date.parse(series[i]!.date) - Date.parse(series[i - 1]!.date)) / 86_400_000,
            );
          }
        }
      }
      treatments.sort((a, b) => b.date.localeCompare(a.date));
      return {
        patient: toPatientDto(patient),
        eyes: {
          right: treatments.filter((t) => t.eye === 'right'),
          left: treatments.filter((t) => t.eye === 'left'),
        },
      };
    },
  };
}

export type PatientService = ReturnType<typeof createPatientService>;
