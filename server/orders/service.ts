import { signaturePasswordMatches } from '../auth/signature-password';
import { DateTime } from 'luxon';
import type { DataSource, EntityManager } from 'typeorm';
import { computePlan } from '../../shared/engine/compute-plan';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import { signatureProblems } from '../../shared/orders/readiness';
import type { DosePlan } from '../../shared/schemas/calculation';
import type { AmendOrder, OrderDetail, OrderDraft, OrderListQuery, OrderStatus, OrderSummary } from '../../shared/schemas/orders';
import type { Role } from '../../shared/roles';
import type { AuditRepository } from '../audit/repository';
import type { ProtocolForUse } from '../protocols/repository';
import type { TreatmentOrder } from '../db/entities/treatment-order';
import type { User } from '../db/entities/user';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox';
import type { UserRepository } from '../people/repository';
import type { PatientRepository } from '../patients/repository';
import { treatmentStatuses } from '../patients/service';
import type { ProtocolService } from '../protocols/service';
import { addParticipant } from '../sessions/repository';
import type { OrderRepository } from './repository';

export interface Actor {
  id: number;
  roles: Role[];
  ipAddress?: string | null;
}

const person = (u: User | null | undefined) => (u ? { id: u.id, displayName: u.displayName } : null);

export function toOrderSummary(o: TreatmentOrder): OrderSummary {
  return {
    id: o.id,
    revision: o.revision,
    status: o.status,
    eye: o.eye,
    kind: o.protocolVersion.kind,
    protocol: { key: o.protocolVersion.key, version: o.protocolVersion.version, title: o.protocolVersion.title },
    patient: { id: o.patient.id, recordNumber: o.patient.recordNumber, givenName: o.patient.givenName, familyName: o.patient.familyName },
    createdAt: o.createdAt.toISOString(),
    signedAt: o.signedAt?.toISOString() ?? null,
    beyondUseAt: o.beyondUseAt?.toISOString() ?? null,
    createdBy: person(o.createdBy),
    signedBy: person(o.signedBy),
  };
}

/**
 * The blind check: while an order waits for its dose check, a pharmacist who did not sign it sees
 * the inputs but not the computed figures.
 */
export function planIsWithheldFrom(order: TreatmentOrder, viewer: Actor): boolean {
  return order.status === 'signed' && order.protocolVersion.kind === 'pdt' && viewer.roles.includes('pharmacist') && order.signedById !== viewer.id;
}

