import type { OrderStatus } from '../schemas/orders';

/**
 * What may happen to an order in which status. Every status change the server makes is one of
 * these transitions, checked here first; the screens read the same groups.
 */
export const orderTransitions: Readonly<Record<OrderStatus, readonly OrderStatus[]>> = {
  // Any order not yet in a session may be cancelled, with a reason.
  draft: ['signed', 'ready', 'cancelled'],
  signed: ['checked', 'returned', 'superseded', 'cancelled'],
  returned: ['superseded', 'cancelled'],
  checked: ['prepared', 'superseded', 'cancelled'],
  prepared: ['in-session', 'superseded', 'cancelled'],
  ready: ['in-session', 'superseded', 'cancelled'],
  'in-session': ['completed', 'stopped'],
  completed: ['reviewed'],
  stopped: ['reviewed'],
  // A deviation reopened, or one found by a late tap, takes a reviewed session back.
  reviewed: ['completed', 'stopped'],
  superseded: [],
  cancelled: [],
};

export function canMoveOrder(from: OrderStatus, to: OrderStatus): boolean {
  return orderTransitions[from].includes(to);
}

/** Statuses an amendment may start from: signed, not yet in a session (its signing supersedes them). */
export const amendableStatuses: readonly OrderStatus[] = (
  Object.keys(orderTransitions) as OrderStatus[]
).filter((s) => orderTransitions[s].includes('superseded'));

/** Statuses a move to `to` may start from. */
const statusesMovingTo = (to: OrderStatus): readonly OrderStatus[] =>
  (Object.keys(orderTransitions) as OrderStatus[]).filter((s) => orderTransitions[s].includes(to));

/** Statuses that wait for the pharmacist's dose check (a match moves them to checked). */
export const doseCheckStatuses: readonly OrderStatus[] = statusesMovingTo('checked');
/** Statuses that wait for the preparation to be recorded. */
export const preparationStatuses: readonly OrderStatus[] = statusesMovingTo('prepared');
/** Statuses in which the nurse may start the session. */
export const readyForSessionStatuses: readonly OrderStatus[] = statusesMovingTo('in-session');

/** Statuses an order may be cancelled from: any before its session starts. */
export const cancellableStatuses: readonly OrderStatus[] = statusesMovingTo('cancelled');

/** Statuses in which a session is running. */
export const sessionRunningStatuses: readonly OrderStatus[] = ['in-session'];
/** Statuses of an order whose session has ended, reviewed or not. */
export const sessionEndedStatuses: readonly OrderStatus[] = ['completed', 'stopped', 'reviewed'];
/** Statuses of an order whose session has started: it has (or had) a session record. */
export const sessionStartedStatuses: readonly OrderStatus[] = [
  ...sessionRunningStatuses,
  ...sessionEndedStatuses,
];
/**
 * Statuses that take session events other than the start: a running session, and an ended one,
 * because a tablet's offline queue may deliver taps made before the end after it.
 */
export const sessionEventStatuses: readonly OrderStatus[] = sessionStartedStatuses;
/** Statuses in which the step clock opens for the nurse: before the session, and to go back to one that runs. */
export const stepClockStatuses: readonly OrderStatus[] = [
  ...readyForSessionStatuses,
  ...sessionRunningStatuses,
];

/**
 * Statuses that count as a treatment of the eye (the retreatment interval and the patient's
 * history): signed and standing. A draft, an order sent back and a replaced revision do not.
 */
export const treatmentStatuses = [
  'signed',
  'checked',
  'prepared',
  'ready',
  'in-session',
  'completed',
  'stopped',
  'reviewed',
] as const satisfies readonly OrderStatus[];

/**
 * Statuses of an open order: one that may still lead to a treatment or is in one. A second open
 * order for the same patient, eye and kind needs a reason. Finished, replaced and cancelled
 * orders are not open.
 */
export const openOrderStatuses: readonly OrderStatus[] = [
  ...cancellableStatuses,
  ...sessionRunningStatuses,
];

