import { describe, expect, it } from 'vitest';
import {
  amendableStatuses,
  awaitsDoseCheck,
  awaitsPreparation,
  canMoveOrder,
  cancellableStatuses,
  doseCheckStatuses,
  hasSessionStarted,
  isSessionEnded,
  isSessionRunning,
  isTreatment,
  openOrderStatuses,
  orderTransitions,
  preparationStatuses,
  readyForSessionStatuses,
  sessionEventStatuses,
  sessionStartedStatuses,
  statusAfterLateEvent,
  statusAfterReview,
  stepClockStatuses,
  treatmentStatuses,
} from '../../shared/orders/lifecycle';
import { orderStatuses } from '../../shared/schemas/orders';

describe('the order lifecycle', () => {
  it('names every status, and every move leads to a known status', () => {
    expect(Object.keys(orderTransitions).sort()).toEqual([...orderStatuses].sort());
    for (const targets of Object.values(orderTransitions))
      for (const to of targets) expect(orderStatuses).toContain(to);
  });

  it('never ends or reviews a session by skipping its run, and a superseded order goes nowhere', () => {
    expect(canMoveOrder('in-session', 'reviewed')).toBe(false);
    expect(canMoveOrder('prepared', 'completed')).toBe(false);
    expect(canMoveOrder('superseded', 'draft')).toBe(false);
    expect(canMoveOrder('in-session', 'completed')).toBe(true);
  });

  it('an amendment starts from a signed order that has not reached its session, never from a draft or a session', () => {
    expect([...amendableStatuses].sort()).toEqual([
      'checked',
      'prepared',
      'ready',
      'returned',
      'signed',
    ]);
  });

  it('review leaves a running session alone, however many deviations are closed', () => {
    expect(
      statusAfterReview('in-session', { sessionOutcome: 'completed', openDeviations: 0 }),
    ).toBe('in-session');
  });

  it('review settles an ended session as reviewed when nothing is open, and a reopening takes it back to its outcome', () => {
    expect(statusAfterReview('stopped', { sessionOutcome: 'stopped', openDeviations: 0 })).toBe(
      'reviewed',
    );
    expect(statusAfterReview('reviewed', { sessionOutcome: 'stopped', openDeviations: 1 })).toBe(
      'stopped',
    );
    expect(statusAfterReview('completed', { sessionOutcome: 'completed', openDeviations: 2 })).toBe(
      'completed',
    );
  });

  it('a late tap moves only a reviewed session with something open again', () => {
    expect(
      statusAfterLateEvent('reviewed', { sessionOutcome: 'completed', openDeviations: 1 }),
    ).toBe('completed');
    expect(
      statusAfterLateEvent('reviewed', { sessionOutcome: 'completed', openDeviations: 0 }),
    ).toBe('reviewed');
    expect(
      statusAfterLateEvent('completed', { sessionOutcome: 'completed', openDeviations: 0 }),
    ).toBe('completed');
  });

  it('only a signed order waits for the dose check, and only a checked one for the preparation', () => {
    expect(doseCheckStatuses).toEqual(['signed']);
    expect(preparationStatuses).toEqual(['checked']);
    expect(orderStatuses.filter(awaitsDoseCheck)).toEqual(['signed']);
    expect(orderStatuses.filter(awaitsPreparation)).toEqual(['checked']);
  });

  it('the session starts from a prepared PDT order or a ready CXL order, and the step clock also opens while it runs', () => {
    expect([...readyForSessionStatuses].sort()).toEqual(['prepared', 'ready']);
    expect([...stepClockStatuses].sort()).toEqual(['in-session', 'prepared', 'ready']);
  });

  it('a session is running only in session; it has started once running or ended, and ended ones take late taps', () => {
    expect(orderStatuses.filter(isSessionRunning)).toEqual(['in-session']);
    expect(orderStatuses.filter(isSessionEnded).sort()).toEqual([
      'completed',
      'reviewed',
      'stopped',
    ]);
    expect(orderStatuses.filter(hasSessionStarted).sort()).toEqual([
      'completed',
      'in-session',
      'reviewed',
      'stopped',
    ]);
    expect([...sessionEventStatuses].sort()).toEqual(
      orderStatuses.filter(hasSessionStarted).sort(),
    );
    expect(orderStatuses.filter((s) => isSessionRunning(s) && isSessionEnded(s))).toEqual([]);
  });

  it('a draft, an order sent back, a replaced revision and a cancelled order are not treatments of the eye; every other status is', () => {
    expect(orderStatuses.filter((s) => !isTreatment(s)).sort()).toEqual([
      'cancelled',
      'draft',
      'returned',
      'superseded',
    ]);
    expect([...treatmentStatuses].sort()).toEqual(orderStatuses.filter(isTreatment).sort());
  });

  it('an order may be cancelled until its session starts, never after, and a cancelled order goes nowhere', () => {
    expect([...cancellableStatuses].sort()).toEqual(
      ['checked', 'draft', 'prepared', 'ready', 'returned', 'signed'].sort(),
    );
    for (const started of sessionStartedStatuses)
      expect(canMoveOrder(started, 'cancelled')).toBe(false);
    expect(orderTransitions.cancelled).toEqual([]);
    // Open orders (for the duplicate-order rule): everything not finished, replaced or cancelled.
    expect([...openOrderStatuses].sort()).toEqual(
      ['checked', 'draft', 'in-session', 'prepared', 'ready', 'returned', 'signed'].sort(),
    );
  });
});
