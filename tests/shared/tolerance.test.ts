import { describe, expect, it } from 'vitest';
import { belowMinimumThickness } from '../../shared/engine/corneal-uv';
import { drugMgInVolume, drugVolumeMlForDose } from '../../shared/engine/drawn-volume';
import { fluenceJPerCm2, pulsedElapsedS, pulsedOnS } from '../../shared/engine/light-arithmetic';
import { exceeds, withinAbs, withinPct } from '../../shared/engine/tolerance';

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

describe('the absolute comparisons', () => {
  it('holds a figure within a tolerance in its own unit, edges included', () => {
    // A 83 s exposure with ± 3 s (PDT light, common practice): 80 and 86 s are in, 79.9 s is out.
    expect(withinAbs(80, 83, 3)).toBe(true);
    expect(withinAbs(86, 83, 3)).toBe(true);
    expect(withinAbs(79.9, 83, 3)).toBe(false);
    expect(withinAbs(86.1, 83, 3)).toBe(false);
  });

  it('says a figure exceeds a limit only past it, not on it or by binary noise', () => {
    // 4 h from reconstitution to infusion end is the limit itself (from memory: verteporfin use within 4 h).
    expect(exceeds(4 * 3600, 4 * 3600)).toBe(false);
    expect(exceeds(0.1 + 0.2, 0.3)).toBe(false);
    expect(exceeds(4 * 3600 + 1, 4 * 3600)).toBe(true);
  });
});

describe('one function per formula that more than one place used to write out', () => {
  it('turns a pulsed cycle’s elapsed time back into on-time, the inverse of its stretch', () => {
    // 1 s on, 1 s off: 30 min of UV on-time take 60 min (definition of a duty cycle).
    const pulse = { onS: 1, offS: 1 };
    expect(pulsedElapsedS(1800, pulse)).toBe(3600);
    expect(pulsedOnS(3600, pulse)).toBe(1800);
    expect(pulsedOnS(pulsedElapsedS(1234, { onS: 1, offS: 2 }), { onS: 1, offS: 2 })).toBeCloseTo(
      1234,
      9,
    );
    expect(pulsedOnS(600, null)).toBe(600);
  });

  it('gives fluence as irradiance × time', () => {
    // 3 mW/cm² for 1800 s = 5.4 J/cm² (Wollensak G et al., Am J Ophthalmol 2003).
    expect(fluenceJPerCm2(3, 1800)).toBeCloseTo(5.4, 12);
  });

  it('converts a dose to a volume and back at a concentration', () => {
    // 6 mg/m² × 1.8 m² = 10.8 mg at 2 mg/mL = 5.4 mL (verteporfin 2 mg/mL after reconstitution, from memory).
    expect(drugVolumeMlForDose(10.8, 2)).toBeCloseTo(5.4, 12);
    expect(drugMgInVolume(5.4, 2)).toBeCloseTo(10.8, 12);
  });

  it('says the stroma is too thin only under the minimum, not at it', () => {
    // 400 µm is the usual minimum stromal thickness for standard UV (Spoerl E et al., Cornea 2007).
    expect(belowMinimumThickness(399, 400)).toBe(true);
    expect(belowMinimumThickness(400, 400)).toBe(false);
  });
});
