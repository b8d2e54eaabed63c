import { describe, expect, it } from 'vitest';
import { computePlan } from '../../shared/engine/compute-plan';
import { doseCheckDiffering } from '../../shared/engine/dose-check';
import { maxDrawnDoseShiftPct } from '../../shared/engine/drawn-volume';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import { protocolVersionSchema } from '../../shared/protocol/protocol-schema';
import type { DosePlan, PlanInputs } from '../../shared/schemas/calculation';
import { copyOf, loadProtocol } from './support/shipped-protocols';

const standardV1 = loadProtocol('pdt-standard', 1);
const standardV2 = loadProtocol('pdt-standard', 2);
const halfDoseV1 = loadProtocol('pdt-half-dose', 1);
const halfDoseV2 = loadProtocol('pdt-half-dose', 2);

function body(heightCm: number, weightKg: number): PlanInputs {
  return {
    height: { value: heightCm, unit: 'cm' },
    weight: { value: weightKg, unit: 'kg' },
    bsaFormula: 'mosteller',
    lesionGldUm: 2000,
    lensMagnification: 1,
  };
}

function line(plan: DosePlan, name: string) {
  const entry = plan.working.find((l) => l.name === name);
  if (!entry) throw new Error(`no working line ${name}`);
  return entry;
}

