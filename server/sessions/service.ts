import type { DataSource, EntityManager } from 'typeorm';
import { readyForSessionStatuses, type OrderStatus } from '../../shared/schemas/orders';
import { deriveDoseRecord } from '../../shared/session/dose-record';
import { findDeviations } from '../../shared/session/deviations';
import type { SessionEventInput } from '../../shared/session/session-events';
import type { AuditRepository } from '../audit/repository';
import type { TreatmentOrder } from '../db/entities/treatment-order';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox';
import type { OrderRepository } from '../orders/repository';
import type { Actor } from '../orders/service';
import type { UserRepository } from '../people/repository';
import { addParticipant, type SessionRepository } from './repository';

/** A tablet clock may run a little ahead of ours; further ahead than this is a mistake. */
const futureSkewMs = 10_000;
/** An offline queue may hold events for a while, but not from another day. */
const oldestEventMs = 12 * 3600_000;

const stepKindsFor: Partial<Record<SessionEventInput['type'], string[]>> = {
  paused: ['light', 'uv'],
  resumed: ['light', 'uv'],
  'drop-given': ['soak', 'uv', 'swelling'],
  'thickness-measured': ['thickness', 'swelling'],
};

const sessionStatuses: OrderStatus[] = ['in-session', 'completed', 'stopped'];

