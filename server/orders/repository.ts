import { In, IsNull, type DataSource } from 'typeorm';
import { canMoveOrder } from '../../shared/orders/lifecycle';
import type { OrderListQuery, OrderStatus } from '../../shared/schemas/orders';
import { AppError } from '../http/app-error';
import { checkOrderedDefinition, definitionSha256 } from '../protocols/definition-hash';
import { Attachment } from '../db/entities/attachment';
import { DoseCheck } from '../db/entities/dose-check';
import { Preparation } from '../db/entities/preparation';
import { TreatmentOrder } from '../db/entities/treatment-order';
import { quickQuery } from '../db/quick-query';
import { managerOf, type Transaction } from '../db/unit-of-work';

const withParts = {
  patient: true,
  protocolVersion: true,
  createdBy: true,
  signedBy: true,
  cancelledBy: true,
} as const;

const sortColumns: Record<OrderListQuery['sort'], string> = {
  createdAt: 'o.createdAt',
  status: 'o.status',
  protocol: 'pv.key',
  patient: 'p.familyName',
};

/**
 * The one way an order's status changes: the move must be one the lifecycle allows, and the row
 * must still be in the status the caller read (compare and set), so two writers cannot both win.
 */
export async function moveOrderStatus(
  tx: Transaction,
  id: number,
  from: OrderStatus,
  to: OrderStatus,
  changes: Omit<Partial<TreatmentOrder>, 'status'> = {},
): Promise<void> {
  if (from === to) return;
  if (!canMoveOrder(from, to))
    throw AppError.conflict('status_move_refused', `Order ${id} cannot go from ${from} to ${to}.`);
  const result = await managerOf(tx)
    .getRepository(TreatmentOrder)
    .update({ id, status: from }, { ...changes, status: to });
  if (result.affected !== 1)
    throw AppError.conflict(
      'status_changed',
      `Order ${id} is no longer ${from}; reload it and try again.`,
    );
}

/** What a session reads of a signed order that never changes (the frozen copies are shared by every tap). */
interface SignedOrderFacts {
  eye: 'right' | 'left';
  patientId: number;
  protocolVersionId: number;
  protocolSha256: string;
  plan: TreatmentOrder['plan'];
  checklist: TreatmentOrder['checklist'];
  signedAtMs: number | null;
}

const signedFactsMax = 2_000;

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const inner of Object.values(value)) deepFreeze(inner);
  }
  return value;
}

function factsOf(row: Record<string, unknown>): SignedOrderFacts {
  const parse = <T>(v: unknown): T => (typeof v === 'string' ? JSON.parse(v) : v) as T;
  return {
    eye: row.eye as 'right' | 'left',
    patientId: Number(row.patientId),
    protocolVersionId: Number(row.protocolVersionId),
    protocolSha256: String(row.protocolSha256),
    plan: deepFreeze(parse<TreatmentOrder['plan']>(row.plan)),
    checklist: deepFreeze(parse<TreatmentOrder['checklist']>(row.checklist)),
    signedAtMs: row.signedAt ? (row.signedAt as Date).getTime() : null,
  };
}

/**
 * The order's row and its own preparation row, locked, nothing shared: a join to the protocol
 * version would lock that row too, and every session on one protocol would then wait for every
 * other. The subqueries are plain reads (MariaDB locks only the order's row and its
 * preparation's here), made after the lock is granted, so they see every event and deviation
 * committed by the lock's previous holder: the session service's tap needs no further read when
 * its process already knows the session's events.
 * `withPlan` false leaves out the plan and checklist (the caller holds them already).
 */
async function lockStatement(
  dataSource: DataSource,
  tx: Transaction,
  id: number,
  withPlan: boolean,
): Promise<Record<string, unknown> | undefined> {
  const [row] = await quickQuery<Record<string, unknown>[]>(
    dataSource,
    tx,
    `SELECT o.id, o.status, o.eye, o.patient_id AS patientId, o.protocol_version_id AS protocolVersionId, o.protocol_sha256 AS protocolSha256, o.signed_at AS signedAt,
            ${withPlan ? 'o.plan, o.checklist' : 'NULL AS plan, NULL AS checklist'},
            p.reconstituted_at AS reconstitutedAt, p.beyond_use_at AS beyondUseAt,
            (SELECT MAX(e.id) FROM session_event e WHERE e.order_id = o.id) AS lastEventId,
            (SELECT JSON_ARRAYAGG(JSON_OBJECT('id', d.id, 'type', d.type, 'severity', d.severity, 'expected', d.expected, 'actual', d.actual,
                                              'message', d.message, 'detectedAt', d.detected_at, 'withdrawnAt', d.withdrawn_at))
               FROM deviation d WHERE d.order_id = o.id) AS deviations
       FROM treatment_order o LEFT JOIN preparation p ON p.id = (SELECT MAX(latest.id) FROM preparation latest WHERE latest.order_id = o.id)
      WHERE o.id = ? FOR UPDATE`,
    [id],
  );
  return row as Record<string, unknown> | undefined;
}

