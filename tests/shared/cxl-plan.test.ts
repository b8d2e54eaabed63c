import { describe, expect, it } from 'vitest';
import { computePlan } from '../../shared/engine/compute-plan';
import { irradianceAtDepthMwPerCm2, stromaAttenuationPerCm } from '../../shared/engine/corneal-uv';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import { protocolVersionSchema, type ProtocolVersion } from '../../shared/protocol/protocol-schema';
import type { DosePlan } from '../../shared/schemas/calculation';
import { copyOf, loadProtocol } from './support/shipped-protocols';

const standard = loadProtocol('cxl-standard');
const accelerated = loadProtocol('cxl-accelerated');
const pulsed = loadProtocol('cxl-accelerated-pulsed');

function warningCodes(plan: DosePlan): string[] {
  return plan.warnings.map((warning) => warning.code);
}

/** A valid variant of cxl-accelerated at another irradiance, same fluence. */
function acceleratedAt(irradianceMwPerCm2: number, exposureS: number): ProtocolVersion {
  const variant = copyOf(accelerated);
  variant.key = 'cxl-test-variant';
  variant.light.irradianceMwPerCm2 = irradianceMwPerCm2;
  variant.light.exposureS = exposureS;
  const uvStep = variant.steps.find((step) => step.kind === 'uv');
  if (!uvStep) throw new Error('cxl-accelerated has no uv step');
  uvStep.durationS = exposureS;
  return protocolVersionSchema.parse(variant);
}