export const awaitsDoseCheck = (status: OrderStatus) => doseCheckStatuses.includes(status);
export const awaitsPreparation = (status: OrderStatus) => preparationStatuses.includes(status);
export const isSessionRunning = (status: OrderStatus) => sessionRunningStatuses.includes(status);
export const isSessionEnded = (status: OrderStatus) => sessionEndedStatuses.includes(status);
export const hasSessionStarted = (status: OrderStatus) => sessionStartedStatuses.includes(status);
export const isTreatment = (status: OrderStatus) =>
  (treatmentStatuses as readonly OrderStatus[]).includes(status);

/**
 * The status an order should have once its deviations' review stands as given. A running session
 * is never moved by review: closing its last deviation must not end it (its later taps would be
 * refused). An ended session is reviewed when nothing is open, and goes back to its outcome when
 * something is open again (a reopening, or a deviation a late tap brought).
 */
export function statusAfterReview(
  status: OrderStatus,
  facts: { sessionOutcome: 'completed' | 'stopped'; openDeviations: number },
): OrderStatus {
  if (!isSessionEnded(status)) return status;
  if (facts.openDeviations === 0) return 'reviewed';
  return status === 'reviewed' ? facts.sessionOutcome : status;
}

/**
 * After a late tap on an ended session: a reviewed session that now has an open deviation again
 * goes back to its outcome, so the auditor's queue shows it. Nothing else moves.
 */
export function statusAfterLateEvent(
  status: OrderStatus,
  facts: { sessionOutcome: 'completed' | 'stopped'; openDeviations: number },
): OrderStatus {
  return status === 'reviewed' && facts.openDeviations > 0 ? facts.sessionOutcome : status;
}

/**
 * A drug past its beyond-use time is discarded and a pharmacist makes it up again. That is allowed
 * while the order waits for its session (prepared) and while a session runs with no infusion
 * started yet (in-session); the order's status does not move, the new preparation replaces the
 * old one for every later check, and the old one stays on record.
 */
export const reprepareStatuses: readonly OrderStatus[] = ['prepared', 'in-session'];

export function canReprepare(
  status: OrderStatus,
  facts: { beyondUsePassed: boolean; infusionStarted: boolean },
): { allowed: true } | { allowed: false; why: string } {
  if (!reprepareStatuses.includes(status))
    return {
      allowed: false,
      why: `a drug is made up again only for a prepared order or a running session (this one is ${status})`,
    };
  if (!facts.beyondUsePassed)
    return { allowed: false, why: 'the drug made up is still within its beyond-use time' };
  if (facts.infusionStarted)
    return { allowed: false, why: 'the infusion has started: the drug made up was given' };
  return { allowed: true };
}

/**
 * What a tap that reaches an ended session is. A tablet's offline queue legitimately delivers taps
 * made before the end after it: a tap timed at or before the stored end is such a queued tap and is
 * taken. A tap timed after the end is taken only as a late entry with its reason, and never one
 * that would start, end or withdraw (those change nothing once the session is over). While the
 * session runs, a late entry is a missed tap entered at its real time, of the kinds that may be
 * (`lateKind`: a step start or end, a drop, a thickness reading).
 */
export type LateTapVerdict =
  { take: true } | { take: false; field: 'lateEntryReason'; why: string };

export function lateTapVerdict(
  status: OrderStatus,
  facts: {
    tapMs: number;
    endedMs: number | null;
    lateEntry: boolean;
    endsOrWithdraws: boolean;
    lateKind?: boolean;
  },
): LateTapVerdict {
  const ended = isSessionEnded(status) && facts.endedMs !== null;
  if (!ended) {
    return facts.lateEntry && !facts.lateKind
      ? {
          take: false,
          field: 'lateEntryReason',
          why: 'lateEntryReason during the session is only for a missed step start or end, drop or thickness reading',
        }
      : { take: true };
  }
  if (facts.tapMs <= facts.endedMs!) return { take: true };
  if (facts.endsOrWithdraws)
    return {
      take: false,
      field: 'lateEntryReason',
      why: 'a late entry cannot start, end or withdraw anything: the session has ended',
    };
  if (!facts.lateEntry)
    return {
      take: false,
      field: 'lateEntryReason',
      why: 'the tap is timed after the session ended: send it as a late entry with lateEntryReason (5 to 500 characters)',
    };
  return { take: true };
}
