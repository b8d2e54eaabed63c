import { describe, expect, it } from 'vitest';
import { bodyMassIndexKgPerM2 } from '../../shared/engine/body-mass-index';
import { computePlan } from '../../shared/engine/compute-plan';
import { formatMeasureWithConversion } from '../../shared/engine/units';
import { signatureProblems } from '../../shared/orders/readiness';
import {
  weightChangeMessage,
  weightChangeNeedingReason,
  type RecordedWeight,
} from '../../shared/orders/weight-change';
import type { PlanInputs } from '../../shared/schemas/calculation';
import { copyOf, loadProtocol } from './support/shipped-protocols';

const withRange = loadProtocol('pdt-standard', 2);
const withoutRange = loadProtocol('pdt-standard', 1);
const cxlWithRange = loadProtocol('cxl-standard', 2);

/** The slip as met: 183 cm, and a 92 kg man's weight typed with the unit left on lb. */
const slip: PlanInputs = {
  height: { value: 183, unit: 'cm' },
  weight: { value: 92, unit: 'lb' },
  lesionGldUm: 2000,
  lensMagnification: 1,
};
const meant: PlanInputs = { ...slip, weight: { value: 92, unit: 'kg' } };

const bmiWarning = (inputs: PlanInputs, protocol = withRange) =>
  computePlan(protocol, inputs).warnings.find((w) => w.field === 'bmiKgPerM2');

describe('body-mass index', () => {
  it('is weight in kg over the square of the height in metres', () => {
    // Common practice (the World Health Organization's definition): 70 kg / 1.70² m² = 24.22 kg/m².
    expect(bodyMassIndexKgPerM2(170, 70)).toBeCloseTo(24.2215, 4);
    // Common practice / WHO: 92 kg / 1.83² m² = 27.47 kg/m².
    expect(bodyMassIndexKgPerM2(183, 92)).toBeCloseTo(27.4717, 4);
  });

  it('is worked out once, into the plan and its working, with its source', () => {
    const plan = computePlan(withRange, meant);
    expect(plan.bmiKgPerM2).toBeCloseTo(27.4717, 4); // common practice / WHO
    const line = plan.working.find((l) => l.name === 'bmiKgPerM2');
    expect(line).toMatchObject({ unit: 'kg/m²', formula: 'weightKg ÷ (heightCm ÷ 100)²' });
    expect(line?.source).toMatch(/common practice/);
    expect(line?.source).toMatch(/World Health Organization/);
    expect(line?.inputs).toEqual({
      heightCm: { value: 183, unit: 'cm' },
      weightKg: { value: 92, unit: 'kg' },
    });
    expect(bmiWarning(meant)).toBeUndefined();
  });

  it('warns, naming the BMI and the weight in both units, when a weight in kg was typed with lb', () => {
    // 92 lb = 41.73 kg (1 lb = 0.45359237 kg, international definition); 41.73 / 1.83² = 12.46 kg/m²
    // (common practice / WHO), below the demo soft limit of 16 kg/m² (common practice).
    const plan = computePlan(withRange, slip);
    expect(plan.bmiKgPerM2).toBeCloseTo(12.461, 3);
    const warning = bmiWarning(slip);
    expect(warning).toMatchObject({ code: 'soft-limit', field: 'bmiKgPerM2' });
    expect(warning?.message).toContain('body-mass index 12.5 kg/m²');
    expect(warning?.message).toContain('16 to 45 kg/m²');
    expect(warning?.message).toContain('weight 92 lb (41.7 kg)');
    expect(warning?.message).toContain('height 183 cm (72 in)');
    // What the slip costs if it passes: Mosteller (N Engl J Med 1987) 1.46 m² → 8.76 mg at 6 mg/m²
    // (TAP Study Group, Arch Ophthalmol 1999) instead of 2.16 m² → 12.96 mg.
    expect(plan.bsaM2).toBe(1.46);
    expect(plan.doseMg).toBe(8.76);
    expect(computePlan(withRange, meant).doseMg).toBe(12.96);
  });

  it('warns above the usual range too, and not on its edges', () => {
    // 45 kg/m² at 170 cm is 130.05 kg; 16 kg/m² at 170 cm is 46.24 kg (common practice demo limits).
    expect(
      bmiWarning({
        ...meant,
        height: { value: 170, unit: 'cm' },
        weight: { value: 130.05, unit: 'kg' },
      }),
    ).toBeUndefined();
    expect(
      bmiWarning({
        ...meant,
        height: { value: 170, unit: 'cm' },
        weight: { value: 46.24, unit: 'kg' },
      }),
    ).toBeUndefined();
    expect(
      bmiWarning({
        ...meant,
        height: { value: 170, unit: 'cm' },
        weight: { value: 131, unit: 'kg' },
      })?.message,
    ).toContain('45.3 kg/m²');
    expect(
      bmiWarning({
        ...meant,
        height: { value: 170, unit: 'cm' },
        weight: { value: 46, unit: 'kg' },
      })?.message,
    ).toContain('15.9 kg/m²');
  });

  it('follows the protocol version’s own range', () => {
    const narrow = copyOf(withRange);
    narrow.inputLimits.bmiKgPerM2 = { soft: { min: 18.5, max: 30 } };
    expect(bmiWarning(meant, narrow)).toBeUndefined(); // 27.5 inside 18.5–30
    expect(bmiWarning({ ...meant, weight: { value: 105, unit: 'kg' } }, narrow)?.message).toContain(
      '18.5 to 30 kg/m² (protocol pdt-standard v2)',
    );
  });

  it('falls back to the default range, saying so, for a version approved before the field', () => {
    expect(withoutRange.inputLimits.bmiKgPerM2).toBeUndefined();
    const warning = bmiWarning(slip, withoutRange);
    expect(warning?.message).toContain(
      '16 to 45 kg/m² (the default range, as protocol pdt-standard v1 has none of its own)',
    );
  });

  it('is worked out for cross-linking when height and weight are given, and not otherwise', () => {
    const plan = computePlan(cxlWithRange, {
      stromalThicknessUm: 450,
      height: { value: 183, unit: 'cm' },
      weight: { value: 92, unit: 'lb' },
    });
    expect(plan.warnings.find((w) => w.field === 'bmiKgPerM2')).toBeDefined();
    expect(computePlan(cxlWithRange, { stromalThicknessUm: 450 }).bmiKgPerM2).toBeNull();
  });

  it('stops the signature until a reason is given', () => {
    const plan = computePlan(withRange, slip);
    const base = {
      definition: withRange,
      plan,
      checklist: withRange.contraindications.map((c) => ({ id: c.id, answer: 'no' as const })),
      retreatmentReason: null,
      recentTreatmentDays: null,
      weightChange: null,
      weightChangeReason: null,
      swellingAcknowledged: false,
      openOrders: [],
      duplicateOrderReason: null,
    };
    expect(signatureProblems({ ...base, softLimitReasons: {} }).map((p) => p.path)).toEqual([
      'softLimitReasons.bmiKgPerM2',
    ]);
    expect(
      signatureProblems({
        ...base,
        softLimitReasons: { bmiKgPerM2: 'Weighed again: 41.7 kg is right, patient is very thin.' },
      }),
    ).toEqual([]);
  });
});

