/**
 * A prepared dose's state against its beyond-use time, the same on the pharmacist's countdown and
 * on Today's chip: within the last half hour it is "closing" (common practice: warning enough to
 * start the infusion or prepare again), at or after the time it is past and may not be given.
 */
export const beyondUseClosingWindowMs = 30 * 60_000;

export type BeyondUseState = 'usable' | 'closing' | 'past';

export function beyondUseState(remainingMs: number): BeyondUseState {
  if (remainingMs <= 0) return 'past';
  return remainingMs <= beyondUseClosingWindowMs ? 'closing' : 'usable';
}
