import type { DataSource } from 'typeorm';
import type { ProtocolVersion as ProtocolDefinition } from '../../shared/protocol/protocol-schema';
import { Attachment } from '../db/entities/attachment';
import { Complication } from '../db/entities/complication';
import { FollowUpVisit } from '../db/entities/follow-up-visit';
import { ProtocolVersion } from '../db/entities/protocol-version';
import { managerOf, type Transaction } from '../db/unit-of-work';

/** A completed treatment that has no follow-up visits planned yet. */
export interface UnplannedTreatment {
  orderId: number;
  patientId: number;
  eye: 'right' | 'left';
  endedAt: Date;
  protocolVersionId: number;
}

/** One treated eye with what the outcome report reads from it. */
export interface TreatedEyeRow {
  orderId: number;
  patientId: number;
  eye: 'right' | 'left';
  localMonth: string;
  protocolKey: string;
  protocolTitle: string;
  kind: 'pdt' | 'cxl';
  planProtocolVersionId: number | null;
  deviationCount: number;
}

export interface OverdueVisitRow {
  id: number;
  orderId: number;
  patientId: number;
  recordNumber: string;
  givenName: string;
  familyName: string;
  eye: 'right' | 'left';
  visitLabel: string;
  dueOn: string;
}

export interface ReminderCandidate {
  id: number;
  orderId: number;
  planProtocolVersionId: number;
  visitLabel: string;
  dueOn: string;
  eye: 'right' | 'left';
  email: string;
  givenName: string;
}

export type VisitFindings = Pick<
  FollowUpVisit,
  | 'seenOn'
  | 'acuityNotation'
  | 'acuityEntry'
  | 'acuityLogMar'
  | 'centralSubfieldThicknessUm'
  | 'subretinalFluid'
  | 'leakage'
  | 'retreatmentDecision'
  | 'kmaxD'
  | 'thinnestPachymetryUm'
  | 'endothelialCellsPerMm2'
  | 'hazeGrade'
  | 'note'
>;

