import { describe, expect, it } from 'vitest';
import { beyondUseClosingWindowMs, beyondUseState } from '../../shared/orders/beyond-use';

describe("a prepared dose's state against its beyond-use time", () => {
  it('is usable until the last half hour, closing within it, past at and after the time', () => {
    // Half an hour's warning before a reconstituted dose expires (common practice).
    expect(beyondUseClosingWindowMs).toBe(30 * 60_000);
    expect(beyondUseState(30 * 60_000 + 1)).toBe('usable');
    expect(beyondUseState(30 * 60_000)).toBe('closing');
    expect(beyondUseState(1)).toBe('closing');
    expect(beyondUseState(0)).toBe('past');
    expect(beyondUseState(-60_000)).toBe('past');
  });
});