export function createOrderService(deps: {
  dataSource: DataSource;
  orders: OrderRepository;
  patients: PatientRepository;
  users: UserRepository;
  protocols: ProtocolService;
  audit: AuditRepository;
  unitTimeZone: string;
}) {
  const { dataSource, orders, patients, users, protocols, audit } = deps;

  function plan(row: ProtocolForUse, inputs: OrderDraft['inputs']): DosePlan {
    try {
      return computePlan(row.definition, inputs);
    } catch (error) {
      if (error instanceof PlanInputError) throw AppError.badRequest(error.message, error.fields);
      throw error;
    }
  }

  async function approvedProtocol(key: string, version?: number): Promise<ProtocolForUse> {
    const row = await protocols.resolveForUse(key, version);
    if (row.status !== 'approved') {
      throw AppError.conflict('protocol_not_approved', `Protocol ${key} version ${row.version} is ${row.status}; orders use approved versions only.`);
    }
    return row;
  }

  /** Days since the last treatment of this kind on this eye, if inside the protocol's minimum interval. */
  async function recentTreatmentDays(
    order: { patientId: number; eye: 'right' | 'left'; id?: number; previousRevisionId?: number | null },
    row: ProtocolForUse,
  ): Promise<number | null> {
    const minDays = row.definition.retreatmentMinDays;
    if (!minDays) return null;
    const since = new Date(Date.now() - minDays * 86_400_000);
    // An amendment replaces its earlier revision; that one is not a previous treatment.
    const excluded = [order.id, order.previousRevisionId].filter((id): id is number => typeof id === 'number');
    const recent = await orders.treatmentsSince(order.patientId, order.eye, row.kind, since, treatmentStatuses, excluded);
    if (recent.length === 0) return null;
    const last = recent.map((o) => (o.signedAt ?? o.createdAt).getTime()).sort((a, b) => b - a)[0]!;
    return Math.floor((Date.now() - last) / 86_400_000);
  }

  async function mustFind(id: number): Promise<TreatmentOrder> {
    const order = await orders.findById(id);
    if (!order) throw AppError.notFound(`There is no order ${id}.`);
    return order;
  }

  async function detail(order: TreatmentOrder, viewer: Actor): Promise<OrderDetail> {
    const withheld = planIsWithheldFrom(order, viewer);
    const [checks, preparation, attachments, next, recentDays] = await Promise.all([
      orders.doseChecksFor(order.id),
      orders.preparationFor(order.id),
      orders.attachmentsFor(order.id),
      orders.nextRevisionOf(order.id),
      order.status === 'draft' ? recentTreatmentDays(order, order.protocolVersion) : Promise.resolve(null),
    ]);
    const warnings = withheld ? [] : [...order.plan.warnings];
    if (recentDays !== null) {
      warnings.push({
        code: 'retreatment-interval',
        field: 'retreatmentReason',
        message: `This eye had the same kind of treatment ${recentDays} days ago; the protocol's minimum interval is ${order.protocolVersion.definition.retreatmentMinDays} days.`,
      });
    }
    return {
      ...toOrderSummary(order),
      inputs: order.inputs,
      checklist: order.checklist,
      softLimitReasons: order.softLimitReasons,
      retreatmentReason: order.retreatmentReason,
      note: order.note,
      plan: withheld ? null : order.plan,
      planWithheld: withheld,
      amendmentReason: order.amendmentReason,
      previousRevisionId: order.previousRevisionId,
      nextRevisionId: next?.id ?? null,
      returnComment: order.returnComment,
      attachments: attachments.map((a) => ({ id: a.id, fileName: a.fileName, mimeType: a.mimeType, sizeBytes: a.sizeBytes, sha256: a.sha256, createdAt: a.createdAt.toISOString() })),
      doseChecks: checks.map((c) => ({
        id: c.id,
        outcome: c.outcome,
        pharmacist: person(c.pharmacist),
        createdAt: c.createdAt.toISOString(),
        entered: { bsaM2: c.bsaM2, doseMg: c.doseMg, drugVolumeMl: c.drugVolumeMl },
        differing: c.differing,
        comment: c.comment,
      })),
      preparation: preparation
        ? {
            vialLot: preparation.vialLot,
            vialExpiry: preparation.vialExpiry,
            reconstitutedAt: preparation.reconstitutedAt.toISOString(),
            volumeDrawnMl: preparation.volumeDrawnMl,
            beyondUseAt: preparation.beyondUseAt.toISOString(),
            pharmacist: person(preparation.pharmacist),
          }
        : null,
      warnings,
    };
  }

  async function writeDraft(actor: Actor, input: OrderDraft, base: Partial<TreatmentOrder>, action: string, manager?: EntityManager) {
    const patient = await patients.findById(input.patientId);
    if (!patient) throw AppError.badRequest(`There is no patient with id ${input.patientId}.`, [{ path: 'patientId', message: 'patientId must name an existing patient' }]);
    const row = await approvedProtocol(input.protocol.key, input.protocol.version);
    const computed = plan(row, input.inputs);
    const save = async (m: EntityManager) => {
      const saved = await orders.save(m, {
        ...base,
        patientId: input.patientId,
        eye: input.eye,
        protocolVersionId: row.id,
        status: 'draft',
        inputs: input.inputs,
        plan: computed,
        engineVersion: computed.engineVersion,
        checklist: input.checklist,
        softLimitReasons: input.softLimitReasons,
        retreatmentReason: input.retreatmentReason ?? null,
        note: input.note ?? null,
        createdById: base.createdById ?? actor.id,
      });
      return saved;
    };
    const saved = await (manager ? save(manager) : dataSource.transaction(save));
    await audit.append({
      actorUserId: actor.id,
      action,
      entityType: 'order',
      entityId: saved.id,
      ipAddress: actor.ipAddress,
      details: { protocol: `${row.key} v${row.version}`, eye: input.eye, patientId: input.patientId, revision: saved.revision },
    });
    return saved.id;
  }

  return {
    detail: async (id: number, viewer: Actor) => detail(await mustFind(id), viewer),

    async createDraft(actor: Actor, input: OrderDraft) {
      const id = await writeDraft(actor, input, { revision: 1 }, 'order.drafted');
      return detail(await mustFind(id), actor);
    },

    async updateDraft(actor: Actor, id: number, input: OrderDraft) {
      const order = await mustFind(id);
      if (order.status !== 'draft') {
        throw AppError.conflict('order_signed', `Order ${id} is ${order.status}: a signed order cannot be edited. Amend it instead; the signed revision stays readable.`);
      }
      await writeDraft(actor, input, { id, revision: order.revision, previousRevisionId: order.previousRevisionId, amendmentReason: order.amendmentReason, createdById: order.createdById }, 'order.draft-edited');
      return detail(await mustFind(id), actor);
    },

    async amend(actor: Actor, id: number, input: AmendOrder) {
      const order = await mustFind(id);
      const amendable: OrderStatus[] = ['signed', 'returned', 'checked', 'prepared', 'ready'];
      if (!amendable.includes(order.status)) {
        throw AppError.conflict('not_amendable', `Order ${id} is ${order.status}; only a signed order that has not reached the session can be amended.`);
      }
      if (await orders.nextRevisionOf(id)) throw AppError.conflict('already_amended', `Order ${id} has an amendment already; work on that revision.`);
      if (input.patientId !== order.patientId) {
        throw AppError.badRequest('An amendment keeps the patient.', [{ path: 'patientId', message: `patientId must stay ${order.patientId}; start a new order for another patient` }]);
      }
      const { amendmentReason, ...draft } = input;
      const newId = await writeDraft(actor, draft, { revision: order.revision + 1, previousRevisionId: id, amendmentReason }, 'order.amended');
      return detail(await mustFind(newId), actor);
    },

    async sign(actor: Actor, id: number, password: string) {
      const user = await users.findById(actor.id);
      if (!user || !(await signaturePasswordMatches(user, password))) {
        await audit.append({ actorUserId: actor.id, action: 'order.signature-refused', entityType: 'order', entityId: id, ipAddress: actor.ipAddress });
        throw AppError.badRequest('The password is not right; the order was not signed.', [{ path: 'password', message: 'password must be your sign-in password' }]);
      }
      const order = await mustFind(id);
      if (order.status !== 'draft') throw AppError.conflict('order_signed', `Order ${id} is ${order.status} and cannot be signed again.`);
      const row = await approvedProtocol(order.protocolVersion.key, order.protocolVersion.version);
      // The server's own figures at the moment of signing are what gets frozen.
      const frozen = plan(row, order.inputs);
      const problems = signatureProblems({
        definition: row.definition,
        plan: frozen,
        checklist: order.checklist,
        softLimitReasons: order.softLimitReasons,
        retreatmentReason: order.retreatmentReason,
        recentTreatmentDays: await recentTreatmentDays(order, row),
      });
      if (problems.length > 0) throw AppError.badRequest(`The order cannot be signed yet: ${problems.map((p) => p.message).join('; ')}`, problems);

      const status: OrderStatus = row.definition.drug ? 'signed' : 'ready';
      // Read before the transaction, which must not wait for a second pooled connection.
      const pharmacists = status === 'signed' ? (await users.list()).filter((u) => u.active && u.roles.includes('pharmacist') && u.id !== actor.id) : [];
      await dataSource.transaction(async (manager) => {
        const locked = await orders.lockById(manager, id);
        if (locked?.status !== 'draft') throw AppError.conflict('order_signed', `Order ${id} was signed meanwhile.`);
        await orders.update(manager, id, { status, plan: frozen, engineVersion: frozen.engineVersion, signedById: actor.id, signedAt: new Date(), signatureMeaning: 'ordered' });
        if (order.previousRevisionId) await orders.update(manager, order.previousRevisionId, { status: 'superseded' });
        await addParticipant(manager, id, actor.id, 'ordered');
        if (status === 'signed') {
          await enqueueMessage(manager, {
            kind: 'order-signed',
            recipients: pharmacists.map((u) => u.email),
            subject: `Luxtempo: order ${id} waits for a dose check`,
            body: [
              `Order ${id} (revision ${order.revision}, ${row.title}, ${order.eye} eye) was signed by ${user.displayName} and waits for an independent dose check.`,
              '',
              'Open Luxtempo and choose Dose checks to do it. Figures are shown in Luxtempo only.',
            ].join('\n'),
            related: { type: 'order', id },
          });
        }
      });
      const overrides = order.checklist.filter((a) => a.answer === 'yes').map((a) => ({ id: a.id, reason: a.overrideReason }));
      await audit.append({
        actorUserId: actor.id,
        action: 'order.signed',
        entityType: 'order',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: { meaning: 'ordered', status, protocol: `${row.key} v${row.version}`, engineVersion: frozen.engineVersion, contraindicationOverrides: overrides, softLimitReasons: order.softLimitReasons, retreatmentReason: order.retreatmentReason },
      });
      return detail(await mustFind(id), actor);
    },

    async list(query: OrderListQuery) {
      const zone = deps.unitTimeZone;
      // Dates in the filter are the unit's calendar days; the database holds UTC.
      const from = query.from ? DateTime.fromISO(query.from, { zone }).startOf('day').toJSDate() : undefined;
      const to = query.to ? DateTime.fromISO(query.to, { zone }).plus({ days: 1 }).startOf('day').toJSDate() : undefined;
      const { rows, total } = await orders.list(query, { from, to });
      return { orders: rows.map(toOrderSummary), total, page: query.page, pageSize: query.pageSize };
    },
  };
}

export type OrderService = ReturnType<typeof createOrderService>;
