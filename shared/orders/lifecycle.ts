import type { OrderStatus } from '../schemas/orders';

/**
 * What may happen to an order in which status. Every status change the server makes is one of
 * these transitions, checked here first; the screens read the same groups.
 */
export const orderTransitions: Readonly<Record<OrderStatus, readonly OrderStatus[]>> = {
  draft: ['signed', 'ready'],
  signed: ['checked', 'returned', 'superseded'],
  returned: ['superseded'],
  checked: ['prepared', 'superseded'],
  prepared: ['in-session', 'superseded'],
  ready: ['in-session', 'superseded'],
  'in-session': ['completed', 'stopped'],
  completed: ['reviewed'],
  stopped: ['reviewed'],
  // A deviation reopened, or one found by a late tap, takes a reviewed session back.
  reviewed: ['completed', 'stopped'],
  superseded: [],
};

export function canMoveOrder(from: OrderStatus, to: OrderStatus): boolean {
  return orderTransitions[from].includes(to);
}

/** Statuses an amendment may start from: signed, not yet in a session (its signing supersedes them). */
export const amendableStatuses: readonly OrderStatus[] = (Object.keys(orderTransitions) as OrderStatus[]).filter((s) => orderTransitions[s].includes('superseded'));

/** Statuses in which a session is running. */
export const sessionRunningStatuses: readonly OrderStatus[] = ['in-session'];
/** Statuses of an order whose session has ended, reviewed or not. */
export const sessionEndedStatuses: readonly OrderStatus[] = ['completed', 'stopped', 'reviewed'];
/**
 * Statuses that take session events other than the start: a running session, and an ended one,
 * because a tablet's offline queue may deliver taps made before the end after it.
 */
export const sessionEventStatuses: readonly OrderStatus[] = [...sessionRunningStatuses, ...sessionEndedStatuses];

export const isSessionEnded = (status: OrderStatus) => sessionEndedStatuses.includes(status);

/**
 * The status an order should have once its deviations' review stands as given. A running session
 * is never moved by review: closing its last deviation must not end it (its later taps would be
 * refused). An ended session is reviewed when nothing is open, and goes back to its outcome when
 * something is open again (a reopening, or a deviation a late tap brought).
 */
export function statusAfterReview(status: OrderStatus, facts: { sessionOutcome: 'completed' | 'stopped'; openDeviations: number }): OrderStatus {
  if (!isSessionEnded(status)) return status;
  if (facts.openDeviations === 0) return 'reviewed';
  return status === 'reviewed' ? facts.sessionOutcome : status;
}

/**
 * After a late tap on an ended session: a reviewed session that now has an open deviation again
 * goes back to its outcome, so the auditor's queue shows it. Nothing else moves.
 */
export function statusAfterLateEvent(status: OrderStatus, facts: { sessionOutcome: 'completed' | 'stopped'; openDeviations: number }): OrderStatus {
  return status === 'reviewed' && facts.openDeviations > 0 ? facts.sessionOutcome : status;
}