describe('corneal cross-linking plans', () => {
  it('standard: 3 mW/cm² for 1800 s gives 5.4 J/cm²', () => {
    // Wollensak G, Spoerl E, Seiler T. Am J Ophthalmol 2003 (3 mW/cm², 30 min); Caporossi A et al. J Cataract Refract Surg 2006 (5.4 J/cm²).
    const plan = computePlan(standard, { stromalThicknessUm: 450 });

    expect(plan.irradianceMwPerCm2).toBe(3);
    expect(plan.uvTimeS).toBe(1800);
    expect(plan.uvElapsedS).toBe(1800);
    expect(plan.fluenceJPerCm2).toBe(5.4);
  });

  it('accelerated: 9 mW/cm² for 600 s gives the same 5.4 J/cm²', () => {
    // Seiler TG et al. Invest Ophthalmol Vis Sci 2014.
    const plan = computePlan(accelerated, { stromalThicknessUm: 450 });

    expect(plan.uvTimeS).toBe(600);
    expect(plan.uvElapsedS).toBe(600);
    expect(plan.fluenceJPerCm2).toBe(5.4);
  });

  it('pulsed: 30 mW/cm² for 240 s of light, 1:1 on/off, takes 8 min and gives 7.2 J/cm²', () => {
    // Porcine cornea study, PMC5321166 (published abstract).
    const plan = computePlan(pulsed, { stromalThicknessUm: 450 });

    expect(plan.uvTimeS).toBe(240);
    expect(plan.uvElapsedS).toBe(480);
    expect(plan.fluenceJPerCm2).toBe(7.2);
  });

  it('stretches the elapsed time by the on/off ratio of any cycle, not only 1:1', () => {
    const variant = copyOf(pulsed);
    variant.light.pulse = { onS: 2, offS: 1 };

    const plan = computePlan(variant, { stromalThicknessUm: 450 });

    expect(plan.uvElapsedS).toBe(360);
  });

  it('derives α = ln(3 ÷ 0.18) ÷ 0.040 cm ≈ 70.3 cm⁻¹ from Spoerl’s figures', () => {
    // Spoerl E, Mrochen M, Sliney D, Trokel S, Seiler T. Cornea 2007, with our own arithmetic.
    expect(stromaAttenuationPerCm).toBeCloseTo(70.34, 2);
  });

  it.each([
    [400, 0.18],
    [350, 0.256],
    [300, 0.364],
  ])(
    'estimates %i µm of stroma leaves %f mW/cm² at the endothelium under 3 mW/cm²',
    (thicknessUm, expected) => {
      // Spoerl E et al. Cornea 2007 (0.18 mW/cm² at 400 µm), Beer–Lambert by our own arithmetic.
      const plan = computePlan(standard, { stromalThicknessUm: thicknessUm });

      expect(plan.endothelialIrradianceMwPerCm2).toBe(expected);
      expect(irradianceAtDepthMwPerCm2(3, thicknessUm)).toBeCloseTo(expected, 3);
    },
  );

  it('labels the endothelial figures as an estimate that ignores riboflavin bleaching', () => {
    const plan = computePlan(standard, { stromalThicknessUm: 400 });

    const line = plan.working.find((entry) => entry.name === 'endothelialIrradianceMwPerCm2');

    expect(line?.formula).toContain('estimate — ignores riboflavin bleaching');
    expect(line?.source).toContain('Spoerl E');
    expect(plan.endothelialDoseJPerCm2).toBe(0.324);
  });

  it('has a working line for every number it outputs, and one for the thickness check', () => {
    const plan = computePlan(pulsed, {
      stromalThicknessUm: 450,
      height: { value: 170, unit: 'cm' },
      weight: { value: 70, unit: 'kg' },
    });
    const outputNames = Object.entries(plan)
      .filter(([, value]) => typeof value === 'number')
      .map(([name]) => name);

    const workedNames = new Set(plan.working.map((line) => line.name));

    expect(outputNames).toEqual(
      expect.arrayContaining(['bsaM2', 'uvTimeS', 'uvElapsedS', 'endothelialDoseJPerCm2']),
    );
    for (const name of outputNames) expect(workedNames, `working for ${name}`).toContain(name);
    expect(plan.working.find((line) => line.name === 'thicknessMarginUm')?.value).toBe(50);
  });

  it('passes a 400 µm stroma under the standard setting with no warning', () => {
    // Spoerl E et al. Cornea 2007: 400 µm minimum; 0.18 mW/cm² is below the 0.35 mW/cm² threshold.
    const plan = computePlan(standard, { stromalThicknessUm: 400 });

    expect(plan.thicknessOk).toBe(true);
    expect(plan.warnings).toEqual([]);
  });

  it('flags a 350 µm stroma as too thin and says the swelling step is needed', () => {
    // Spoerl E et al. Cornea 2007 (400 µm minimum); swelling: Hafezi F et al. J Cataract Refract Surg 2009 (from memory).
    const plan = computePlan(standard, { stromalThicknessUm: 350 });

    expect(plan.thicknessOk).toBe(false);
    expect(warningCodes(plan)).toEqual(['thickness-below-minimum', 'swelling-step-needed']);
    expect(plan.warnings[1]?.message).toContain('every 20 s');
  });

  it('tells a protocol without a swelling step to choose another protocol for a thin stroma', () => {
    const plan = computePlan(accelerated, { stromalThicknessUm: 380 });

    expect(plan.thicknessOk).toBe(false);
    expect(warningCodes(plan)).toContain('no-swelling-step');
    expect(warningCodes(plan)).not.toContain('swelling-step-needed');
  });

  it('warns at 300 µm that the endothelium may get 0.65 J/cm² or more, judged on the dose alone', () => {
    // Wollensak G et al. J Cataract Refract Surg 2003 (0.65 J/cm² cytotoxic); attenuation from Spoerl E et al. Cornea 2007:
    // 3 × e^(−70.3 × 0.03) = 0.364 mW/cm² × 1800 s = 0.655 J/cm² (our arithmetic).
    const plan = computePlan(standard, { stromalThicknessUm: 300 });

    expect(warningCodes(plan)).toEqual([
      'thickness-below-minimum',
      'swelling-step-needed',
      'endothelial-dose',
    ]);
    expect(plan.endothelialDoseJPerCm2).toBe(0.655);
  });

  it('raises no endothelial warning for a normal cornea under an accelerated setting, and shows the irradiance as information', () => {
    // 9 mW/cm² × 600 s (Seiler TG et al. IOVS 2014) at 450 µm: 9 × e^(−70.3 × 0.045) = 0.380 mW/cm², above the
    // 0.35 mW/cm² found for a 30-minute exposure (Spoerl E et al. Cornea 2007), but 0.380 × 600 s = 0.228 J/cm²,
    // far below 0.65 J/cm² (Wollensak G et al. J Cataract Refract Surg 2003). Our arithmetic.
    const plan = computePlan(acceleratedAt(9, 600), { stromalThicknessUm: 450 });

    expect(plan.warnings).toEqual([]);
    expect(plan.endothelialIrradianceMwPerCm2).toBeGreaterThan(0.35);
    expect(plan.endothelialDoseJPerCm2).toBeLessThan(0.65);
    expect(
      plan.working.find((line) => line.name === 'endothelialIrradianceMwPerCm2')?.source,
    ).toMatch(/for information/);
  });

  it('warns above 45 mW/cm², where reciprocity is reported to fail, and not at 45', () => {
    // Wernli J et al. Invest Ophthalmol Vis Sci 2013; the 45 mW/cm² threshold from memory.
    const above = computePlan(acceleratedAt(54, 100), { stromalThicknessUm: 500 });
    const at = computePlan(acceleratedAt(45, 120), { stromalThicknessUm: 500 });

    expect(above.uvTimeS).toBe(100);
    expect(warningCodes(above)).toContain('reciprocity-limit');
    expect(warningCodes(at)).not.toContain('reciprocity-limit');
  });

  it('needs no height or weight, but records a BSA when both are given', () => {
    const without = computePlan(standard, { stromalThicknessUm: 450 });
    const withBody = computePlan(standard, {
      stromalThicknessUm: 450,
      height: { value: 170, unit: 'cm' },
      weight: { value: 70, unit: 'kg' },
    });

    expect(without.bsaM2).toBeNull();
    expect(without.bsaFormula).toBeNull();
    expect(withBody.bsaM2).toBe(1.82);
    expect(without.doseMg).toBeNull();
    expect(without.powerMw).toBeNull();
  });

  it('refuses a height without a weight, and PDT-only inputs', () => {
    try {
      computePlan(standard, {
        stromalThicknessUm: 450,
        height: { value: 170, unit: 'cm' },
        lesionGldUm: 2000,
      });
      expect.unreachable('computePlan should refuse');
    } catch (error) {
      expect(error).toBeInstanceOf(PlanInputError);
      expect((error as PlanInputError).fields.map((field) => field.path)).toEqual([
        'inputs.lesionGldUm',
        'inputs.weight',
      ]);
    }
  });

  it('refuses a missing thickness, naming the range', () => {
    expect(() => computePlan(standard, {})).toThrow(
      'stromal thickness is required for a cxl protocol (allowed 200–800 µm)',
    );
  });
});
