import { formatUnitTime } from '../../shared/format/figures';
import {
  isSessionEnded,
  lateTapVerdict,
  readyForSessionStatuses,
  sessionEventStatuses,
  statusAfterLateEvent,
} from '../../shared/orders/lifecycle';
import type { OrderStatus } from '../../shared/schemas/orders';
import type { ProtocolVersion as ProtocolDefinition } from '../../shared/protocol/protocol-schema';
import { deriveDoseRecord, withdrawalsApplied } from '../../shared/session/dose-record';
import { findDeviations } from '../../shared/session/deviations';
import {
  isLateEntryType,
  isWithdrawableType,
  type SessionEvent,
  type SessionEventInput,
} from '../../shared/session/session-events';
import {
  drugTimeVerdict,
  exposureMissing,
  uvStartVerdict,
  volumeInfusedRequired,
} from '../../shared/session/session-rules';
import type { AuditRepository } from '../audit/repository';
import type { Clock } from '../clock';
import { isDuplicateKey } from '../db/errors';
import type { Transaction, UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox-repository';
import { moveOrderStatus, type OrderRepository } from '../orders/repository';
import { orderedDefinition } from '../protocols/repository';
import type { Actor } from '../orders/service';
import type { UserRepository } from '../people/repository';
import type { CheckValidity } from '../../shared/session/device-readiness';
import type { DeviceRepository } from '../devices/repository';
import { bedsideRefusal } from './bedside-rules';
import { deviceStartVerdict } from './device-start';
import {
  recordOrderFacts,
  storedDeviationsFrom,
  type SessionRepository,
  type StoredDeviation,
} from './repository';

const stepKindsFor: Partial<Record<SessionEventInput['type'], string[]>> = {
  paused: ['light', 'uv'],
  resumed: ['light', 'uv'],
  'drop-given': ['soak', 'uv', 'swelling'],
  'thickness-measured': ['thickness', 'swelling'],
  'exposure-recorded': ['light'],
  'identity-confirmed': ['light', 'uv'],
  'aftercare-checked': ['aftercare'],
};

/**
 * A refusal by one of the session's safety rules: 422 naming the field and the rule, and an audit
 * row (written after the transaction rolled back, so nothing of the tap is stored).
 */
class SessionRuleRefusal extends AppError {
  constructor(
    readonly rule: string,
    message: string,
    field: { path: string; message: string },
    status = 422,
  ) {
    super(status, rule, message, [field]);
  }
}

/** A tap's time outside its bounds is bad input (400), as any other invalid field. */
const timeRefusal = (rule: string, message: string, field: { path: string; message: string }) =>
  new SessionRuleRefusal(rule, message, field, 400);

/** The clinician who authorised UV below the thickness minimum, checked before the transaction. */
interface Authoriser {
  id: number;
  name: string;
}

type SessionOrder = NonNullable<Awaited<ReturnType<OrderRepository['lockForSession']>>> & {
  definition: ProtocolDefinition;
};

export function createSessionService(deps: {
  unitOfWork: UnitOfWork;
  orders: OrderRepository;
  sessions: SessionRepository;
  users: UserRepository;
  audit: AuditRepository;
  unitTimeZone: string;
  /** The server's clock (tests move it): the record's "now" and every tap's time bounds. */
  clock: Clock;
  /** Gate 5's bounds, from the unit's configuration (TAP_CLOCK_SKEW_S, TAP_OFFLINE_WINDOW_H). */
  tapClockSkewS?: number;
  tapOfflineWindowH?: number;
  /** The device register, for the device rules of a session start (server/sessions/device-start.ts). */
  devices?: DeviceRepository;
  /** How long an output check counts (OUTPUT_CHECK_VALID_H; the unit's day when unset). */
  checkValidity?: CheckValidity;
  /** Checks a person's own password, throttled like a sign-in (server/auth/service.ts); the recovery at start-up needs none. */
  confirmSignature?: (
    userId: number,
    password: string,
    ipAddress: string | undefined,
  ) => Promise<boolean>;
  /** Stores the next version of the treatment's FHIR bundle in the session's transaction (server/fhir). */
  treatmentRecords?: {
    enqueueTreatment(tx: Transaction, orderId: number, reason: string): Promise<void>;
  };
  /** Runs after a session completes (follow-up visits are planned then); a failure there never fails the tap. */
  afterSessionCompleted?: () => Promise<void>;
}) {
  const { unitOfWork, orders, sessions, users, audit } = deps;
  const now = () => deps.clock.now().getTime();
  // Refusals name times as the ward clock shows them, with the zone's short name ("…, 14:05 WET").
  const wardTime = (ms: number) =>
    formatUnitTime(new Date(ms).toISOString(), deps.unitTimeZone, 'sheet');

  /** What the session code needs of an order: its row (locked when in a transaction) and its protocol. */
  async function sessionOrder(tx: Transaction, orderId: number): Promise<SessionOrder> {
    const row = await orders.lockForSession(tx, orderId);
    if (!row) throw AppError.notFound(`There is no order ${orderId}.`);
    return { ...row, definition: await orderedDefinition(tx, row) };
  }

  function checkEventFits(order: SessionOrder, input: SessionEventInput, nowMs: number) {
    const { tapClockSkewS, tapOfflineWindowH } = tapBounds();
    const at = Date.parse(input.clientTime);
    if (at > nowMs + tapClockSkewS * 1000) {
      throw timeRefusal(
        'tap_in_future',
        'The tap is timed in the future; check the tablet clock.',
        {
          path: 'clientTime',
          message: `clientTime must not be ahead of the server clock by more than ${tapClockSkewS} s (TAP_CLOCK_SKEW_S)`,
        },
      );
    }
    if (at < nowMs - tapOfflineWindowH * 3_600_000) {
      throw timeRefusal(
        'tap_too_old',
        `The tap is older than the unit's offline window of ${tapOfflineWindowH} h.`,
        {
          path: 'clientTime',
          message: `clientTime must lie within the last ${tapOfflineWindowH} h (TAP_OFFLINE_WINDOW_H); record what happened as a note to the auditor instead`,
        },
      );
    }

    if ('stepId' in input) {
      const step = order.definition.steps.find((s) => s.id === input.stepId);
      if (!step)
        throw AppError.badRequest(`Protocol ${order.definition.key} has no step ${input.stepId}.`, [
          { path: 'stepId', message: 'stepId must be a step of the order’s protocol version' },
        ]);
      const kinds = stepKindsFor[input.type];
      if (kinds && !kinds.includes(step.kind)) {
        throw AppError.badRequest(
          `A ${input.type} event does not belong to the ${step.kind} step.`,
          [
            {
              path: 'stepId',
              message: `stepId must be a ${kinds.join(' or ')} step for ${input.type}`,
            },
          ],
        );
      }
    }
    if (input.type === 'extravasation' && order.definition.kind !== 'pdt') {
      throw AppError.badRequest('Extravasation belongs to an infusion.', [
        { path: 'type', message: 'extravasation is recorded in PDT sessions only' },
      ]);
    }
    if (input.type === 'session-started') {
      if (order.status === 'in-session')
        throw AppError.conflict(
          'already_started',
          `The session for order ${order.id} has started already.`,
        );
      if (!readyForSessionStatuses.includes(order.status)) {
        throw AppError.conflict(
          'not_ready',
          `Order ${order.id} is ${order.status}; a session starts from a prepared (PDT) or ready (CXL) order.`,
        );
      }
    } else if (!sessionEventStatuses.includes(order.status)) {
      throw AppError.conflict(
        'session_not_started',
        `Order ${order.id} has no session running (it is ${order.status}).`,
      );
    }
  }

  function tapBounds() {
    if (deps.tapClockSkewS === undefined || deps.tapOfflineWindowH === undefined)
      throw new Error(
        'the session service records taps only with tapClockSkewS and tapOfflineWindowH configured',
      );
    return { tapClockSkewS: deps.tapClockSkewS, tapOfflineWindowH: deps.tapOfflineWindowH };
  }

  /**
   * The safety rules that read the session's other taps (as stored under the order's lock, the new
   * one left out): the order of events (gate 4), the tap's time against the session (gate 5), UV
   * below the thickness minimum (gate 6) and what was given (gate 7). A refusal rolls the tap back.
   */
  function checkSessionRules(
    order: SessionOrder,
    input: SessionEventInput,
    stored: readonly SessionEvent[],
    actorId: number,
    authoriser: Authoriser | null,
  ) {
    const at = Date.parse(input.clientTime);
    const { kept } = withdrawalsApplied(stored);
    const definition = order.definition;
    const stepOf = (id: string) => definition.steps.find((step) => step.id === id);
    const stepIdOf = (e: SessionEvent) => ('stepId' in e ? e.stepId : null);

    // Gate 5: a tap's time is bounded by the session it belongs to.
    const started = kept.find((e) => e.type === 'session-started');
    if (input.type !== 'session-started' && started && at < Date.parse(started.clientTime)) {
      throw timeRefusal('tap_before_session', 'The tap is timed before the session started.', {
        path: 'clientTime',
        message: `clientTime must not be before the session started (${started.clientTime})`,
      });
    }
    const stepId = 'stepId' in input ? input.stepId : null;
    // A missed drop or reading entered late falls between taps already stored (bedside rules place it).
    const lateBetween =
      input.lateEntryReason !== undefined &&
      (input.type === 'drop-given' || input.type === 'thickness-measured');
    if (stepId !== null && !lateBetween) {
      const later = kept
        .filter((e) => stepIdOf(e) === stepId && Date.parse(e.clientTime) > at)
        .sort((a, b) => Date.parse(b.clientTime) - Date.parse(a.clientTime))[0];
      if (later) {
        throw timeRefusal(
          'tap_before_previous',
          'The tap is timed before a tap of the same step already stored; the tablet clock went back.',
          {
            path: 'clientTime',
            message: `clientTime must not be before the previous stored tap of step ${stepId} (${later.clientTime})`,
          },
        );
      }
    }
    const end = kept.find((e) => e.type === 'session-completed' || e.type === 'session-stopped');
    const verdict = lateTapVerdict(order.status, {
      tapMs: at,
      endedMs: end ? Date.parse(end.clientTime) : null,
      lateEntry: input.lateEntryReason !== undefined,
      endsOrWithdraws: !isWithdrawableType(input.type),
      lateKind: isLateEntryType(input.type),
    });
    if (!verdict.take)
      throw new SessionRuleRefusal(
        'late_tap',
        `The session for order ${order.id} ended${end ? ` at ${wardTime(Date.parse(end.clientTime))}` : ''}.`,
        { path: verdict.field, message: verdict.why },
      );

    const bedside = bedsideRefusal(definition, input, kept);
    if (bedside)
      throw new SessionRuleRefusal(bedside.rule, bedside.message, bedside.field, bedside.status);

    // Gate 4: the order of events against the preparation.
    const preparation = order.preparation;
    const startsInfusion =
      input.type === 'step-started' && stepOf(input.stepId)?.kind === 'infusion';
    if (preparation && (input.type === 'session-started' || startsInfusion)) {
      const beyondUseMs = Date.parse(preparation.beyondUseAt);
      const what = input.type === 'session-started' ? 'session' : 'infusion';
      const verdict = drugTimeVerdict(what, at, preparation);
      if (!verdict.allowed && verdict.rule === 'beyond_use') {
        throw new SessionRuleRefusal(
          'beyond_use',
          `The drug passed its beyond-use time at ${wardTime(beyondUseMs)}: discard it; a pharmacist makes it up again (Preparation on the order) before the ${what} starts.`,
          {
            path: 'clientTime',
            message: `clientTime must not be after the drug's beyond-use time (${preparation.beyondUseAt}) for a ${what} start`,
          },
        );
      }
      const reconstitutedMs = Date.parse(preparation.reconstitutedAt);
      if (!verdict.allowed && verdict.rule === 'before_reconstitution') {
        throw new SessionRuleRefusal(
          'before_reconstitution',
          `The infusion cannot start before the drug was made up (${wardTime(reconstitutedMs)}); check the tablet clock or the preparation time.`,
          {
            path: 'clientTime',
            message: `clientTime must not be before the reconstitution time (${preparation.reconstitutedAt}) for an infusion start`,
          },
        );
      }
    }

    // Gate 6: UV on a stroma below the minimum needs a clinician's authorisation.
    if (input.type === 'thickness-override') {
      if (!authoriser)
        throw new Error('a thickness override reached the rules without its authoriser');
      if (authoriser.id === actorId || stored.some((e) => e.recordedBy === authoriser.id)) {
        throw new SessionRuleRefusal(
          'authoriser_is_nurse',
          'The override is authorised by a second person: a clinician who is not running this session.',
          {
            path: 'authoriserEmail',
            message:
              'authoriserEmail must name a clinician other than the nurse(s) recording this session',
          },
        );
      }
    }
    const minimumUm = definition.cxl?.minStromalThicknessUm ?? null;
    if (
      input.type === 'step-started' &&
      stepOf(input.stepId)?.kind === 'uv' &&
      minimumUm !== null
    ) {
      const readings = kept.filter(
        (e): e is Extract<SessionEvent, { type: 'thickness-measured' }> =>
          e.type === 'thickness-measured' && Date.parse(e.clientTime) <= at,
      );
      const last = readings.sort((a, b) => Date.parse(a.clientTime) - Date.parse(b.clientTime))[
        readings.length - 1
      ];
      const authorised = kept.some(
        (e) => e.type === 'thickness-override' && e.authorisedById !== undefined,
      );
      if (!uvStartVerdict(minimumUm, last?.thicknessUm ?? null, authorised).allowed) {
        throw new SessionRuleRefusal(
          'uv_below_minimum',
          last
            ? `The last reading, ${last.thicknessUm} µm, is below the ${minimumUm} µm minimum.`
            : `No stromal thickness reading is on record; UV needs at least ${minimumUm} µm.`,
          {
            path: 'thicknessUm',
            message: `a thickness reading of at least ${minimumUm} µm (cxl.minStromalThicknessUm) must precede the UV start, or a clinician must authorise an override with their password`,
          },
        );
      }
    }

    // Gate 7: what was given is recorded.
    const finalVolumeMl = definition.drug?.finalVolumeMl ?? null;
    const infusionStep = definition.steps.find((step) => step.kind === 'infusion');
    const infusionStarted =
      infusionStep !== undefined &&
      kept.some((e) => e.type === 'step-started' && e.stepId === infusionStep.id);
    if (
      definition.kind === 'pdt' &&
      (input.type === 'extravasation' || input.type === 'session-stopped')
    ) {
      const volumeKnown = kept.some(
        (e) => e.type === 'extravasation' && e.volumeInfusedMl !== undefined,
      );
      const required = volumeInfusedRequired(input.type, { infusionStarted, volumeKnown });
      if (input.volumeInfusedMl === undefined && required) {
        throw new SessionRuleRefusal(
          'volume_infused_required',
          'Record the volume infused, as the pump shows it.',
          {
            path: 'volumeInfusedMl',
            message: `volumeInfusedMl is required when ${input.type === 'extravasation' ? 'an extravasation is recorded' : 'a PDT session stops after its infusion started'}: 0 to ${finalVolumeMl} mL`,
          },
        );
      }
      if (
        input.volumeInfusedMl !== undefined &&
        finalVolumeMl !== null &&
        input.volumeInfusedMl > finalVolumeMl
      ) {
        throw new SessionRuleRefusal(
          'volume_infused_above_final',
          `The bag holds ${finalVolumeMl} mL; more cannot have been infused.`,
          {
            path: 'volumeInfusedMl',
            message: `volumeInfusedMl must be from 0 to ${finalVolumeMl} mL (drug.finalVolumeMl, the planned final volume)`,
          },
        );
      }
    }
    if (input.type === 'exposure-recorded') {
      if (!kept.some((e) => e.type === 'step-started' && e.stepId === input.stepId)) {
        throw new SessionRuleRefusal(
          'exposure_before_light',
          'The exposure is entered at the end of the light step; the light has not started.',
          {
            path: 'stepId',
            message: `stepId ${input.stepId} must have started before its exposure is entered`,
          },
        );
      }
    }
    const lightStep =
      definition.kind === 'pdt'
        ? definition.steps.find((step) => step.kind === 'light')
        : undefined;
    const missing =
      lightStep !== undefined &&
      exposureMissing({
        lightStarted: kept.some((e) => e.type === 'step-started' && e.stepId === lightStep.id),
        // The completion itself closes a light step still open; its exposure is due all the same.
        lightRunning: false,
        exposureEntered: kept.some(
          (e) => e.type === 'exposure-recorded' && e.stepId === lightStep.id,
        ),
      });
    if (input.type === 'session-completed' && lightStep && missing) {
      throw new SessionRuleRefusal(
        'exposure_required',
        'Enter the exposure time the laser displays before completing the session.',
        {
          path: 'exposureS',
          message: `exposureS (the laser's displayed exposure, an exposure-recorded event for step ${lightStep.id}) is required before a PDT session with light completes`,
        },
      );
    }
  }

  /** A clinician's authorisation of UV below the minimum: their e-mail and password, checked before the transaction. */
  async function checkAuthoriser(
    input: Extract<SessionEventInput, { type: 'thickness-override' }>,
    ipAddress: string | undefined,
  ): Promise<Authoriser> {
    if (!input.authoriserEmail) {
      throw new SessionRuleRefusal(
        'authoriser_required',
        'UV below the thickness minimum needs a clinician’s authorisation.',
        {
          path: 'authoriserEmail',
          message: 'authoriserEmail is required: the clinician who authorises the override',
        },
      );
    }
    if (!input.authoriserPassword) {
      throw new SessionRuleRefusal(
        'authoriser_required',
        'UV below the thickness minimum needs a clinician’s authorisation.',
        {
          path: 'authoriserPassword',
          message: 'authoriserPassword is required: the authorising clinician’s sign-in password',
        },
      );
    }
    const person = await users.findByEmail(input.authoriserEmail);
    const matches =
      person && deps.confirmSignature
        ? await deps.confirmSignature(person.id, input.authoriserPassword, ipAddress)
        : false;
    if (!person || !matches || !person.active) {
      throw new SessionRuleRefusal(
        'authoriser_refused',
        'The e-mail or password of the authorising clinician is not right.',
        {
          path: 'authoriserPassword',
          message:
            'authoriserPassword must be the sign-in password of the clinician named by authoriserEmail',
        },
      );
    }
    if (!person.roles.includes('clinician')) {
      throw new SessionRuleRefusal(
        'authoriser_not_clinician',
        `${person.displayName} is not a clinician.`,
        {
          path: 'authoriserEmail',
          message: 'authoriserEmail must name a person with the clinician role',
        },
      );
    }
    return { id: person.id, name: person.displayName };
  }

  /**
   * An ended session takes events as long as a tap made before its end can still arrive (12 h),
   * and no longer: then its record and deviations are closed, and the database refuses to change
   * them (migration DatabaseIntegrity). The end is the first end event, as the record reads it.
   * Checked on the events read under the order's lock, so it costs no statement of its own (a
   * join to dose_record under FOR UPDATE gap-locked it, and concurrent first events deadlocked).
   */
  function checkRecordOpen(order: SessionOrder, events: readonly SessionEvent[], nowMs: number) {
    // The database closes the record an hour later still (migration DatabaseIntegrity), for clocks that differ.
    const recordOpenAfterEndMs = 12 * 3_600_000;
    if (!isSessionEnded(order.status)) return;
    const endMs = Math.min(
      ...events
        .filter((e) => e.type === 'session-completed' || e.type === 'session-stopped')
        .map((e) => Date.parse(e.clientTime)),
    );
    if (Number.isFinite(endMs) && nowMs - endMs > recordOpenAfterEndMs) {
      throw AppError.conflict(
        'record_closed',
        `The session for order ${order.id} ended more than 12 hours ago; its dose record is closed and takes no more events.`,
      );
    }
  }

  /**
   * A withdrawal must name a tap of this session that can be withdrawn and is not withdrawn yet.
   * Checked against the events as read under the order's lock, which include this withdrawal, so
   * two withdrawals of one tap sent at once cannot both pass.
   */
  function checkWithdrawal(
    order: SessionOrder,
    input: Extract<SessionEventInput, { type: 'tap-withdrawn' }>,
    events: readonly SessionEvent[],
  ) {
    const refuse = (summary: string, message: string) =>
      AppError.badRequest(summary, [{ path: 'withdrawnKey', message }]);
    const target = events.find((e) => e.idempotencyKey === input.withdrawnKey);
    if (!target)
      throw refuse(
        'There is no such tap in this session.',
        'withdrawnKey must be the key of an event of this session',
      );
    if (target.type === 'tap-withdrawn')
      throw refuse(
        'A withdrawal cannot itself be withdrawn.',
        'withdrawnKey must not name a withdrawal; record the tap again instead',
      );
    if (!isWithdrawableType(target.type)) {
      throw refuse(
        `The ${target.type} tap cannot be withdrawn.`,
        'withdrawnKey must not name session-started, session-completed or session-stopped: those cannot be withdrawn',
      );
    }
    const earlier = events.find(
      (e) =>
        e.type === 'tap-withdrawn' &&
        e.withdrawnKey === input.withdrawnKey &&
        e.idempotencyKey !== input.idempotencyKey,
    );
    if (earlier)
      throw refuse(
        'That tap has been withdrawn already.',
        'withdrawnKey names a tap that is already withdrawn',
      );
    // After the key, so that naming a session's end says why it cannot be withdrawn. A late tap
    // from an offline queue is still a fact; a correction is made only while the session runs.
    if (order.status !== 'in-session') {
      throw AppError.conflict(
        'session_ended',
        `The session for order ${order.id} is ${order.status}; a tap can be withdrawn only while the session runs.`,
      );
    }
  }

  /**
   * Re-derives the record and deviations from every event, inside the caller's transaction.
   * `events` are the order's events as read under its lock; by default they are read here.
   */
  async function recompute(
    tx: Transaction,
    order: SessionOrder,
    read?: { events: SessionEvent[]; deviations: StoredDeviation[] },
  ) {
    const all = read?.events ?? (await sessions.eventsFor(order.id, tx));
    const nowMs = now();
    const record = deriveDoseRecord({
      protocol: order.definition,
      plan: order.plan,
      events: all,
      nowMs,
    });
    const deviations = findDeviations({
      protocol: order.definition,
      plan: order.plan,
      record,
      checklist: order.checklist,
      preparation: order.preparation,
      unitTimeZone: deps.unitTimeZone,
    });
    const { standing } = await sessions.reconcileDeviations(
      tx,
      order.id,
      order.protocolVersionId,
      deviations,
      new Date(nowMs),
      read?.deviations,
    );
    await sessions.saveRecord(tx, order.id, record, {
      protocolVersionId: order.protocolVersionId,
      unitTimeZone: deps.unitTimeZone,
      deviationCount: deviations.length,
      order: recordOrderFacts(order),
    });
    return { record, deviations: standing };
  }

  async function state(orderId: number) {
    const order = await sessions.orderFacts(orderId);
    if (!order) throw AppError.notFound(`There is no order ${orderId}.`);
    const [events, stored, deviations, nurses] = await Promise.all([
      sessions.eventsFor(orderId),
      sessions.recordFor(orderId),
      sessions.deviationsFor(orderId),
      sessions.nursesOf(orderId),
    ]);
    const status = order.status as OrderStatus;
    // While the session runs, the record's running figures run up to now, not to the last tap;
    // the stored record (and the deviations, judged on finished facts only) stay as they are.
    let record = stored?.record ?? null;
    if (record && status === 'in-session') {
      const definition = await unitOfWork((tx) => orderedDefinition(tx, { id: orderId, ...order }));
      record = deriveDoseRecord({
        protocol: definition,
        plan: order.plan as Parameters<typeof deriveDoseRecord>[0]['plan'],
        events,
        nowMs: now(),
      });
    }
    return {
      orderId,
      status,
      events,
      record,
      /** Who ran the session at the bedside, for the record and its printed copy. */
      nurses,
      deviations: deviations
        .filter((d) => !d.withdrawnAt)
        .map((d) => ({
          id: d.id,
          type: d.type,
          severity: d.severity,
          expected: d.expected,
          actual: d.actual,
          unit: d.unit,
          message: d.message,
          detectedAt: d.detectedAt.toISOString(),
        })),
      serverTime: new Date(now()).toISOString(),
    };
  }

  /** The answer to a send whose key is stored already: that event and the session as it stands. */
  async function replayAnswer(orderId: number, idempotencyKey: string) {
    const { events, ...rest } = await state(orderId);
    const event = events.find((e) => e.idempotencyKey === idempotencyKey);
    if (!event)
      throw AppError.conflict(
        'key_reused',
        'This idempotency key belongs to another order’s event.',
      );
    return { ...rest, event, eventCount: events.length, replayed: true };
  }

  /** A tap refused by a safety rule leaves an audit row naming the rule and the field; nothing else of it is stored. */
  async function auditRefusal(
    actor: Actor,
    orderId: number,
    input: SessionEventInput,
    error: unknown,
  ) {
    if (!(error instanceof SessionRuleRefusal)) return;
    await audit.append({
      actorUserId: actor.id,
      action: 'session.tap-refused',
      entityType: 'order',
      entityId: orderId,
      ipAddress: actor.ipAddress,
      details: {
        type: input.type,
        rule: error.rule,
        field: error.fields?.[0]?.path ?? null,
        clientTime: input.clientTime,
        idempotencyKey: input.idempotencyKey,
      },
    });
  }

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
      const auditors =
        input.type === 'session-completed' || input.type === 'session-stopped'
          ? (await users.list()).filter((u) => u.active && u.roles.includes('auditor'))
          : [];
      // A replayed override must not need the password again: its stored row answers.
      const storedAlready =
        input.type === 'thickness-override'
          ? await sessions.findEventByKey(input.idempotencyKey)
          : null;
      let authoriser: Authoriser | null = null;
      try {
        if (input.type === 'thickness-override' && !storedAlready)
          authoriser = await checkAuthoriser(input, actor.ipAddress ?? undefined);
      } catch (error) {
        await auditRefusal(actor, orderId, input, error);
        throw error;
      }
      // A session start names its device; the device rules are read and judged before the
      // transaction (a resend of a stored start is answered as stored, whatever the device is now).
      let deviceRecord = null;
      if (
        input.type === 'session-started' &&
        !(await sessions.findEventByKey(input.idempotencyKey))
      ) {
        if (!deps.devices)
          throw new Error('the session service starts sessions only with the device register');
        const verdict = await deviceStartVerdict(deps.devices, orderId, input, {
          nowMs: now(),
          unitTimeZone: deps.unitTimeZone,
          validity: deps.checkValidity ?? { kind: 'unit-day' },
        });
        if ('refusal' in verdict) {
          const { rule, message, field, status } = verdict.refusal;
          const error = new SessionRuleRefusal(rule, message, field, status);
          await auditRefusal(actor, orderId, input, error);
          throw error;
        }
        deviceRecord = verdict.record;
      }
      // The password is checked, never stored: the event keeps who authorised.
      const payload: Record<string, unknown> = { ...input };
      if (deviceRecord) payload.deviceRecord = deviceRecord;
      if (input.type === 'thickness-override') {
        delete payload.authoriserPassword;
        if (authoriser)
          Object.assign(payload, {
            authorisedById: authoriser.id,
            authorisedByName: authoriser.name,
          });
      }

      let outcome: {
        status: OrderStatus;
        ended: boolean;
        event: SessionEvent;
        events: SessionEvent[];
        result: Awaited<ReturnType<typeof recompute>>;
      };
      let afterCommit: (() => void)[] = [];
      try {
        outcome = await unitOfWork(async (tx) => {
          afterCommit = [];
          // One event at a time per order: the derived record always sees a settled list.
          const order = await sessionOrder(tx, orderId);
          // The key goes in first: a resend (the key is unique) fails here and is answered below
          // as the original was, whatever the session has done since.
          const nowMs = now();
          const inserted = await sessions.insertEvent(
            tx,
            orderId,
            actor.id,
            input,
            payload,
            new Date(nowMs),
          );
          checkEventFits(order, input, nowMs);
          afterCommit.push(await sessions.addNurse(tx, orderId, actor.id));
          let status = order.status;
          if (input.type === 'session-started') status = 'in-session';
          const ends =
            (input.type === 'session-completed' || input.type === 'session-stopped') &&
            order.status === 'in-session';
          if (ends) status = input.type === 'session-completed' ? 'completed' : 'stopped';
          await moveOrderStatus(tx, orderId, order.status, status);
          const read = await sessions.eventsAfterInsert(tx, orderId, order.lastEventId, inserted);
          afterCommit.push(() =>
            ends ? sessions.forgetEvents(orderId) : sessions.rememberEvents(orderId, read),
          );
          const event = read.events.find((e) => e.idempotencyKey === input.idempotencyKey);
          if (!event) throw new Error(`event ${input.idempotencyKey} was stored but not read back`);
          // Refused here, the insert rolls back and `read` is never remembered.
          if (input.type === 'tap-withdrawn') checkWithdrawal(order, input, read.events);
          checkRecordOpen(order, read.events, now());
          checkSessionRules(
            order,
            input,
            read.events.filter((e) => e.idempotencyKey !== input.idempotencyKey),
            actor.id,
            authoriser,
          );
          const result = await recompute(tx, order, {
            events: read.events,
            deviations: storedDeviationsFrom(order.storedDeviationsJson),
          });
          if (status === 'reviewed') {
            const open = await sessions.openDeviationCount(tx, orderId);
            const next = statusAfterLateEvent(status, {
              sessionOutcome: result.record.outcome === 'stopped' ? 'stopped' : 'completed',
              openDeviations: open,
            });
            await moveOrderStatus(tx, orderId, status, next);
            status = next;
          }
          // The hospital's record: version 1 when the session ends, one more for each later
          // change to the record (a late entry or a withdrawn tap), stored with the change itself.
          if (ends) await deps.treatmentRecords?.enqueueTreatment(tx, orderId, 'session-ended');
          else if (isSessionEnded(order.status))
            await deps.treatmentRecords?.enqueueTreatment(
              tx,
              orderId,
              `record-changed:${input.type}`,
            );
          if (ends && result.deviations.length > 0) {
            await enqueueMessage(tx, {
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
          if (stored && stored.orderId !== orderId)
            throw AppError.conflict(
              'key_reused',
              'This idempotency key belongs to another order’s event.',
            );
          if (stored) return replayAnswer(orderId, input.idempotencyKey);
        }
        await auditRefusal(actor, orderId, input, error);
        throw error;
      }
      for (const done of afterCommit) done();
      if (outcome.ended && outcome.status === 'completed' && deps.afterSessionCompleted) {
        // Planning is repeated on every follow-up read, so a failure here loses nothing.
        await deps.afterSessionCompleted().catch((error: unknown) => {
          console.error('Follow-up planning after a session failed:', error);
        });
      }
      if (authoriser) {
        // The authorisation is the clinician's act, in their name.
        await audit.append({
          actorUserId: authoriser.id,
          action: 'session.thickness-override-authorised',
          entityType: 'order',
          entityId: orderId,
          ipAddress: actor.ipAddress,
          details: {
            idempotencyKey: input.idempotencyKey,
            nurseUserId: actor.id,
            reason: 'reason' in input ? input.reason : null,
          },
        });
      }
      if (
        input.type === 'session-started' ||
        outcome.ended ||
        input.type === 'extravasation' ||
        input.type === 'thickness-override' ||
        input.type === 'tap-withdrawn' ||
        input.type === 'exposure-recorded' ||
        input.type === 'session-stopped' ||
        input.type === 'identity-confirmed' ||
        (input.type === 'step-ended' && input.reason !== undefined) ||
        input.lateEntryReason !== undefined
      ) {
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
            ...(input.lateEntryReason !== undefined
              ? { lateEntryReason: input.lateEntryReason }
              : {}),
            ...('volumeInfusedMl' in input && input.volumeInfusedMl !== undefined
              ? { volumeInfusedMl: input.volumeInfusedMl }
              : {}),
            ...(input.type === 'exposure-recorded'
              ? { exposureS: input.exposureS, energyJ: input.energyJ ?? null }
              : {}),
            ...(authoriser ? { authorisedById: authoriser.id } : {}),
            ...(deviceRecord
              ? { deviceId: deviceRecord.deviceId, outputCheckId: deviceRecord.outputCheckId }
              : {}),
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
      for (const { id } of running)
        await unitOfWork(async (tx) => recompute(tx, await sessionOrder(tx, id)));
      return running.length;
    },
  };
}

export type SessionService = ReturnType<typeof createSessionService>;