export function createFollowUpRepository(dataSource: DataSource) {
  const visits = dataSource.getRepository(FollowUpVisit);
  const complications = dataSource.getRepository(Complication);
  return {
    /** Completed sessions without planned visits (optionally of one patient), oldest first. */
    async unplanned(
      patientId?: number,
      afterOrderId = 0,
      limit = 500,
    ): Promise<UnplannedTreatment[]> {
      const rows: {
        orderId: number;
        patientId: number;
        eye: 'right' | 'left';
        endedAt: Date;
        protocolVersionId: number;
      }[] = await dataSource.query(
        `SELECT d.order_id AS orderId, o.patient_id AS patientId, o.eye AS eye, d.ended_at AS endedAt,
                o.protocol_version_id AS protocolVersionId
           FROM dose_record d JOIN treatment_order o ON o.id = d.order_id
          WHERE d.outcome = 'completed' AND d.ended_at IS NOT NULL
            AND o.status IN ('completed', 'reviewed')
            ${patientId === undefined ? '' : 'AND o.patient_id = ?'}
            AND NOT EXISTS (SELECT 1 FROM follow_up_visit v WHERE v.order_id = d.order_id)
            AND d.order_id > ?
          ORDER BY d.order_id LIMIT ${Number(limit)}`,
        patientId === undefined ? [afterOrderId] : [patientId, afterOrderId],
      );
      return rows.map((r) => ({ ...r, endedAt: new Date(r.endedAt) }));
    },

    /** Every protocol version with its definition: the planner picks the follow-up block from them. */
    protocolVersions: async () =>
      (
        await dataSource.getRepository(ProtocolVersion).find({
          select: { id: true, key: true, version: true, status: true, definition: true },
        })
      ).map((v) => ({
        id: v.id,
        key: v.key,
        version: v.version,
        status: v.status,
        definition: v.definition as ProtocolDefinition,
      })),

    /** Planned visits go in once: a second planner racing this one is ignored by the unique key. */
    async insertPlanned(
      rows: Pick<
        FollowUpVisit,
        | 'orderId'
        | 'patientId'
        | 'eye'
        | 'kind'
        | 'planProtocolVersionId'
        | 'visitKey'
        | 'visitLabel'
        | 'offsetDays'
        | 'dueOn'
        | 'windowDays'
      >[],
    ): Promise<void> {
      if (rows.length === 0) return;
      await visits.createQueryBuilder().insert().values(rows).orIgnore().execute();
    },

    visitsOfPatient: (patientId: number) =>
      visits.find({ where: { patientId }, order: { dueOn: 'ASC', id: 'ASC' } }),

    visitsOfOrders: async (orderIds: number[]) =>
      orderIds.length === 0
        ? []
        : visits
            .createQueryBuilder('v')
            .where('v.orderId IN (:...orderIds)', { orderIds })
            .getMany(),

    findVisit: (id: number) => visits.findOneBy({ id }),

    /** Records a planned visit once; false when someone recorded it first. */
    async recordVisit(
      id: number,
      findings: VisitFindings,
      recordedBy: number,
      recordedAt: Date,
    ): Promise<boolean> {
      const result = await visits
        .createQueryBuilder()
        .update()
        .set({ ...findings, recordedBy, recordedAt })
        .where('id = :id AND recorded_at IS NULL', { id })
        .execute();
      return (result.affected ?? 0) === 1;
    },

    /** The latest recorded retreatment decision for an eye, for the retreatment-interval warning. */
    async latestDecision(patientId: number, eye: 'right' | 'left', kind: 'pdt' | 'cxl') {
      return visits
        .createQueryBuilder('v')
        .where('v.patientId = :patientId AND v.eye = :eye AND v.kind = :kind', {
          patientId,
          eye,
          kind,
        })
        .andWhere('v.retreatmentDecision IS NOT NULL')
        .orderBy('v.seenOn', 'DESC')
        .addOrderBy('v.id', 'DESC')
        .getOne();
    },

    attachmentsOfVisits: async (visitIds: number[]) =>
      visitIds.length === 0
        ? []
        : dataSource
            .getRepository(Attachment)
            .createQueryBuilder('a')
            .where('a.followUpVisitId IN (:...visitIds)', { visitIds })
            .orderBy('a.id', 'ASC')
            .getMany(),

    addComplication: (row: Omit<Complication, 'id' | 'createdAt' | 'order'>) =>
      complications.save(complications.create(row)),

    complicationsOfPatient: (patientId: number) =>
      complications.find({ where: { patientId }, order: { onsetOn: 'DESC', id: 'DESC' } }),

    /** Complications the auditor has not looked at yet, oldest first. */
    complicationsToReview: (limit: number) =>
      complications
        .createQueryBuilder('c')
        .where('c.reviewedAt IS NULL')
        .orderBy('c.recordedAt', 'ASC')
        .take(limit)
        .getMany(),

    async markComplicationReviewed(id: number, reviewedBy: number, at: Date): Promise<boolean> {
      const result = await complications
        .createQueryBuilder()
        .update()
        .set({ reviewedBy, reviewedAt: at })
        .where('id = :id AND reviewed_at IS NULL', { id })
        .execute();
      return (result.affected ?? 0) === 1;
    },

    findComplication: (id: number) => complications.findOneBy({ id }),

    complicationsOfOrders: async (orderIds: number[]) =>
      orderIds.length === 0
        ? []
        : complications
            .createQueryBuilder('c')
            .where('c.orderId IN (:...orderIds)', { orderIds })
            .getMany(),

    /** Completed treatments in a month range (the unit's calendar), with their protocol. */
    async treatedEyes(filter: {
      fromMonth?: string;
      toMonth?: string;
      protocol?: string;
    }): Promise<TreatedEyeRow[]> {
      const where: string[] = ["d.outcome = 'completed'", 'd.local_month IS NOT NULL'];
      const params: unknown[] = [];
      if (filter.fromMonth) {
        where.push('d.local_month >= ?');
        params.push(filter.fromMonth);
      }
      if (filter.toMonth) {
        where.push('d.local_month <= ?');
        params.push(filter.toMonth);
      }
      if (filter.protocol) {
        where.push('p.protocol_key = ?');
        params.push(filter.protocol);
      }
      const rows: (Omit<TreatedEyeRow, 'deviationCount'> & { deviationCount: string | number })[] =
        await dataSource.query(
          `SELECT d.order_id AS orderId, o.patient_id AS patientId, o.eye AS eye,
                  d.local_month AS localMonth, p.protocol_key AS protocolKey, p.title AS protocolTitle,
                  p.kind AS kind, d.deviation_count AS deviationCount,
                  (SELECT MIN(v.plan_protocol_version_id) FROM follow_up_visit v WHERE v.order_id = d.order_id) AS planProtocolVersionId
             FROM dose_record d
             JOIN treatment_order o ON o.id = d.order_id
             JOIN protocol_version p ON p.id = o.protocol_version_id
            WHERE ${where.join(' AND ')}
            ORDER BY d.local_month, d.order_id`,
          params,
        );
      return rows.map((r) => ({
        ...r,
        deviationCount: Number(r.deviationCount),
        planProtocolVersionId:
          r.planProtocolVersionId === null ? null : Number(r.planProtocolVersionId),
      }));
    },

    /** Planned visits past their due date and not recorded: the signer's own patients first, then oldest first. */
    overdue: (today: string, limit: number, signerId: number): Promise<OverdueVisitRow[]> =>
      dataSource.query(
        `SELECT v.id, v.order_id AS orderId, v.patient_id AS patientId, p.record_number AS recordNumber,
                p.given_name AS givenName, p.family_name AS familyName, v.eye, v.visit_label AS visitLabel,
                v.due_on AS dueOn
           FROM follow_up_visit v JOIN patient p ON p.id = v.patient_id
           JOIN treatment_order o ON o.id = v.order_id
          WHERE v.recorded_at IS NULL AND v.due_on < ?
          ORDER BY o.signed_by <=> ? DESC, v.due_on, v.id LIMIT ${Number(limit)}`,
        [today, signerId],
      ),

    /**
     * Unrecorded, unreminded visits due between two dates, of patients who consent to e-mail: a
     * page of `limit` after the visit id `afterId` (callers page on until a short page).
     */
    reminderCandidates: (
      fromDay: string,
      toDay: string,
      afterId: number,
      limit: number,
    ): Promise<ReminderCandidate[]> =>
      dataSource.query(
        `SELECT v.id, v.order_id AS orderId, v.plan_protocol_version_id AS planProtocolVersionId,
                v.visit_label AS visitLabel, v.due_on AS dueOn, v.eye, p.email, p.given_name AS givenName
           FROM follow_up_visit v JOIN patient p ON p.id = v.patient_id
          WHERE v.recorded_at IS NULL AND v.reminder_queued_at IS NULL AND v.offset_days > 0
            AND v.due_on BETWEEN ? AND ? AND p.email_consent = 1 AND p.email IS NOT NULL
            AND v.id > ?
          ORDER BY v.id LIMIT ${Number(limit)}`,
        [fromDay, toDay, afterId],
      ),

    /** Marks a reminder queued, once: false when another instance queued it first. */
    async markReminderQueued(tx: Transaction, id: number, at: Date): Promise<boolean> {
      const result = await managerOf(tx)
        .getRepository(FollowUpVisit)
        .createQueryBuilder()
        .update()
        .set({ reminderQueuedAt: at })
        .where('id = :id AND reminder_queued_at IS NULL', { id })
        .execute();
      return (result.affected ?? 0) === 1;
    },

    addAttachment: (row: Omit<Attachment, 'id' | 'createdAt' | 'order'>) =>
      dataSource.getRepository(Attachment).save(dataSource.getRepository(Attachment).create(row)),
  };
}