export function createSessionService(deps: {
  dataSource: DataSource;
  orders: OrderRepository;
  sessions: SessionRepository;
  users: UserRepository;
  audit: AuditRepository;
  unitTimeZone: string;
  now?: () => number;
}) {
  const { dataSource, orders, sessions, users, audit } = deps;
  const now = deps.now ?? Date.now;

  async function mustFind(orderId: number): Promise<TreatmentOrder> {
    const order = await orders.findById(orderId);
    if (!order) throw AppError.notFound(`There is no order ${orderId}.`);
    return order;
  }

  function checkEventFits(order: TreatmentOrder, input: SessionEventInput, nowMs: number) {
    const at = Date.parse(input.clientTime);
    if (at > nowMs + futureSkewMs) {
      throw AppError.badRequest('The event is timed in the future; check the tablet clock.', [{ path: 'clientTime', message: 'clientTime must not be ahead of the server clock by more than 10 s' }]);
    }
    if (at < nowMs - oldestEventMs) {
      throw AppError.badRequest('The event is too old to belong to this session.', [{ path: 'clientTime', message: 'clientTime must lie within the last 12 hours' }]);
    }
    if ('stepId' in input) {
      const step = order.protocolVersion.definition.steps.find((s) => s.id === input.stepId);
      if (!step) throw AppError.badRequest(`Protocol ${order.protocolVersion.key} has no step ${input.stepId}.`, [{ path: 'stepId', message: 'stepId must be a step of the order’s protocol version' }]);
      const kinds = stepKindsFor[input.type];
      if (kinds && !kinds.includes(step.kind)) {
        throw AppError.badRequest(`A ${input.type} event does not belong to the ${step.kind} step.`, [{ path: 'stepId', message: `stepId must be a ${kinds.join(' or ')} step for ${input.type}` }]);
      }
    }
    if (input.type === 'extravasation' && order.protocolVersion.kind !== 'pdt') {
      throw AppError.badRequest('Extravasation belongs to an infusion.', [{ path: 'type', message: 'extravasation is recorded in PDT sessions only' }]);
    }
    if (input.type === 'session-started') {
      if (!readyForSessionStatuses.includes(order.status)) {
        throw AppError.conflict('not_ready', `Order ${order.id} is ${order.status}; a session starts from a prepared (PDT) or ready (CXL) order.`);
      }
    } else if (!sessionStatuses.includes(order.status)) {
      throw AppError.conflict('session_not_started', `Order ${order.id} has no session running (it is ${order.status}).`);
    }
  }

  /** Re-derives the record and deviations from every event, inside the caller's transaction. */
  async function recompute(manager: EntityManager, order: TreatmentOrder) {
    const events = await sessions.eventsFor(order.id, manager);
    const record = deriveDoseRecord({ protocol: order.protocolVersion.definition, plan: order.plan, events, nowMs: now() });
    const preparation = await orders.preparationFor(order.id);
    const deviations = findDeviations({
      protocol: order.protocolVersion.definition,
      plan: order.plan,
      record,
      checklist: order.checklist,
      preparation: preparation ? { reconstitutedAt: preparation.reconstitutedAt.toISOString(), beyondUseAt: preparation.beyondUseAt.toISOString() } : null,
    });
    const added = await sessions.reconcileDeviations(manager, order.id, order.protocolVersionId, deviations);
    await sessions.saveRecord(manager, order.id, record, { protocolVersionId: order.protocolVersionId, unitTimeZone: deps.unitTimeZone, deviationCount: deviations.length });
    return { record, deviations, added };
  }

  async function state(orderId: number) {
    const order = await mustFind(orderId);
    const [events, stored, deviations] = await Promise.all([sessions.eventsFor(orderId), sessions.recordFor(orderId), sessions.deviationsFor(orderId)]);
    return {
      orderId,
      status: order.status,
      events,
      record: stored?.record ?? null,
      deviations: deviations.filter((d) => !d.withdrawnAt).map((d) => ({ id: d.id, type: d.type, severity: d.severity, expected: d.expected, actual: d.actual, unit: d.unit, message: d.message, detectedAt: d.detectedAt.toISOString() })),
      serverTime: new Date(now()).toISOString(),
    };
  }

  return {
    state,

    /**
     * Stores one event and brings the record and deviations up to date in the same transaction,
     * so no crash can leave an event without its consequences. A replayed key returns the state
     * as it stands and adds nothing.
     */
    async record(actor: Actor, orderId: number, input: SessionEventInput) {
      const existing = await sessions.findEventByKey(input.idempotencyKey);
      if (existing) {
        if (existing.orderId !== orderId) throw AppError.conflict('key_reused', 'This idempotency key belongs to another order’s event.');
        return { ...(await state(orderId)), replayed: true };
      }
      const order = await mustFind(orderId);
      checkEventFits(order, input, now());

      let ended: 'completed' | 'stopped' | null = null;
      try {
        await dataSource.transaction(async (manager) => {
          // One event at a time per order: the derived record always sees a settled list.
          const locked = await orders.lockById(manager, orderId);
          if (!locked) throw AppError.notFound(`There is no order ${orderId}.`);
          if (input.type === 'session-started' && locked.status === 'in-session') throw AppError.conflict('already_started', `The session for order ${orderId} has started already.`);
          await sessions.insertEvent(manager, orderId, actor.id, input);
          await addParticipant(manager, orderId, actor.id, 'nursed');
          if (input.type === 'session-started') await orders.update(manager, orderId, { status: 'in-session' });
          if ((input.type === 'session-completed' || input.type === 'session-stopped') && locked.status === 'in-session') {
            ended = input.type === 'session-completed' ? 'completed' : 'stopped';
            await orders.update(manager, orderId, { status: ended });
          }
          const { deviations } = await recompute(manager, { ...order, status: locked.status } as TreatmentOrder);
          if (ended && deviations.length > 0) {
            const auditors = (await users.list()).filter((u) => u.active && u.roles.includes('auditor'));
            await enqueueMessage(manager, {
              kind: 'session-deviations',
              recipients: auditors.map((u) => u.email),
              subject: `Luxtempo: session for order ${orderId} ended with ${deviations.length} deviation${deviations.length === 1 ? '' : 's'}`,
              body: [
                `The ${order.protocolVersion.title} session for order ${orderId} (${order.eye} eye) was ${ended}.`,
                '',
                'Deviations from protocol:',
                ...deviations.map((d) => `- [${d.severity}] ${d.message}`),
                '',
                'Open Luxtempo to review them.',
              ].join('\n'),
              related: { type: 'order', id: orderId },
            });
          }
        });
      } catch (error) {
        // Two sends of one key at once: the loser finds the winner's row and answers the same.
        if ((error as { code?: string }).code === 'ER_DUP_ENTRY' || (error as { driverError?: { code?: string } }).driverError?.code === 'ER_DUP_ENTRY') {
          const winner = await sessions.findEventByKey(input.idempotencyKey);
          if (winner && winner.orderId === orderId) return { ...(await state(orderId)), replayed: true };
        }
        throw error;
      }
      if (input.type === 'session-started' || ended || input.type === 'extravasation' || input.type === 'thickness-override') {
        await audit.append({
          actorUserId: actor.id,
          action: `session.${input.type}`,
          entityType: 'order',
          entityId: orderId,
          ipAddress: actor.ipAddress,
          details: { idempotencyKey: input.idempotencyKey, clientTime: input.clientTime, ...('reason' in input ? { reason: input.reason } : {}) },
        });
      }
      return { ...(await state(orderId)), replayed: false };
    },

    /** After a restart: sessions still running get their record and deviations recomputed. */
    async recomputeRunning(): Promise<number> {
      const running = await orders.listByStatus(['in-session']);
      for (const order of running) await dataSource.transaction((manager) => recompute(manager, order));
      return running.length;
    },
  };
}

export type SessionService = ReturnType<typeof createSessionService>;
