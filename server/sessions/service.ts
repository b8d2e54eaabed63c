import type { DataSource, EntityManager } from 'typeorm';
import { readyForSessionStatuses, type OrderStatus } from '../../shared/schemas/orders';
import type { ProtocolVersion as ProtocolDefinition } from '../../shared/protocol/protocol-schema';
import { deriveDoseRecord } from '../../shared/session/dose-record';
import { findDeviations } from '../../shared/session/deviations';
import type { SessionEventInput } from '../../shared/session/session-events';
import type { AuditRepository } from '../audit/repository';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox';
import type { OrderRepository } from '../orders/repository';
import { orderedDefinition } from '../protocols/repository';
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

type SessionOrder = NonNullable<Awaited<ReturnType<OrderRepository['lockForSession']>>> & { definition: ProtocolDefinition };

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

  /** What the session code needs of an order: its row (locked when in a transaction) and its protocol. */
  async function sessionOrder(manager: EntityManager, orderId: number): Promise<SessionOrder> {
    const row = await orders.lockForSession(manager, orderId);
    if (!row) throw AppError.notFound(`There is no order ${orderId}.`);
    return { ...row, definition: await orderedDefinition(manager, row.protocolVersionId) };
  }

  function checkEventFits(order: SessionOrder, input: SessionEventInput, nowMs: number) {
    const at = Date.parse(input.clientTime);
    if (at > nowMs + futureSkewMs) {
      throw AppError.badRequest('The event is timed in the future; check the tablet clock.', [{ path: 'clientTime', message: 'clientTime must not be ahead of the server clock by more than 10 s' }]);
    }
    if (at < nowMs - oldestEventMs) {
      throw AppError.badRequest('The event is too old to belong to this session.', [{ path: 'clientTime', message: 'clientTime must lie within the last 12 hours' }]);
    }
    if ('stepId' in input) {
      const step = order.definition.steps.find((s) => s.id === input.stepId);
      if (!step) throw AppError.badRequest(`Protocol ${order.definition.key} has no step ${input.stepId}.`, [{ path: 'stepId', message: 'stepId must be a step of the order’s protocol version' }]);
      const kinds = stepKindsFor[input.type];
      if (kinds && !kinds.includes(step.kind)) {
        throw AppError.badRequest(`A ${input.type} event does not belong to the ${step.kind} step.`, [{ path: 'stepId', message: `stepId must be a ${kinds.join(' or ')} step for ${input.type}` }]);
      }
    }
    if (input.type === 'extravasation' && order.definition.kind !== 'pdt') {
      throw AppError.badRequest('Extravasation belongs to an infusion.', [{ path: 'type', message: 'extravasation is recorded in PDT sessions only' }]);
    }
    if (input.type === 'session-started') {
      if (order.status === 'in-session') throw AppError.conflict('already_started', `The session for order ${order.id} has started already.`);
      if (!readyForSessionStatuses.includes(order.status)) {
        throw AppError.conflict('not_ready', `Order ${order.id} is ${order.status}; a session starts from a prepared (PDT) or ready (CXL) order.`);
      }
    } else if (!sessionStatuses.includes(order.status)) {
      throw AppError.conflict('session_not_started', `Order ${order.id} has no session running (it is ${order.status}).`);
    }
  }

  /** Re-derives the record and deviations from every event, inside the caller's transaction. */
  async function recompute(manager: EntityManager, order: SessionOrder) {
    const events = await sessions.eventsFor(order.id, manager);
    const record = deriveDoseRecord({ protocol: order.definition, plan: order.plan, events, nowMs: now() });
    const preparation = await sessions.preparationTimes(manager, order.id);
    const deviations = findDeviations({ protocol: order.definition, plan: order.plan, record, checklist: order.checklist, preparation });
    const { standing } = await sessions.reconcileDeviations(manager, order.id, order.protocolVersionId, deviations);
    await sessions.saveRecord(manager, order.id, record, { protocolVersionId: order.protocolVersionId, unitTimeZone: deps.unitTimeZone, deviationCount: deviations.length });
    return { events, record, deviations: standing };
  }

  async function state(orderId: number) {
    const [order] = await dataSource.query('SELECT status FROM treatment_order WHERE id = ?', [orderId]);
    if (!order) throw AppError.notFound(`There is no order ${orderId}.`);
    const [events, stored, deviations] = await Promise.all([sessions.eventsFor(orderId), sessions.recordFor(orderId), sessions.deviationsFor(orderId)]);
    return {
      orderId,
      status: order.status as OrderStatus,
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
      // Read before the transaction: a transaction must never wait for a second pooled connection,
      // or a burst of writes can hold every connection and wait on each other for ever.
      const auditors = input.type === 'session-completed' || input.type === 'session-stopped' ? (await users.list()).filter((u) => u.active && u.roles.includes('auditor')) : [];

      let outcome: { status: OrderStatus; ended: boolean; result: Awaited<ReturnType<typeof recompute>> };
      try {
        outcome = await dataSource.transaction(async (manager) => {
          // One event at a time per order: the derived record always sees a settled list.
          const order = await sessionOrder(manager, orderId);
          checkEventFits(order, input, now());
          await sessions.insertEvent(manager, orderId, actor.id, input);
          await addParticipant(manager, orderId, actor.id, 'nursed');
          let status = order.status;
          if (input.type === 'session-started') status = 'in-session';
          const ends = (input.type === 'session-completed' || input.type === 'session-stopped') && order.status === 'in-session';
          if (ends) status = input.type === 'session-completed' ? 'completed' : 'stopped';
          if (status !== order.status) await orders.update(manager, orderId, { status });
          const result = await recompute(manager, order);
          if (ends && result.deviations.length > 0) {
            await enqueueMessage(manager, {
              kind: 'session-deviations',
              recipients: auditors.map((u) => u.email),
              subject: `Luxtempo: session for order ${orderId} ended with ${result.deviations.length} deviation${result.deviations.length === 1 ? '' : 's'}`,
              body: [
                `The ${order.definition.title} session for order ${orderId} (${order.eye} eye) was ${status}.`,
                '',
                'Deviations from protocol:',
                ...result.deviations.map((d) => `- [${d.severity}] ${d.message}`),
                '',
                'Open Luxtempo to review them.',
              ].join('\n'),
              related: { type: 'order', id: orderId },
            });
          }
          return { status, ended: ends, result };
        });
      } catch (error) {
        // Two sends of one key at once: the loser finds the winner's row and answers the same.
        if ((error as { code?: string }).code === 'ER_DUP_ENTRY' || (error as { driverError?: { code?: string } }).driverError?.code === 'ER_DUP_ENTRY') {
          const winner = await sessions.findEventByKey(input.idempotencyKey);
          if (winner && winner.orderId === orderId) return { ...(await state(orderId)), replayed: true };
        }
        throw error;
      }
      if (input.type === 'session-started' || outcome.ended || input.type === 'extravasation' || input.type === 'thickness-override') {
        await audit.append({
          actorUserId: actor.id,
          action: `session.${input.type}`,
          entityType: 'order',
          entityId: orderId,
          ipAddress: actor.ipAddress,
          details: { idempotencyKey: input.idempotencyKey, clientTime: input.clientTime, ...('reason' in input ? { reason: input.reason } : {}) },
        });
      }
      // The answer comes from what the transaction worked out: no second read.
      return { orderId, status: outcome.status, events: outcome.result.events, record: outcome.result.record, deviations: outcome.result.deviations, serverTime: new Date(now()).toISOString(), replayed: false };
    },

    /** After a restart: sessions still running get their record and deviations recomputed. */
    async recomputeRunning(): Promise<number> {
      const running = await orders.listByStatus(['in-session']);
      for (const { id } of running) await dataSource.transaction(async (manager) => recompute(manager, await sessionOrder(manager, id)));
      return running.length;
    },
  };
}

export type SessionService = ReturnType<typeof createSessionService>;