export function createOrderRepository(dataSource: DataSource) {
  const orders = dataSource.getRepository(TreatmentOrder);
  /** Signed orders' facts, by order id, as `lockForSession` read them (see there). */
  const signedFacts = new Map<number, SignedOrderFacts>();
  const rememberSignedFacts = (id: number, facts: SignedOrderFacts) => {
    signedFacts.delete(id);
    if (signedFacts.size >= signedFactsMax) signedFacts.delete(signedFacts.keys().next().value!);
    signedFacts.set(id, facts);
  };
  return {
    /** One order with its parts; its protocol definition is checked against the fingerprint it was planned on. */
    async findById(id: number, tx?: Transaction) {
      const order = await (managerOf(tx)?.getRepository(TreatmentOrder) ?? orders).findOne({
        where: { id },
        relations: withParts,
      });
      if (order) checkOrderedDefinition(order, definitionSha256(order.protocolVersion.definition));
      return order;
    },

    /**
     * What a session event needs of its order, read and locked in one statement: events of one
     * order are handled one at a time, and the definition comes from the protocol cache.
     */
    async lockForSession(tx: Transaction, id: number) {
      // A signed order's plan, checklist and facts cannot change (the database's trigger
      // treatment_order_signed_kept refuses it), so they are read once per process and left out
      // of the statement afterwards; its signature time and fingerprint are still read, and a
      // different answer (another database restored under the same id) reads them again.
      const known = signedFacts.get(id);
      const row = await lockStatement(dataSource, tx, id, known === undefined);
      if (!row) return null;
      const signedAtMs = row.signedAt ? (row.signedAt as Date).getTime() : null;
      let facts = known;
      if (
        !facts ||
        facts.signedAtMs !== signedAtMs ||
        facts.protocolSha256 !== String(row.protocolSha256)
      ) {
        const full = known ? await lockStatement(dataSource, tx, id, true) : row;
        if (!full) return null;
        facts = factsOf(full);
        if (facts.signedAtMs !== null) rememberSignedFacts(id, facts);
        else signedFacts.delete(id);
        Object.assign(row, full);
      }
      return {
        id: Number(row.id),
        status: row.status as OrderStatus,
        ...facts,
        /** When the drug was made up and must be used by (PDT), for the beyond-use deviations. */
        preparation: row.reconstitutedAt
          ? {
              reconstitutedAt: (row.reconstitutedAt as Date).toISOString(),
              beyondUseAt: (row.beyondUseAt as Date).toISOString(),
            }
          : null,
        /** The id of the order's newest stored event (null before the first). */
        lastEventId: row.lastEventId === null ? null : Number(row.lastEventId),
        /** The order's stored deviations as JSON (server/sessions/repository.ts reads it). */
        storedDeviationsJson: row.deviations as string | unknown[] | null,
      };
    },

    /** Locks the order row for the rest of the transaction: status changes never race. */
    lockById: (tx: Transaction, id: number) =>
      managerOf(tx)
        .getRepository(TreatmentOrder)
        .findOne({ where: { id }, lock: { mode: 'pessimistic_write' } }),

    save: (tx: Transaction, order: Partial<TreatmentOrder>) =>
      managerOf(tx).getRepository(TreatmentOrder).save(order),

    /** Changes other than the status; a status moves only through `moveOrderStatus`. */
    update: (tx: Transaction, id: number, changes: Omit<Partial<TreatmentOrder>, 'status'>) =>
      managerOf(tx).getRepository(TreatmentOrder).update({ id }, changes),

    nextRevisionOf: (id: number, tx?: Transaction) =>
      (managerOf(tx)?.getRepository(TreatmentOrder) ?? orders).findOne({
        where: { previousRevisionId: id },
        select: { id: true, status: true },
      }),

    listForPatient: (patientId: number) =>
      orders.find({
        where: { patientId },
        relations: { protocolVersion: true },
        order: { createdAt: 'DESC' },
      }),

    /** Treatments of one kind on one eye since a moment, for the retreatment interval. */
    async treatmentsSince(
      patientId: number,
      eye: 'right' | 'left',
      kind: 'pdt' | 'cxl',
      since: Date,
      statuses: readonly OrderStatus[],
      excludeIds: number[] = [],
    ) {
      const qb = orders
        .createQueryBuilder('o')
        .innerJoinAndSelect('o.protocolVersion', 'pv')
        .where('o.patientId = :patientId AND o.eye = :eye AND pv.kind = :kind', {
          patientId,
          eye,
          kind,
        })
        .andWhere('o.status IN (:...statuses)', { statuses })
        .andWhere('COALESCE(o.signedAt, o.createdAt) >= :since', { since })
        .orderBy('o.signedAt', 'DESC');
      if (excludeIds.length) qb.andWhere('o.id NOT IN (:...excludeIds)', { excludeIds });
      return qb.getMany();
    },

    /** Open orders of one kind on one eye, oldest first, for the duplicate-order rule. */
    openOrdersFor(
      patientId: number,
      eye: 'right' | 'left',
      kind: 'pdt' | 'cxl',
      statuses: readonly OrderStatus[],
      excludeIds: number[] = [],
    ) {
      const qb = orders
        .createQueryBuilder('o')
        .innerJoinAndSelect('o.protocolVersion', 'pv')
        .where('o.patientId = :patientId AND o.eye = :eye AND pv.kind = :kind', {
          patientId,
          eye,
          kind,
        })
        .andWhere('o.status IN (:...statuses)', { statuses })
        .orderBy('o.id', 'ASC');
      if (excludeIds.length) qb.andWhere('o.id NOT IN (:...excludeIds)', { excludeIds });
      return qb.getMany();
    },

    async list(query: OrderListQuery, createdRange: { from?: Date; to?: Date }) {
      const qb = orders
        .createQueryBuilder('o')
        .innerJoinAndSelect('o.patient', 'p')
        .innerJoinAndSelect('o.protocolVersion', 'pv')
        .leftJoinAndSelect('o.createdBy', 'cb')
        .leftJoinAndSelect('o.signedBy', 'sb');
      if (query.status) qb.andWhere('o.status = :status', { status: query.status });
      if (query.protocol) qb.andWhere('pv.key = :key', { key: query.protocol });
      if (query.patientId) qb.andWhere('o.patientId = :patientId', { patientId: query.patientId });
      if (createdRange.from) qb.andWhere('o.createdAt >= :from', { from: createdRange.from });
      if (createdRange.to) qb.andWhere('o.createdAt < :to', { to: createdRange.to });
      qb.orderBy(sortColumns[query.sort], query.direction === 'asc' ? 'ASC' : 'DESC').addOrderBy(
        'o.id',
        query.direction === 'asc' ? 'ASC' : 'DESC',
      );
      qb.skip((query.page - 1) * query.pageSize).take(query.pageSize);
      const [rows, total] = await qb.getManyAndCount();
      return { rows, total };
    },

    listByStatus: (
      statuses: readonly OrderStatus[],
      extra: { createdById?: number; signedById?: number } = {},
    ) =>
      orders.find({
        where: {
          status: In(statuses),
          ...(extra.createdById ? { createdById: extra.createdById } : {}),
          ...(extra.signedById ? { signedById: extra.signedById } : {}),
        },
        relations: withParts,
        order: { createdAt: 'ASC' },
        take: 200,
      }),

    /** The newest orders in these statuses (the administrator's cancelling list). */
    newestByStatus: (statuses: readonly OrderStatus[], take: number) =>
      orders.find({
        where: { status: In(statuses) },
        relations: withParts,
        order: { createdAt: 'DESC', id: 'DESC' },
        take,
      }),

    doseChecksFor: (orderId: number, tx?: Transaction) =>
      (managerOf(tx)?.getRepository(DoseCheck) ?? dataSource.getRepository(DoseCheck)).find({
        where: { orderId },
        relations: { pharmacist: true },
        order: { id: 'ASC' },
      }),

    addDoseCheck: (
      tx: Transaction,
      check: Omit<DoseCheck, 'id' | 'createdAt' | 'order' | 'pharmacist'>,
    ) =>
      managerOf(tx)
        .getRepository(DoseCheck)
        .save(managerOf(tx).getRepository(DoseCheck).create(check)),

    preparationFor: (orderId: number, tx?: Transaction) =>
      // The latest counts: a drug past its beyond-use time is made up again.
      (managerOf(tx)?.getRepository(Preparation) ?? dataSource.getRepository(Preparation)).findOne({
        where: { orderId },
        relations: { pharmacist: true },
        order: { id: 'DESC' },
      }),

    /** Every preparation of an order, oldest first (more than one when a drug was made up again). */
    preparationsFor: (orderId: number) =>
      dataSource
        .getRepository(Preparation)
        .find({ where: { orderId }, relations: { pharmacist: true }, order: { id: 'ASC' } }),

    addPreparation: (
      tx: Transaction,
      preparation: Omit<Preparation, 'id' | 'createdAt' | 'order' | 'pharmacist'>,
    ) =>
      managerOf(tx)
        .getRepository(Preparation)
        .save(managerOf(tx).getRepository(Preparation).create(preparation)),

    attachmentsFor: (orderId: number) =>
      // A follow-up visit's reports belong to the visit, not to the signed order.
      dataSource
        .getRepository(Attachment)
        .find({ where: { orderId, followUpVisitId: IsNull() }, order: { id: 'ASC' } }),
  };
}

export type OrderRepository = ReturnType<typeof createOrderRepository>;
