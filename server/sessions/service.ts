import type { DataSource, EntityManager } from 'typeorm';
import { isSessionEnded, sessionEventStatuses, statusAfterLateEvent } from '../../shared/orders/lifecycle';
import { readyForSessionStatuses, type OrderStatus } from '../../shared/schemas/orders';
import type { ProtocolVersion as ProtocolDefinition } from '../../shared/protocol/protocol-schema';
import { deriveDoseRecord } from '../../shared/session/dose-record';
import { findDeviations } from '../../shared/session/deviations';
import { isWithdrawableType, type SessionEvent, type SessionEventInput } from '../../shared/session/session-events';
import type { AuditRepository } from '../audit/repository';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox';
import { moveOrderStatus, type OrderRepository } from '../orders/repository';
import { orderedDefinition } from '../protocols/repository';
import type { Actor } from '../orders/service';
import type { UserRepository } from '../people/repository';
import { recordOrderFacts, type SessionRepository } from './repository';

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
    return { ...row, definition: await orderedDefinition(manager, row) };
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
    } else if (!sessionEventStatuses.includes(order.status)) {
      throw AppError.conflict('session_not_started', `Order ${order.id} has no session running (it is ${order.status}).`);
    }
  }

  /**
   * An ended session takes events as long as a tap made before its end can still arrive (12 h),
   * and no longer: then its record and deviations are closed, and the database refuses to change
   * them (migration DatabaseIntegrity). The end is the first end event, as the record reads it.
   * Checked on the events read under the order's lock, so it costs no statement of its own (a
   * join to dose_record under FOR UPDATE gap-locked it, and concurrent first events deadlocked).
   */
  function checkRecordOpen(order: SessionOrder, events: readonly SessionEvent[], nowMs: number) {
    if (!isSessionEnded(order.status)) return;
    const endMs = Math.min(...events.filter((e) => e.type === 'session-completed' || e.type === 'session-stopped').map((e) => Date.parse(e.clientTime)));
    if (Number.isFinite(endMs) && nowMs - endMs > oldestEventMs) {
      throw AppError.conflict('record_closed', `The session for order ${order.id} ended more than 12 hours ago; its dose record is closed and takes no more events.`);
    }
  }

  /**
   * A withdrawal must name a tap of this session that can be withdrawn and is not withdrawn yet.
   * Checked against the events as read under the order's lock, which include this withdrawal, so
   * two withdrawals of one tap sent at once cannot both pass.
   */
  function checkWithdrawal(order: SessionOrder, input: Extract<SessionEventInput, { type: 'tap-withdrawn' }>, events: readonly SessionEvent[]) {
    const refuse = (summary: string, message: string) => AppError.badRequest(summary, [{ path: 'withdrawnKey', message }]);
    const target = events.find((e) => e.idempotencyKey === input.withdrawnKey);
    if (!target) throw refuse('There is no such tap in this session.', 'withdrawnKey must be the key of an event of this session');
    if (target.type === 'tap-withdrawn') throw refuse('A withdrawal cannot itself be withdrawn.', 'withdrawnKey must not name a withdrawal; record the tap again instead');
    if (!isWithdrawableType(target.type)) {
      throw refuse(`The ${target.type} tap cannot be withdrawn.`, 'withdrawnKey must not name session-started, session-completed or session-stopped: those cannot be withdrawn');
    }
    const earlier = events.find((e) => e.type === 'tap-withdrawn' && e.withdrawnKey === input.withdrawnKey && e.idempotencyKey !== input.idempotencyKey);
    if (earlier) throw refuse('That tap has been withdrawn already.', 'withdrawnKey names a tap that is already withdrawn');
    // After the key, so that naming a session's end says why it cannot be withdrawn. A late tap
    // from an offline queue is still a fact; a correction is made only while the session runs.
    if (order.status !== 'in-session') {
      throw AppError.conflict('session_ended', `The session for order ${order.id} is ${order.status}; a tap can be withdrawn only while the session runs.`);
    }
  }

  /**
   * Re-derives the record and deviations from every event, inside the caller's transaction.
   * `events` are the order's events as read under its lock; by default they are read here.
   */
  async function recompute(manager: EntityManager, order: SessionOrder, events?: SessionEvent[]) {
    const all = events ?? (await sessions.eventsFor(order.id, manager));
    const record = deriveDoseRecord({ protocol: order.definition, plan: order.plan, events: all, nowMs: now() });
    const deviations = findDeviations({ protocol: order.definition, plan: order.plan, record, checklist: order.checklist, preparation: order.preparation });
    const { standing } = await sessions.reconcileDeviations(manager, order.id, order.protocolVersionId, deviations);
    await sessions.saveRecord(manager, order.id, record, { protocolVersionId: order.protocolVersionId, unitTimeZone: deps.unitTimeZone, deviationCount: deviations.length, order: recordOrderFacts(order) });
    return { record, deviations: standing };
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

  /** The answer to a send whose key is stored already: that event and the session as it stands. */
  async function replayAnswer(orderId: number, idempotencyKey: string) {
    const { events, ...rest } = await state(orderId);
    const event = events.find((e) => e.idempotencyKey === idempotencyKey);
    if (!event) throw AppError.conflict('key_reused', 'This idempotency key belongs to another order’s event.');
    return { ...rest, event, eventCount: events.length, replayed: true };
  }

  const isDuplicateKey = (error: unknown) =>
    (error as { code?: string }).code === 'ER_DUP_ENTRY' || (error as { driverError?: { code?: string } }).driverError?.code === 'ER_DUP_ENTRY';

  return {
    state,

    /**
     * Stores one event and brings the record and deviations up to date in the same transaction,
     * so no crash can leave an event without its consequences. A replayed key returns the state
     * as it stands and adds nothing.
     */
    async record(actor: Actor, orderId: number, input: SessionEventInput) {
      // Read before the transaction: a transaction must never wait for a second pooled connection,
      // or a burst of writes can hold every connection and wait on each other for ever.
      const auditors = input.type === 'session-completed' || input.type === 'session-stopped' ? (await users.list()).filter((u) => u.active && u.roles.includes('auditor')) : [];

      let outcome: { status: OrderStatus; ended: boolean; event: SessionEvent; events: SessionEvent[]; result: Awaited<ReturnType<typeof recompute>> };
      let afterCommit: (() => void)[] = [];
      try {
        outcome = await dataSource.transaction(async (manager) => {
          afterCommit = [];
          // One event at a time per order: the derived record always sees a settled list.
          const order = await sessionOrder(manager, orderId);
          // The key goes in first: a resend (the key is unique) fails here and is answered below
          // as the original was, whatever the session has done since.
          await sessions.insertEvent(manager, orderId, actor.id, input);
          checkEventFits(order, input, now());
          afterCommit.push(await sessions.addNurse(manager, orderId, actor.id));
          let status = order.status;
          if (input.type === 'session-started') status = 'in-session';
          const ends = (input.type === 'session-completed' || input.type === 'session-stopped') && order.status === 'in-session';
          if (ends) status = input.type === 'session-completed' ? 'completed' : 'stopped';
          await moveOrderStatus(manager, orderId, order.status, status);
          const read = await sessions.eventsUnderLock(manager, orderId);
          afterCommit.push(() => (ends ? sessions.forgetEvents(orderId) : sessions.rememberEvents(orderId, read)));
          const event = read.events.find((e) => e.idempotencyKey === input.idempotencyKey);
          if (!event) throw new Error(`event ${input.idempotencyKey} was stored but not read back`);
          // Refused here, the insert rolls back and `read` is never remembered.
          if (input.type === 'tap-withdrawn') checkWithdrawal(order, input, read.events);
          checkRecordOpen(order, read.events, now());
          const result = await recompute(manager, order, read.events);
          if (status === 'reviewed') {
            const [{ open }] = await manager.query("SELECT COUNT(*) AS open FROM deviation WHERE order_id = ? AND review_status = 'open' AND withdrawn_at IS NULL", [orderId]);
            const next = statusAfterLateEvent(status, { sessionOutcome: result.record.outcome === 'stopped' ? 'stopped' : 'completed', openDeviations: Number(open) });
            await moveOrderStatus(manager, orderId, status, next);
            status = next;
          }
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
          return { status, ended: ends, event, events: read.events, result };
        });
      } catch (error) {
        // A resend, or two sends of one key at once: answer from the stored row.
        if (isDuplicateKey(error)) {
          const stored = await sessions.findEventByKey(input.idempotencyKey);
          if (stored && stored.orderId !== orderId) throw AppError.conflict('key_reused', 'This idempotency key belongs to another order’s event.');
          if (stored) return replayAnswer(orderId, input.idempotencyKey);
        }
        throw error;
      }
      for (const done of afterCommit) done();
      if (input.type === 'session-started' || outcome.ended || input.type === 'extravasation' || input.type === 'thickness-override' || input.type === 'tap-withdrawn') {
        await audit.append({
          actorUserId: actor.id,
          action: `session.${input.type}`,
          entityType: 'order',
          entityId: orderId,
          ipAddress: actor.ipAddress,
          details: {
            idempotencyKey: input.idempotencyKey,
            clientTime: input.clientTime,
            ...('reason' in input ? { reason: input.reason } : {}),
            ...(input.type === 'tap-withdrawn' ? { withdrawnKey: input.withdrawnKey } : {}),
          },
        });
      }
      // The answer is the new event and what follows from it, not the whole list: a tablet has
      // the rest already, and `eventCount` tells it when another tablet added some it lacks.
      return {
        orderId,
        status: outcome.status,
        event: outcome.event,
        eventCount: outcome.events.length,
        record: outcome.result.record,
        deviations: outcome.result.deviations,
        serverTime: new Date(now()).toISOString(),
        replayed: false,
      };
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