export type FollowUpRepository = ReturnType<typeof createFollowUpRepository>;

/** A session that ended (completed or stopped), as the follow-up screens and complications read it. */
export interface EndedTreatment {
  orderId: number;
  patientId: number;
  eye: 'right' | 'left';
  kind: 'pdt' | 'cxl';
  status: string;
  protocolVersionId: number;
  protocolKey: string;
  protocolVersion: number;
  protocolTitle: string;
  outcome: string;
  endedAt: Date;
}

export function createEndedTreatmentQueries(dataSource: DataSource) {
  const select = `SELECT o.id AS orderId, o.patient_id AS patientId, o.eye, p.kind, o.status,
                         o.protocol_version_id AS protocolVersionId, p.protocol_key AS protocolKey,
                         p.version AS protocolVersion, p.title AS protocolTitle, d.outcome,
                         d.ended_at AS endedAt
                    FROM dose_record d JOIN treatment_order o ON o.id = d.order_id
                    JOIN protocol_version p ON p.id = o.protocol_version_id
                   WHERE d.outcome IN ('completed', 'stopped') AND d.ended_at IS NOT NULL`;
  const shaped = (rows: EndedTreatment[]) =>
    rows.map((r) => ({ ...r, endedAt: new Date(r.endedAt) }));
  return {
    ofPatient: async (patientId: number) =>
      shaped(
        await dataSource.query(`${select} AND o.patient_id = ? ORDER BY d.ended_at DESC`, [
          patientId,
        ]),
      ),
    ofOrder: async (orderId: number) =>
      shaped(await dataSource.query(`${select} AND o.id = ?`, [orderId]))[0] ?? null,
  };
}

export type EndedTreatmentQueries = ReturnType<typeof createEndedTreatmentQueries>;