describe('a measure shown in both units', () => {
  it('puts the other system’s value, rounded to 0.1, in brackets', () => {
    // 1 lb = 0.45359237 kg and 1 in = 2.54 cm (international definitions, through mathjs).
    expect(formatMeasureWithConversion({ value: 92, unit: 'lb' })).toBe('92 lb (41.7 kg)');
    expect(formatMeasureWithConversion({ value: 92, unit: 'kg' })).toBe('92 kg (202.8 lb)');
    expect(formatMeasureWithConversion({ value: 72, unit: 'in' })).toBe('72 in (182.9 cm)');
    expect(formatMeasureWithConversion({ value: 183, unit: 'cm' })).toBe('183 cm (72 in)');
    expect(formatMeasureWithConversion({ value: 1.83, unit: 'm' })).toBe('1.83 m (72 in)');
  });
});

describe('a weight far from the last one recorded', () => {
  const rule = { maxPct: 10, withinDays: 90 }; // demo defaults, common practice
  const now = Date.parse('2026-12-03T10:00:00Z');
  const last = (kg: number, daysAgo: number): RecordedWeight => ({
    weight: { value: kg, unit: 'kg' },
    weightKg: kg,
    measuredAt: new Date(now - daysAgo * 86_400_000).toISOString(),
  });

  it('needs a reason when it differs by more than 10 % within 90 days', () => {
    const change = weightChangeNeedingReason(last(92, 5), { value: 92, unit: 'lb' }, now, rule);
    expect(change?.changePct).toBeCloseTo(-54.64, 2); // 41.73 kg against 92 kg
    expect(change?.daysAgo).toBe(5);
    const message = weightChangeMessage(change!);
    expect(message).toContain(
      'the weight 92 lb (41.7 kg) is 54.6 % less than the 92 kg (202.8 lb) recorded 5 days ago',
    );
    expect(message).toContain('more than 10 % within 90 days');
  });

  it('needs none at exactly 10 %, none with nothing recorded, and none when the last weight is 90 days old or more', () => {
    expect(
      weightChangeNeedingReason(last(100, 10), { value: 110, unit: 'kg' }, now, rule),
    ).toBeNull();
    expect(
      weightChangeNeedingReason(last(100, 10), { value: 90, unit: 'kg' }, now, rule),
    ).toBeNull();
    expect(
      weightChangeNeedingReason(last(100, 10), { value: 110.5, unit: 'kg' }, now, rule)?.changePct,
    ).toBeCloseTo(10.5, 6);
    expect(weightChangeNeedingReason(null, { value: 110, unit: 'kg' }, now, rule)).toBeNull();
    expect(
      weightChangeNeedingReason(last(100, 89), { value: 80, unit: 'kg' }, now, rule),
    ).not.toBeNull();
    expect(
      weightChangeNeedingReason(last(100, 90), { value: 80, unit: 'kg' }, now, rule),
    ).toBeNull();
  });

  it('compares in kg whatever units the two were typed in', () => {
    // 202.8 lb = 91.99 kg (1 lb = 0.45359237 kg): within 10 % of 92 kg.
    expect(
      weightChangeNeedingReason(last(92, 5), { value: 202.8, unit: 'lb' }, now, rule),
    ).toBeNull();
  });
});
