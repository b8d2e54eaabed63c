import { DateTime } from 'luxon';
import { computePlan } from '../../shared/engine/compute-plan';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import {
  amendableStatuses,
  cancellableStatuses,
  openOrderStatuses,
  treatmentStatuses,
} from '../../shared/orders/lifecycle';
import {
  answeredCautions,
  duplicateOrderProblem,
  otherOpenOrdersSentence,
  signatureProblems,
} from '../../shared/orders/readiness';
import { reasonOfSubstanceProblem } from '../../shared/orders/reason-of-substance';
import { supersededVersionProblem } from '../../shared/orders/superseded-version';
import {
  lastRecordedWeight,
  weightChangeMessage,
  weightChangeNeedingReason,
  type WeightChange,
  type WeightChangeRule,
} from '../../shared/orders/weight-change';
import type { DosePlan } from '../../shared/schemas/calculation';
import type {
  CancellableOrder,
  AmendOrder,
  OpenOrderFact,
  OrderDetail,
  OrderDraft,
  OrderListQuery,
  OrderStatus,
  OrderSummary,
  SigningFacts,
  SigningFactsQuery,
} from '../../shared/schemas/orders';
import type { Role } from '../../shared/roles';
import type { AuditRepository } from '../audit/repository';
import type { Clock } from '../clock';
import type { ReadAudit } from '../audit/service';
import { planFromEngine } from '../calculations/service';
import type { ProtocolForUse } from '../protocols/repository';
import type { TreatmentOrder } from '../db/entities/treatment-order';
import type { User } from '../db/entities/user';
import { isDuplicateKey } from '../db/errors';
import { mayCancelOrder, mayReadOrders } from '../auth/permissions';
import type { Transaction, UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox-repository';
import type { UserRepository } from '../people/repository';
import type { PatientRepository } from '../patients/repository';
import type { ProtocolService } from '../protocols/service';
import { addParticipant } from '../sessions/repository';
import { moveOrderStatus, type OrderRepository } from './repository';

export interface Actor {
  id: number;
  roles: Role[];
  ipAddress?: string | null;
}

const person = (u: User | null | undefined) =>
  u ? { id: u.id, displayName: u.displayName } : null;

export function toOrderSummary(o: TreatmentOrder): OrderSummary {
  return {
    id: o.id,
    revision: o.revision,
    status: o.status,
    eye: o.eye,
    kind: o.protocolVersion.kind,
    protocol: {
      key: o.protocolVersion.key,
      version: o.protocolVersion.version,
      title: o.protocolVersion.title,
    },
    patient: {
      id: o.patient.id,
      recordNumber: o.patient.recordNumber,
      givenName: o.patient.givenName,
      familyName: o.patient.familyName,
    },
    createdAt: o.createdAt.toISOString(),
    signedAt: o.signedAt?.toISOString() ?? null,
    beyondUseAt: o.beyondUseAt?.toISOString() ?? null,
    createdBy: person(o.createdBy),
    signedBy: person(o.signedBy),
  };
}

/**
 * The blind check: while an order waits for its dose check, a pharmacist who may check it (did not
 * draft or sign it) sees the inputs but not the computed figures.
 */
/**
 * An edit, a signature or an amendment names the version of the order it was made from; any
 * other write since (an edit by a colleague, a signature, a status move) makes it stale.
 */
export function assertReadVersion(
  order: Pick<TreatmentOrder, 'id' | 'version'>,
  readVersion: number,
): void {
  if (order.version === readVersion) return;
  throw AppError.conflict(
    'order_changed',
    `Order ${order.id} was changed after you opened it (you have version ${readVersion}; it is now version ${order.version}). Nothing was saved: reload the order, check what changed, then do this again.`,
  );
}

export function planIsWithheldFrom(order: TreatmentOrder, viewer: Actor): boolean {
  const mayCheck =
    viewer.roles.includes('pharmacist') &&
    order.signedById !== viewer.id &&
    order.createdById !== viewer.id;
  return order.status === 'signed' && order.protocolVersion.kind === 'pdt' && mayCheck;
}

export function createOrderService(deps: {
  unitOfWork: UnitOfWork;
  clock: Clock;
  orders: OrderRepository;
  patients: PatientRepository;
  users: UserRepository;
  protocols: ProtocolService;
  audit: AuditRepository;
  reads: ReadAudit;
  unitTimeZone: string;
  weightChangeRule: WeightChangeRule;
  /** The lens register: an order that picks a lens takes its laser-spot factor from it. */
  lenses?: {
    findLens(id: number): Promise<{ id: number; laserSpotFactor: number; active: boolean } | null>;
  };
  /** Checks the signer's own password, throttled like a sign-in (server/auth/service.ts). */
  confirmSignature: (
    userId: number,
    password: string,
    ipAddress: string | undefined,
  ) => Promise<boolean>;
  /** The latest follow-up decision on re-treatment for an eye, named in the retreatment-interval warning. */
  latestRetreatmentDecision?: (
    patientId: number,
    eye: 'right' | 'left',
    kind: 'pdt' | 'cxl',
  ) => Promise<{ decision: string; seenOn: string; visitLabel: string } | null>;
}) {
  const {
    unitOfWork,
    clock,
    orders,
    patients,
    users,
    protocols,
    audit,
    reads,
    weightChangeRule,
    confirmSignature,
  } = deps;

  function plan(row: ProtocolForUse, inputs: OrderDraft['inputs']): DosePlan {
    return planFromEngine(row.definition, inputs);
  }

  /**
   * The plan, or the engine's refusal. A refusal of the drawn-volume rule (path `protocol`) is a
   * safety gate, not a typing slip, so it leaves an audit row naming the rule.
   */
  async function planOrRefuse(
    actor: Actor,
    row: ProtocolForUse,
    inputs: OrderDraft['inputs'],
    orderId: number | null,
  ): Promise<DosePlan> {
    try {
      return plan(row, inputs);
    } catch (error) {
      const gate =
        error instanceof AppError ? error.fields?.find((f) => f.path === 'protocol') : undefined;
      if (gate) {
        await audit.append({
          actorUserId: actor.id,
          action: 'order.plan-refused',
          entityType: 'order',
          entityId: orderId,
          ipAddress: actor.ipAddress,
          details: {
            protocol: `${row.key} v${row.version}`,
            rule: 'drawn-volume',
            problems: [gate],
          },
        });
      }
      throw error;
    }
  }

  async function approvedProtocol(key: string, version?: number): Promise<ProtocolForUse> {
    const row = await protocols.resolveForUse(key, version);
    if (row.status !== 'approved') {
      throw AppError.conflict(
        'protocol_not_approved',
        `Protocol ${key} version ${row.version} is ${row.status}; orders use approved versions only.`,
      );
    }
    return row;
  }

  /** Days since the last treatment of this kind on this eye, if inside the protocol's minimum interval. */
  async function recentTreatmentDays(
    order: {
      patientId: number;
      eye: 'right' | 'left';
      id?: number;
      previousRevisionId?: number | null;
    },
    row: ProtocolForUse,
  ): Promise<number | null> {
    const minDays = row.definition.retreatmentMinDays;
    if (!minDays) return null;
    const since = new Date(clock.now().getTime() - minDays * 86_400_000);
    // An amendment replaces its earlier revision; that one is not a previous treatment.
    const excluded = [order.id, order.previousRevisionId].filter(
      (id): id is number => typeof id === 'number',
    );
    const recent = await orders.treatmentsSince(
      order.patientId,
      order.eye,
      row.kind,
      since,
      treatmentStatuses,
      excluded,
    );
    if (recent.length === 0) return null;
    const last = recent.map((o) => (o.signedAt ?? o.createdAt).getTime()).sort((a, b) => b - a)[0]!;
    return Math.floor((clock.now().getTime() - last) / 86_400_000);
  }

  /** The patient's other open orders of this kind on this eye (not this one, the revision it amends, nor another amendment of that revision). */
  async function openOrdersOf(
    order: {
      patientId: number;
      eye: 'right' | 'left';
      id?: number;
      previousRevisionId?: number | null;
    },
    kind: 'pdt' | 'cxl',
  ): Promise<OpenOrderFact[]> {
    const excluded = [order.id, order.previousRevisionId].filter(
      (id): id is number => typeof id === 'number',
    );
    const rows = (
      await orders.openOrdersFor(order.patientId, order.eye, kind, openOrderStatuses, excluded)
    ).filter(
      // Another amendment of the same revision (two clinicians amending at once) is the same
      // treatment, not a second one: the saving transaction answers it with 409 already_amended.
      (o) => order.previousRevisionId == null || o.previousRevisionId !== order.previousRevisionId,
    );
    return rows.map((o) => ({
      id: o.id,
      revision: o.revision,
      status: o.status,
      protocolTitle: o.protocolVersion.title,
      createdAt: o.createdAt.toISOString(),
    }));
  }

  /** The change from the patient's last recorded weight, when it needs a reason under the unit's rule. */
  async function weightChangeOf(order: {
    id: number;
    patientId: number;
    previousRevisionId: number | null;
    inputs: OrderDraft['inputs'];
  }): Promise<WeightChange | null> {
    if (!order.inputs.weight) return null;
    // An amendment corrects its earlier revision; that one's weight is not a previous measurement.
    const excludeOrderIds = [order.id, order.previousRevisionId].filter(
      (id): id is number => typeof id === 'number',
    );
    const last = lastRecordedWeight(
      await patients.lastMeasurements(order.patientId, {
        limit: 1,
        excludeOrderIds,
        withWeight: true,
      }),
    );
    return weightChangeNeedingReason(
      last,
      order.inputs.weight,
      clock.now().getTime(),
      weightChangeRule,
    );
  }

  async function mustFind(id: number): Promise<TreatmentOrder> {
    const order = await orders.findById(id);
    if (!order) throw AppError.notFound(`There is no order ${id}.`);
    return order;
  }

  async function detail(order: TreatmentOrder, viewer: Actor): Promise<OrderDetail> {
    const withheld = planIsWithheldFrom(order, viewer);
    const [checks, preparation, attachments, next, recentDays, weightChange, openOrders] =
      await Promise.all([
        orders.doseChecksFor(order.id),
        orders.preparationFor(order.id),
        orders.attachmentsFor(order.id),
        orders.nextRevisionOf(order.id),
        order.status === 'draft'
          ? recentTreatmentDays(order, order.protocolVersion)
          : Promise.resolve(null),
        order.status === 'draft' ? weightChangeOf(order) : Promise.resolve(null),
        order.status === 'draft'
          ? openOrdersOf(order, order.protocolVersion.kind)
          : Promise.resolve([]),
      ]);
    const warnings = withheld ? [] : [...order.plan.warnings];
    if (recentDays !== null) {
      const decision = deps.latestRetreatmentDecision
        ? await deps.latestRetreatmentDecision(
            order.patientId,
            order.eye,
            order.protocolVersion.kind,
          )
        : null;
      const followUpWords = decision
        ? ` The follow-up visit (${decision.visitLabel}) on ${decision.seenOn} decided: ${decision.decision}.`
        : ' No follow-up visit has recorded a decision to re-treat.';
      warnings.push({
        code: 'retreatment-interval',
        field: 'retreatmentReason',
        message: `This eye had the same kind of treatment ${recentDays} days ago; the protocol's minimum interval is ${order.protocolVersion.definition.retreatmentMinDays} days.${followUpWords}`,
      });
    }
    if (weightChange !== null)
      warnings.push({
        code: 'weight-change',
        field: 'weightChangeReason',
        message: weightChangeMessage(weightChange),
      });
    if (openOrders.length > 0) {
      const sentence = otherOpenOrdersSentence(openOrders);
      warnings.push({
        code: 'duplicate-order',
        field: 'duplicateOrderReason',
        message: `${sentence.charAt(0).toUpperCase()}${sentence.slice(1)}.`,
      });
    }
    const beforeSigning =
      order.status === 'draft'
        ? signatureProblems({
            definition: order.protocolVersion.definition,
            plan: order.plan,
            checklist: order.checklist,
            softLimitReasons: order.softLimitReasons,
            retreatmentReason: order.retreatmentReason,
            recentTreatmentDays: recentDays,
            weightChange,
            weightChangeReason: order.weightChangeReason,
            swellingAcknowledged: order.swellingAcknowledged,
            openOrders,
            duplicateOrderReason: order.duplicateOrderReason,
          })
        : null;
    const summary = toOrderSummary(order);
    return {
      ...summary,
      version: order.version,
      patient: { ...summary.patient, dateOfBirth: order.patient.dateOfBirth },
      inputs: order.inputs,
      checklist: order.checklist,
      softLimitReasons: order.softLimitReasons,
      retreatmentReason: order.retreatmentReason,
      weightChangeReason: order.weightChangeReason,
      supersededVersionReason: order.supersededVersionReason,
      duplicateOrderReason: order.duplicateOrderReason,
      note: order.note,
      swellingAcknowledged: order.swellingAcknowledged,
      cancellation:
        order.cancelledAt && order.cancelReason
          ? {
              at: order.cancelledAt.toISOString(),
              by: person(order.cancelledBy),
              reason: order.cancelReason,
            }
          : null,
      answeredCautions: answeredCautions(order.protocolVersion.definition, order.checklist),
      plan: withheld ? null : order.plan,
      planWithheld: withheld,
      amendmentReason: order.amendmentReason,
      previousRevisionId: order.previousRevisionId,
      nextRevisionId: next?.id ?? null,
      returnComment: order.returnComment,
      attachments: attachments.map((a) => ({
        id: a.id,
        fileName: a.fileName,
        mimeType: a.mimeType,
        sizeBytes: a.sizeBytes,
        sha256: a.sha256,
        createdAt: a.createdAt.toISOString(),
      })),
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
      beforeSigning,
    };
  }

  /**
   * An order that picks a lens (`inputs.lensId`) takes the lens's laser-spot factor as its
   * `lensMagnification`, so nobody types a factor (or the lens's image magnification) by hand. A
   * factor typed beside the lens must be the lens's own.
   */
  async function withLensFactor(inputs: OrderDraft['inputs']): Promise<OrderDraft['inputs']> {
    if (inputs.lensId === undefined) return inputs;
    const lens = await deps.lenses?.findLens(inputs.lensId);
    if (!lens || !lens.active)
      throw AppError.badRequest(`There is no lens ${inputs.lensId} in use on the register.`, [
        { path: 'inputs.lensId', message: 'inputs.lensId must name a lens in use (Lenses page)' },
      ]);
    if (inputs.lensMagnification !== undefined && inputs.lensMagnification !== lens.laserSpotFactor)
      throw AppError.badRequest('The factor typed is not the chosen lens’s laser-spot factor.', [
        {
          path: 'inputs.lensMagnification',
          message: `inputs.lensMagnification must be left out (or be ${lens.laserSpotFactor}, the lens's laser-spot factor) when a lens is chosen`,
        },
      ]);
    return { ...inputs, lensMagnification: lens.laserSpotFactor };
  }

  /** `guard` runs in the saving transaction first: it locks and re-checks what the save depends on. */
  async function writeDraft(
    actor: Actor,
    input: OrderDraft,
    base: Partial<TreatmentOrder>,
    action: string,
    guard?: (tx: Transaction) => Promise<void>,
  ) {
    input = { ...input, inputs: await withLensFactor(input.inputs) };
    const patient = await patients.findById(input.patientId);
    if (!patient)
      throw AppError.badRequest(`There is no patient with id ${input.patientId}.`, [
        { path: 'patientId', message: 'patientId must name an existing patient' },
      ]);
    const row = await approvedProtocol(input.protocol.key, input.protocol.version);
    const supersededBy = await protocols.supersededBy(row.key, row.version);
    const supersededProblem = supersededVersionProblem(
      { key: row.key, version: row.version, supersededBy },
      input.supersededVersionReason,
    );
    if (supersededProblem)
      throw AppError.badRequest(`The order was not saved: ${supersededProblem}.`, [
        { path: 'supersededVersionReason', message: supersededProblem },
      ]);
    const computed = await planOrRefuse(actor, row, input.inputs, base.id ?? null);
    const duplicateOrderReason = input.duplicateOrderReason?.trim() || null;
    const openOrders = await openOrdersOf(
      {
        patientId: input.patientId,
        eye: input.eye,
        id: base.id,
        previousRevisionId: base.previousRevisionId,
      },
      row.kind,
    );
    const duplicate = duplicateOrderProblem(openOrders, duplicateOrderReason);
    if (duplicate) {
      throw AppError.badRequest(`The order was not saved: ${duplicate.message}`, [duplicate]);
    }
    const save = async (m: Transaction) => {
      await guard?.(m);
      const saved = await orders.save(m, {
        ...base,
        patientId: input.patientId,
        eye: input.eye,
        protocolVersionId: row.id,
        protocolSha256: row.sha256,
        status: 'draft',
        inputs: input.inputs,
        plan: computed,
        engineVersion: computed.engineVersion,
        checklist: input.checklist,
        softLimitReasons: input.softLimitReasons,
        retreatmentReason: input.retreatmentReason ?? null,
        weightChangeReason: input.weightChangeReason ?? null,
        // Kept only while it is needed: a reason for a version that is the newest means nothing.
        supersededVersionReason: supersededBy === null ? null : input.supersededVersionReason!,
        // Kept only while it answers something: a reason for a duplicate that is gone says nothing.
        duplicateOrderReason: openOrders.length > 0 ? duplicateOrderReason : null,
        note: input.note ?? null,
        swellingAcknowledged: input.swellingAcknowledged ?? false,
        createdById: base.createdById ?? actor.id,
      });
      return saved;
    };
    const saved = await unitOfWork(save);
    await audit.append({
      actorUserId: actor.id,
      action,
      entityType: 'order',
      entityId: saved.id,
      ipAddress: actor.ipAddress,
      details: {
        protocol: `${row.key} v${row.version}`,
        eye: input.eye,
        patientId: input.patientId,
        revision: saved.revision,
        ...(openOrders.length > 0
          ? { otherOpenOrders: openOrders.map((o) => o.id), duplicateOrderReason }
          : {}),
      },
    });
    return saved.id;
  }

  return {
    /** Opening an order: audited as a read of health data. */
    async detail(id: number, viewer: Actor) {
      const order = await mustFind(id);
      await reads.note(viewer, {
        action: 'order.viewed',
        entityType: 'order',
        entityId: id,
        details: { patientId: order.patientId, status: order.status },
      });
      return detail(order, viewer);
    },

    async createDraft(actor: Actor, input: OrderDraft) {
      const id = await writeDraft(actor, input, { revision: 1 }, 'order.drafted');
      return detail(await mustFind(id), actor);
    },

    async updateDraft(actor: Actor, id: number, input: OrderDraft, readVersion: number) {
      const order = await mustFind(id);
      const stillDraft = (o: Pick<TreatmentOrder, 'status'>) => {
        if (o.status !== 'draft') {
          throw AppError.conflict(
            'order_signed',
            `Order ${id} is ${o.status}: a signed order cannot be edited. Amend it instead; the signed revision stays readable.`,
          );
        }
      };
      stillDraft(order);
      assertReadVersion(order, readVersion);
      const base = {
        id,
        revision: order.revision,
        previousRevisionId: order.previousRevisionId,
        amendmentReason: order.amendmentReason,
        createdById: order.createdById,
      };
      await writeDraft(actor, input, base, 'order.draft-edited', async (tx) => {
        // Locked until the edit commits: a signature waits for it, then finds a newer version.
        const locked = await orders.lockById(tx, id);
        if (!locked) throw AppError.notFound(`There is no order ${id}.`);
        stillDraft(locked);
        assertReadVersion(locked, readVersion);
      });
      return detail(await mustFind(id), actor);
    },

    async amend(actor: Actor, id: number, input: AmendOrder, readVersion: number) {
      const order = await mustFind(id);
      if (!amendableStatuses.includes(order.status)) {
        throw AppError.conflict(
          'not_amendable',
          `Order ${id} is ${order.status}; only a signed order that has not reached the session can be amended.`,
        );
      }
      const alreadyAmended = () =>
        AppError.conflict(
          'already_amended',
          `Order ${id} has an amendment already; open that revision and work on it.`,
        );
      if (await orders.nextRevisionOf(id)) throw alreadyAmended();
      assertReadVersion(order, readVersion);
      if (input.patientId !== order.patientId) {
        throw AppError.badRequest('An amendment keeps the patient.', [
          {
            path: 'patientId',
            message: `patientId must stay ${order.patientId}; start a new order for another patient`,
          },
        ]);
      }
      const { amendmentReason, ...draft } = input;
      const newId = await writeDraft(
        actor,
        draft,
        { revision: order.revision + 1, previousRevisionId: id, amendmentReason },
        'order.amended',
        async (tx) => {
          // Two amendments of one revision queue here; the second finds the first (and the unique
          // key on the previous revision stops it even if it did not).
          const locked = await orders.lockById(tx, id);
          if (!locked) throw AppError.notFound(`There is no order ${id}.`);
          assertReadVersion(locked, readVersion);
          if (await orders.nextRevisionOf(id, tx)) throw alreadyAmended();
        },
      ).catch((error: unknown) => {
        throw isDuplicateKey(error) ? alreadyAmended() : error;
      });
      return detail(await mustFind(newId), actor);
    },

    async sign(actor: Actor, id: number, password: string, readVersion: number) {
      const user = await users.findById(actor.id);
      if (!user || !(await confirmSignature(actor.id, password, actor.ipAddress ?? undefined))) {
        await audit.append({
          actorUserId: actor.id,
          action: 'order.signature-refused',
          entityType: 'order',
          entityId: id,
          ipAddress: actor.ipAddress,
        });
        throw AppError.badRequest('The password is not right; the order was not signed.', [
          { path: 'password', message: 'password must be your sign-in password' },
        ]);
      }
      const order = await mustFind(id);
      if (order.status !== 'draft')
        throw AppError.conflict(
          'order_signed',
          `Order ${id} is ${order.status} and cannot be signed again.`,
        );
      // The signer signs what they read, and the plan is frozen from exactly that version.
      assertReadVersion(order, readVersion);
      const row = await approvedProtocol(order.protocolVersion.key, order.protocolVersion.version);
      // The server's own figures at the moment of signing are what gets frozen.
      const frozen = await planOrRefuse(actor, row, order.inputs, id);
      const problems = signatureProblems({
        definition: row.definition,
        plan: frozen,
        checklist: order.checklist,
        softLimitReasons: order.softLimitReasons,
        retreatmentReason: order.retreatmentReason,
        recentTreatmentDays: await recentTreatmentDays(order, row),
        weightChange: await weightChangeOf(order),
        weightChangeReason: order.weightChangeReason,
        swellingAcknowledged: order.swellingAcknowledged,
        openOrders: await openOrdersOf(order, row.kind),
        duplicateOrderReason: order.duplicateOrderReason,
      });
      // A newer version approved since the draft was saved needs its reason before signing too.
      const supersededProblem = supersededVersionProblem(
        {
          key: row.key,
          version: row.version,
          supersededBy: await protocols.supersededBy(row.key, row.version),
        },
        order.supersededVersionReason,
      );
      if (supersededProblem)
        problems.push({ path: 'supersededVersionReason', message: supersededProblem });
      if (problems.length > 0) {
        await audit.append({
          actorUserId: actor.id,
          action: 'order.signature-refused',
          entityType: 'order',
          entityId: id,
          ipAddress: actor.ipAddress,
          details: {
            protocol: `${row.key} v${row.version}`,
            problems: problems.map((p) => ({ path: p.path, message: p.message })),
          },
        });
        throw AppError.badRequest(
          `The order cannot be signed yet: ${problems.map((p) => p.message).join('; ')}`,
          problems,
        );
      }

      const status: OrderStatus = row.definition.drug ? 'signed' : 'ready';
      // Read before the transaction, which must not wait for a second pooled connection.
      const pharmacists =
        status === 'signed'
          ? (await users.list()).filter(
              (u) => u.active && u.roles.includes('pharmacist') && u.id !== actor.id,
            )
          : [];
      await unitOfWork(async (tx) => {
        const locked = await orders.lockById(tx, id);
        if (locked?.status !== 'draft')
          throw AppError.conflict('order_signed', `Order ${id} was signed meanwhile.`);
        assertReadVersion(locked, readVersion);
        const signedAt = clock.now();
        await moveOrderStatus(tx, id, 'draft', status, {
          plan: frozen,
          engineVersion: frozen.engineVersion,
          protocolSha256: row.sha256,
          signedById: actor.id,
          signedAt,
          signatureMeaning: 'ordered',
        });
        // The patient's measurement history: what was signed, when.
        await patients.recordMeasurement(
          tx,
          { patientId: order.patientId, orderId: id, measuredAt: signedAt },
          order.inputs,
        );
        if (order.previousRevisionId) {
          const previous = await orders.lockById(tx, order.previousRevisionId);
          if (previous) await moveOrderStatus(tx, previous.id, previous.status, 'superseded');
        }
        await addParticipant(tx, id, actor.id, 'ordered');
        if (status === 'signed') {
          await enqueueMessage(tx, {
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
      const overrides = order.checklist
        .filter((a) => a.answer === 'yes')
        .map((a) => ({ id: a.id, reason: a.overrideReason }));
      await audit.append({
        actorUserId: actor.id,
        action: 'order.signed',
        entityType: 'order',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: {
          meaning: 'ordered',
          status,
          protocol: `${row.key} v${row.version}`,
          engineVersion: frozen.engineVersion,
          contraindicationOverrides: overrides,
          swellingAcknowledged: order.swellingAcknowledged,
          softLimitReasons: order.softLimitReasons,
          retreatmentReason: order.retreatmentReason,
          weightChangeReason: order.weightChangeReason,
          supersededVersionReason: order.supersededVersionReason,
          duplicateOrderReason: order.duplicateOrderReason,
        },
      });
      return detail(await mustFind(id), actor);
    },

    /**
     * Cancels an order that has not reached its session: by its signer (or, unsigned, its
     * author) or an administrator, with a reason of substance. It leaves every worklist, because
     * no worklist reads the cancelled status.
     */
    async cancel(actor: Actor, id: number, reason: string, readVersion: number) {
      const order = await mustFind(id);
      if (!mayCancelOrder(actor, order)) {
        throw AppError.forbidden(
          order.signedById === null
            ? `Only the clinician who drafted order ${id}, or an administrator, may cancel it.`
            : `Only the clinician who signed order ${id}, or an administrator, may cancel it.`,
        );
      }
      const notCancellable = (status: OrderStatus) =>
        AppError.conflict(
          'not_cancellable',
          status === 'cancelled'
            ? `Order ${id} is cancelled already.`
            : `Order ${id} cannot be cancelled: its session has started (it is ${status}). Stop the session on the step clock instead; its record stays.`,
        );
      if (!cancellableStatuses.includes(order.status)) throw notCancellable(order.status);
      assertReadVersion(order, readVersion);
      const weak = reasonOfSubstanceProblem(reason, undefined, 'why the order is cancelled');
      if (weak)
        throw AppError.badRequest(`The order was not cancelled: ${weak}.`, [
          { path: 'reason', message: weak },
        ]);
      const cancelledAt = clock.now();
      await unitOfWork(async (tx) => {
        // Locked: a session start or a dose check waits, then finds the order cancelled.
        const locked = await orders.lockById(tx, id);
        if (!locked) throw AppError.notFound(`There is no order ${id}.`);
        if (!cancellableStatuses.includes(locked.status)) throw notCancellable(locked.status);
        assertReadVersion(locked, readVersion);
        await moveOrderStatus(tx, id, locked.status, 'cancelled', {
          cancelledAt,
          cancelledById: actor.id,
          cancelReason: reason.trim(),
        });
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'order.cancelled',
        entityType: 'order',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: { from: order.status, reason: reason.trim(), patientId: order.patientId },
      });
      const cancelled = await mustFind(id);
      // An administrator may cancel but not read orders: the answer stays as narrow as the list.
      if (!mayReadOrders(actor.roles))
        return { id, status: 'cancelled' as const, version: cancelled.version };
      return detail(cancelled, actor);
    },

    /**
     * The orders that may still be cancelled, newest first, with only what identifies each (for
     * the administrator's cancelling screen: no inputs, figures or answers).
     */
    async listCancellable(): Promise<{ orders: CancellableOrder[] }> {
      const rows = await orders.newestByStatus(cancellableStatuses, 200);
      return {
        orders: rows.map((o) => ({
          id: o.id,
          version: o.version,
          eye: o.eye,
          kind: o.protocolVersion.kind,
          patient: {
            recordNumber: o.patient.recordNumber,
            givenName: o.patient.givenName,
            familyName: o.patient.familyName,
          },
          createdAt: o.createdAt.toISOString(),
          signedAt: o.signedAt?.toISOString() ?? null,
          createdBy: person(o.createdBy),
          signedBy: person(o.signedBy),
        })),
      };
    },

    /**
     * What the engine says of a request the schema refused, so one answer names every bad input
     * of the form: the inputs zod refused are left out, the rest are checked against the
     * protocol's limits. Empty when the protocol cannot be told.
     */
    async engineProblemsOf(body: unknown, refusedPaths: readonly string[]) {
      const raw = (body && typeof body === 'object' ? body : {}) as {
        protocol?: { key?: unknown; version?: unknown };
        inputs?: unknown;
      };
      const key = raw.protocol?.key;
      const version = raw.protocol?.version;
      if (typeof key !== 'string' || !/^[a-z0-9-]{1,64}$/.test(key)) return [];
      if (version !== undefined && (typeof version !== 'number' || !Number.isInteger(version)))
        return [];
      if (!raw.inputs || typeof raw.inputs !== 'object') return [];
      const inputs: Record<string, unknown> = { ...(raw.inputs as Record<string, unknown>) };
      for (const path of refusedPaths) {
        const [head, field] = path.split('.');
        if (head === 'inputs' && field) delete inputs[field];
      }
      const row = await protocols.resolveForUse(key, version).catch(() => null);
      if (!row) return [];
      try {
        computePlan(row.definition, inputs as OrderDraft['inputs']);
        return [];
      } catch (error) {
        if (!(error instanceof PlanInputError)) return [];
        // A field zod refused is named once, by zod, not again as "required" by the engine.
        const covered = (p: string) =>
          refusedPaths.some((r) => r === p || r.startsWith(`${p}.`) || p.startsWith(`${r}.`));
        return error.fields.filter((f) => !covered(f.path));
      }
    },

    /** What a signature of an order for this patient, eye and protocol would be held to beyond the form. */
    async signingFacts(query: SigningFactsQuery): Promise<SigningFacts> {
      const row = await protocols.resolveForUse(query.protocol, query.version);
      const current = query.orderId ? await orders.findById(query.orderId) : null;
      const order = {
        patientId: query.patientId,
        eye: query.eye,
        id: current?.id,
        previousRevisionId: current?.previousRevisionId ?? null,
      };
      const [recentTreatmentDaysFound, openOrders] = await Promise.all([
        recentTreatmentDays(order, row),
        openOrdersOf(order, row.kind),
      ]);
      return { recentTreatmentDays: recentTreatmentDaysFound, openOrders };
    },

    async list(query: OrderListQuery) {
      const zone = deps.unitTimeZone;
      // Dates in the filter are the unit's calendar days; the database holds UTC.
      const from = query.from
        ? DateTime.fromISO(query.from, { zone }).startOf('day').toJSDate()
        : undefined;
      const to = query.to
        ? DateTime.fromISO(query.to, { zone }).plus({ days: 1 }).startOf('day').toJSDate()
        : undefined;
      const { rows, total } = await orders.list(query, { from, to });
      return {
        orders: rows.map(toOrderSummary),
        total,
        page: query.page,
        pageSize: query.pageSize,
      };
    },
  };
}

export type OrderService = ReturnType<typeof createOrderService>;
