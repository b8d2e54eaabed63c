import { In, IsNull, Not, type DataSource, type EntityManager } from 'typeorm';
import { lengthToCm, massToKg } from '../../shared/engine/units';
import type { TreatmentFacts } from '../../shared/fhir/treatment-bundle';
import type { DoseRecord } from '../../shared/session/dose-record';
import { DeviationRow } from '../db/entities/deviation';
import { DoseRecordRow } from '../db/entities/dose-record';
import { FhirDelivery } from '../db/entities/fhir-delivery';
import { Patient } from '../db/entities/patient';
import { Preparation } from '../db/entities/preparation';
import { SessionParticipant } from '../db/entities/session-participant';
import { TreatmentOrder } from '../db/entities/treatment-order';
import { User } from '../db/entities/user';
import { managerOf, type Transaction } from '../db/unit-of-work';

export type StoredTreatmentFacts = Omit<TreatmentFacts, 'version' | 'builtAt'>;

export function createFhirRepository(dataSource: DataSource) {
  const deliveries = dataSource.getRepository(FhirDelivery);
  const manager = (tx?: Transaction): EntityManager => managerOf(tx) ?? dataSource.manager;

  return {
    /**
     * What a treatment's bundle says, as stored now: the order, its patient, protocol, signer and
     * nurses, the latest preparation, the dose record and the deviations still standing. Null
     * when the order has no dose record yet (no session).
     */
    async treatmentFacts(orderId: number, tx?: Transaction): Promise<StoredTreatmentFacts | null> {
      const m = manager(tx);
      const order = await m.getRepository(TreatmentOrder).findOne({
        where: { id: orderId },
        relations: { patient: true, protocolVersion: true, signedBy: true },
      });
      const recordRow = await m.getRepository(DoseRecordRow).findOneBy({ orderId });
      if (!order || !recordRow) return null;
      const [preparation] = await m
        .getRepository(Preparation)
        .find({ where: { orderId }, order: { id: 'DESC' }, take: 1 });
      const nurseIds = (
        await m.getRepository(SessionParticipant).findBy({ orderId, part: 'nursed' })
      ).map((p) => p.userId);
      const nurses = nurseIds.length
        ? await m.getRepository(User).find({ where: { id: In(nurseIds) }, order: { id: 'ASC' } })
        : [];
      const deviations = await m.getRepository(DeviationRow).find({
        where: { orderId, withdrawnAt: IsNull() },
        order: { detectedAt: 'ASC', id: 'ASC' },
      });
      const record: DoseRecord =
        typeof recordRow.record === 'string' ? JSON.parse(recordRow.record) : recordRow.record;
      const definition = order.protocolVersion.definition;
      const { height, weight } = order.inputs;
      return {
        orderId,
        kind: order.protocolVersion.kind,
        protocol: {
          key: order.protocolVersion.key,
          version: order.protocolVersion.version,
          title: order.protocolVersion.title,
        },
        eye: order.eye,
        patient: {
          recordNumber: order.patient.recordNumber,
          givenName: order.patient.givenName,
          familyName: order.patient.familyName,
          dateOfBirth: order.patient.dateOfBirth,
        },
        performers: [
          ...nurses.map((u) => ({ id: u.id, name: u.displayName, role: 'nurse' as const })),
          ...(order.signedBy
            ? [
                {
                  id: order.signedBy.id,
                  name: order.signedBy.displayName,
                  role: 'clinician' as const,
                },
              ]
            : []),
        ],
        measuredAt: (order.signedAt ?? order.createdAt).toISOString(),
        heightCm: height ? lengthToCm(height.value, height.unit) : null,
        weightKg: weight ? massToKg(weight.value, weight.unit) : null,
        bsaM2: order.plan.bsaM2,
        bsaFormula: order.plan.bsaFormula,
        plannedRateMlPerMin: order.plan.infusionRateMlPerMin,
        drug: definition.drug ? { name: definition.drug.name } : null,
        preparation: preparation
          ? { vialLot: preparation.vialLot, vialExpiry: preparation.vialExpiry }
          : null,
        record,
        deviations: deviations.map((d) => ({
          type: d.type,
          severity: d.severity,
          expected: d.expected,
          actual: d.actual,
          unit: d.unit,
          message: d.message,
          detectedAt: d.detectedAt.toISOString(),
        })),
      };
    },

    /** The newest version stored for an order (any status), for the next version's number and clean-up. */
    latestFor: (orderId: number, tx?: Transaction) =>
      manager(tx)
        .getRepository(FhirDelivery)
        .findOne({ where: { orderId }, order: { version: 'DESC' } }),

    /** Stores a version inside the caller's transaction; older versions not yet sent are superseded. */
    async enqueue(
      tx: Transaction,
      row: { orderId: number; version: number; reason: string; bundle: Record<string, unknown> },
    ): Promise<void> {
      const repo = managerOf(tx).getRepository(FhirDelivery);
      await repo.update(
        { orderId: row.orderId, status: In(['pending', 'failed']) },
        { status: 'superseded', lastError: `replaced by version ${row.version}` },
      );
      await repo.save(repo.create(row));
    },

    /** Claims due rows by pushing their next attempt a lease ahead (SKIP LOCKED), as the mail outbox does. */
    claimDue: (batchSize: number, leaseS: number): Promise<FhirDelivery[]> =>
      dataSource.transaction(async (m) => {
        const rows: { id: number }[] = await m.query(
          `SELECT id FROM fhir_delivery WHERE status = 'pending' AND next_attempt_at <= NOW(3) ORDER BY id LIMIT ? FOR UPDATE SKIP LOCKED`,
          [batchSize],
        );
        if (rows.length === 0) return [];
        const ids = rows.map((r) => r.id);
        await m.query(
          `UPDATE fhir_delivery SET next_attempt_at = NOW(3) + INTERVAL ? SECOND WHERE id IN (?)`,
          [leaseS, ids],
        );
        return m.getRepository(FhirDelivery).findBy({ id: In(ids) });
      }),

    /** Records an attempt; only a row still pending is changed (a newer version may have superseded it). */
    update: (
      id: number,
      changes: Partial<
        Pick<FhirDelivery, 'status' | 'attempts' | 'sentAt' | 'lastError' | 'nextAttemptAt'>
      >,
    ) => deliveries.update({ id, status: 'pending' }, changes),

    newest: (limit: number) =>
      deliveries.find({
        select: {
          id: true,
          orderId: true,
          version: true,
          reason: true,
          status: true,
          attempts: true,
          nextAttemptAt: true,
          lastError: true,
          sentAt: true,
          createdAt: true,
        },
        order: { id: 'DESC' },
        take: limit,
      }),

    patientById: (id: number) => dataSource.getRepository(Patient).findOneBy({ id }),
    patientByRecordNumber: (recordNumber: string) =>
      dataSource.getRepository(Patient).findOneBy({ recordNumber }),
    /** Another patient already linked to this FHIR Patient, if any. */
    patientLinkedTo: (fhirSource: string, fhirId: string, exceptId?: number) =>
      dataSource.getRepository(Patient).findOneBy({
        fhirSource,
        fhirId,
        ...(exceptId ? { id: Not(exceptId) } : {}),
      }),
    updatePatient: (
      id: number,
      changes: Partial<
        Pick<
          Patient,
          'givenName' | 'familyName' | 'dateOfBirth' | 'fhirSource' | 'fhirId' | 'fhirReadAt'
        >
      >,
    ) => dataSource.getRepository(Patient).update({ id }, changes),
  };
}

export type FhirRepository = ReturnType<typeof createFhirRepository>;
