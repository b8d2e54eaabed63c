import { describe, expect, it } from 'vitest';
import { withinPct } from '../../shared/engine/tolerance';

describe('the percent-tolerance comparison', () => {
  it('takes a figure on the edge of the band and refuses one just past it, on either side', () => {
    // ±2 % of a 5.46 mL plan: 5.3508 to 5.5692 mL (drug volume prepared within ±2 %, common practice).
    expect(withinPct(5.5692, 5.46, 2)).toBe(true);
    expect(withinPct(5.3508, 5.46, 2)).toBe(true);
    expect(withinPct(5.5693, 5.46, 2)).toBe(false);
    expect(withinPct(5.3507, 5.46, 2)).toBe(false);
  });

  it('keeps a figure that floating-point arithmetic puts a hair past the edge', () => {
    // 0.1 + 0.2 is 0.30000000000000004: still within 0 % of 0.3.
    expect(withinPct(0.1 + 0.2, 0.3, 0)).toBe(true);
  });
});