describe('the drawn volume delivers the dose', () => {
  it('draws to the syringe graduation and shows the dose in the drawn volume with its difference', () => {
    // Half-dose: 3 mg/m² (van Dijk EHC et al., Ophthalmology 2018); 2 mg/mL (review table, Drug
    // Discov Today 2008); 0.01 mL graduation (common practice).
    // By hand: Mosteller √(165 × 62 ÷ 3600) = √2.841667 = 1.68572 → 1.69 m²; 3 × 1.69 = 5.07 mg;
    // 5.07 ÷ 2 = 2.535 mL → 2.54 mL; 2.54 × 2 = 5.08 mg in the syringe; (5.08 − 5.07) ÷ 5.07 = +0.197%.
    const plan = computePlan(halfDoseV2, body(165, 62));

    expect(plan.bsaM2).toBe(1.69);
    expect(plan.doseMg).toBe(5.07);
    expect(plan.drugVolumeMl).toBe(2.54);
    expect(plan.drawnDoseMg).toBe(5.08);
    expect(plan.drawnDoseDifferencePct).toBe(0.2);
    expect(line(plan, 'drawnDoseDifferencePct').value).toBeCloseTo(0.197, 3);
    expect(line(plan, 'drugVolumeMl').rounded).toEqual({ value: 2.54, step: 0.01 });
  });

  it('on a version rounding volumes to 0.1 mL, a 0.73% move is shown and allowed', () => {
    // TAP Study Group, Arch Ophthalmol 1999: 6 mg/m². By hand: √(170 × 70 ÷ 3600) = 1.81812 → 1.82 m²;
    // 6 × 1.82 = 10.92 mg; 10.92 ÷ 2 = 5.46 mL → 5.5 mL; 5.5 × 2 = 11.0 mg: +0.73%, under 1%.
    const plan = computePlan(standardV1, body(170, 70));

    expect(plan.drugVolumeMl).toBe(5.5);
    expect(plan.drawnDoseMg).toBe(11);
    expect(plan.drawnDoseDifferencePct).toBe(0.73);
  });

  it('refuses a plan whose rounded volume would move the dose by more than 1%, naming the protocol', () => {
    // By hand: 3 mg/m² × 1.82 m² = 5.46 mg; 5.46 ÷ 2 = 2.73 mL → 2.7 mL on v1's 0.1 mL step;
    // 2.7 × 2 = 5.4 mg: −1.10%, more than 1%.
    let caught: unknown;
    try {
      computePlan(halfDoseV1, body(170, 70));
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(PlanInputError);
    expect((caught as PlanInputError).fields).toEqual([
      expect.objectContaining({
        path: 'protocol',
        message: expect.stringMatching(/-1\.1%.*at most 1%/),
      }),
    ]);
    // The same patient on v2 (0.01 mL graduation) draws 2.73 mL = 5.46 mg exactly.
    expect(computePlan(halfDoseV2, body(170, 70)).drawnDoseDifferencePct).toBe(0);
    expect(maxDrawnDoseShiftPct).toBe(1);
  });

  it('counts vials from the volume to draw and the withdrawable volume, and shows what is left over', () => {
    // 15 mg vial reconstituted to 7.5 mL (from memory); 7 mL withdrawable (demo value, common practice).
    // By hand: √(170 × 70 ÷ 3600) → 1.82 m²; 10.92 mg; 5.46 mL; ceil(5.46 ÷ 7) = 1 vial;
    // left over 7.5 − 5.46 = 2.04 mL and 15 − 10.92 = 4.08 mg.
    const one = computePlan(standardV2, body(170, 70));
    expect(one.vials).toBe(1);
    expect(one.drugLeftOverMl).toBe(2.04);
    expect(one.drugLeftOverMg).toBe(4.08);

    // By hand: √(195 × 102 ÷ 3600) = √5.525 = 2.35053 → 2.35 m²; 6 × 2.35 = 14.1 mg (under the
    // 15 mg in one vial); 14.1 ÷ 2 = 7.05 mL, more than the 7 mL one vial gives: ceil(7.05 ÷ 7) = 2 vials;
    // left over 2 × 7.5 − 7.05 = 7.95 mL and 2 × 15 − 14.1 = 15.9 mg.
    const two = computePlan(standardV2, body(195, 102));
    expect(two.doseMg).toBe(14.1);
    expect(two.drugVolumeMl).toBe(7.05);
    expect(two.vials).toBe(2);
    expect(two.drugLeftOverMl).toBe(7.95);
    expect(two.drugLeftOverMg).toBe(15.9);
    expect(line(two, 'vials').formula).toBe('ceil(drugVolumeMl ÷ withdrawableVolumeMlPerVial)');
  });

  it('refuses a protocol version whose graduation could move the smallest patient’s dose by more than 1%', () => {
    // Smallest patient the hard limits admit: 100 cm, 25 kg → Du Bois 0.007184 × 25^0.425 × 100^0.725
    // ≈ 0.795 m² (Du Bois 1916); 3 mg/m² → 2.39 mg → 1.19 mL; half of a 0.1 mL step is 4.2% of that.
    const coarse = copyOf(halfDoseV2) as unknown as { drug: { syringeGraduationMl: number } };
    coarse.drug.syringeGraduationMl = 0.1;
    const result = protocolVersionSchema.safeParse(coarse);

    expect(result.success).toBe(false);
    expect(result.error?.issues.map((issue) => issue.path.join('.'))).toContain(
      'drug.syringeGraduationMl',
    );
  });
});

describe('the blind dose check accepts exact figures', () => {
  it('matches a pharmacist who carries every digit, within the tolerance of the unrounded working', () => {
    const plan = computePlan(standardV2, body(170, 70));
    // By hand: √(170 × 70 ÷ 3600) = 1.818119; × 6 mg/m² = 10.908716 mg; ÷ 2 mg/mL = 5.454358 mL.
    const exact = { bsaM2: 1.8181, doseMg: 10.9087, drugVolumeMl: 5.4544 };
    // A tight tolerance (0.05%, a test value) that the rounded plan figures alone would refuse:
    // 1.8181 is 0.10% from 1.82.
    const tight = { bsaPct: 0.05, dosePct: 0.05, drugVolumePct: 0.05 };

    expect(doseCheckDiffering(plan, exact, tight)).toEqual([]);
    expect(doseCheckDiffering({ ...plan, working: [] }, exact, tight)).toEqual([
      'bsaM2',
      'doseMg',
      'drugVolumeMl',
    ]);
    expect(doseCheckDiffering(plan, { ...exact, drugVolumeMl: 5.6 }, tight)).toEqual([
      'drugVolumeMl',
    ]);
  });

  it('still matches the plan’s rounded figures and refuses a figure outside the protocol tolerance', () => {
    const plan = computePlan(standardV2, body(170, 70));
    const tolerance = standardV2.tolerances.doseCheck!;

    expect(
      doseCheckDiffering(plan, { bsaM2: 1.82, doseMg: 10.92, drugVolumeMl: 5.46 }, tolerance),
    ).toEqual([]);
    // 2% (site default, common practice) of 10.92 mg is 0.22 mg: 11.3 mg is outside every reference.
    expect(
      doseCheckDiffering(plan, { bsaM2: 1.82, doseMg: 11.3, drugVolumeMl: 5.46 }, tolerance),
    ).toEqual(['doseMg']);
  });
});
