import { describe, expect, it } from 'vitest';
import { amendableStatuses, canMoveOrder, orderTransitions, statusAfterLateEvent, statusAfterReview } from '../../shared/orders/lifecycle';
import { orderStatuses } from '../../shared/schemas/orders';

describe('the order lifecycle', () => {
  it('names every status, and every move leads to a known status', () => {
    expect(Object.keys(orderTransitions).sort()).toEqual([...orderStatuses].sort());
    for (const targets of Object.values(orderTransitions)) for (const to of targets) expect(orderStatuses).toContain(to);
  });

  it('never ends or reviews a session by skipping its run, and a superseded order goes nowhere', () => {
    expect(canMoveOrder('in-session', 'reviewed')).toBe(false);
    expect(canMoveOrder('prepared', 'completed')).toBe(false);
    expect(canMoveOrder('superseded', 'draft')).toBe(false);
    expect(canMoveOrder('in-session', 'completed')).toBe(true);
  });

  it('an amendment starts from a signed order that has not reached its session, never from a draft or a session', () => {
    expect([...amendableStatuses].sort()).toEqual(['checked', 'prepared', 'ready', 'returned', 'signed']);
  });

  it('review leaves a running session alone, however many deviations are closed', () => {
    expect(statusAfterReview('in-session', { sessionOutcome: 'completed', openDeviations: 0 })).toBe('in-session');
  });

  it('review settles an ended session as reviewed when nothing is open, and a reopening takes it back to its outcome', () => {
    expect(statusAfterReview('stopped', { sessionOutcome: 'stopped', openDeviations: 0 })).toBe('reviewed');
    expect(statusAfterReview('reviewed', { sessionOutcome: 'stopped', openDeviations: 1 })).toBe('stopped');
    expect(statusAfterReview('completed', { sessionOutcome: 'completed', openDeviations: 2 })).toBe('completed');
  });

  it('a late tap moves only a reviewed session with something open again', () => {
    expect(statusAfterLateEvent('reviewed', { sessionOutcome: 'completed', openDeviations: 1 })).toBe('completed');
    expect(statusAfterLateEvent('reviewed', { sessionOutcome: 'completed', openDeviations: 0 })).toBe('reviewed');
    expect(statusAfterLateEvent('completed', { sessionOutcome: 'completed', openDeviations: 0 })).toBe('completed');
  });
});
