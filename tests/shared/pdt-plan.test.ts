import { describe, expect, it } from 'vitest';
import { computePlan } from '../../shared/engine/compute-plan';
import { engineVersion } from '../../shared/engine/engine-version';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import type { DosePlan, PlanInputs } from '../../shared/schemas/calculation';
import { loadProtocol } from './support/shipped-protocols';

const standard = loadProtocol('pdt-standard');

function pdtInputs(overrides: Partial<PlanInputs> = {}): PlanInputs {
  return {
    height: { value: 170, unit: 'cm' },
    weight: { value: 70, unit: 'kg' },
    lesionGldUm: 2000,
    lensMagnification: 1,
    ...overrides,
  };
}

function workingFor(plan: DosePlan, name: string) {
  const entry = plan.working.find((line) => line.name === name);
  if (!entry) throw new Error(`no working line for ${name}`);
  return entry;
}

function inputErrorOf(run: () => unknown): PlanInputError {
  try {
    run();
  } catch (error) {
    if (error instanceof PlanInputError) return error;
    throw error;
  }
  throw new Error('expected a PlanInputError');
}

describe('verteporfin PDT, standard regimen', () => {
  it('doses 6 mg/m² on the Mosteller BSA rounded to 0.01 m²', () => {
    // TAP Study Group, Arch Ophthalmol 1999: 6 mg/m². Mosteller 170 cm/70 kg = 1.8181 → 1.82 m².
    const plan = computePlan(standard, pdtInputs());

    expect(plan.bsaFormula).toBe('mosteller');
    expect(plan.bsaM2).toBe(1.82);
    expect(plan.doseMg).toBe(10.92);
  });

  it('draws up the dose at 2 mg/mL and makes it up to 30 mL, from one 15 mg vial', () => {
    // 2 mg/mL and 30 mL: Drug Discov Today 2008 review table; 15 mg vial: from memory.
    const plan = computePlan(standard, pdtInputs());

    expect(plan.drugVolumeMl).toBe(5.5);
    expect(plan.diluentVolumeMl).toBe(24.5);
    expect(plan.vials).toBe(1);
  });

  it('needs a second vial once the dose passes 15 mg', () => {
    // 15 mg vial: from memory. 190 cm/110 kg → Mosteller 2.41 m² → 14.46 mg; 200 cm/140 kg → 2.79 m² → 16.74 mg.
    expect(
      computePlan(
        standard,
        pdtInputs({ height: { value: 190, unit: 'cm' }, weight: { value: 110, unit: 'kg' } }),
      ).vials,
    ).toBe(1);
    expect(
      computePlan(
        standard,
        pdtInputs({ height: { value: 200, unit: 'cm' }, weight: { value: 140, unit: 'kg' } }),
      ).vials,
    ).toBe(2);
  });

  it('infuses 30 mL over 10 min at 3 mL/min', () => {
    // TAP Study Group, Arch Ophthalmol 1999.
    const plan = computePlan(standard, pdtInputs());

    expect(plan.infusionRateMlPerMin).toBe(3);
    expect(plan.infusionEndAfterStartS).toBe(600);
  });

  it('starts the light 15 min after the START of the infusion and ends it 83 s later', () => {
    // TAP Study Group, Arch Ophthalmol 1999.
    const plan = computePlan(standard, pdtInputs());

    expect(plan.lightStartAfterInfusionStartS).toBe(900);
    expect(plan.lightEndAfterInfusionStartS).toBe(983);
  });

  it('delivers 600 mW/cm² × 83 s = 49.8 J/cm², the published 50 J/cm² rounded', () => {
    // TAP Study Group, Arch Ophthalmol 1999.
    const plan = computePlan(standard, pdtInputs());

    expect(plan.irradianceMwPerCm2).toBe(600);
    expect(plan.exposureS).toBe(83);
    expect(plan.fluenceJPerCm2).toBe(49.8);
  });

  it('sizes the spot as GLD + 1000 µm: a 2000 µm lesion gets a 3000 µm spot of 0.070686 cm² and 42.4 mW', () => {
    // TAP Study Group, Arch Ophthalmol 1999 (GLD + 1000 µm); area and power by definition.
    const plan = computePlan(standard, pdtInputs({ lesionGldUm: 2000 }));

    expect(plan.spotDiameterUm).toBe(3000);
    expect(plan.spotAreaCm2).toBeCloseTo(0.070686, 6);
    expect(plan.powerMw).toBe(42.4);
    expect(plan.energyJ).toBe(3.52);
  });

  it('allows the largest lesion, 5400 µm, with a 6400 µm spot of 0.3217 cm² and 193.0 mW', () => {
    // TAP Study Group, Arch Ophthalmol 1999 (largest spot 6400 µm); area and power by definition.
    const plan = computePlan(standard, pdtInputs({ lesionGldUm: 5400 }));

    expect(plan.spotDiameterUm).toBe(6400);
    expect(plan.spotAreaCm2).toBeCloseTo(0.3217, 4);
    expect(plan.powerMw).toBe(193);
  });

  it('refuses a lesion whose spot would exceed 6400 µm, naming lesionGldUm and the range', () => {
    // TAP Study Group, Arch Ophthalmol 1999: lesions up to 5400 µm.
    const error = inputErrorOf(() => computePlan(standard, pdtInputs({ lesionGldUm: 5600 })));

    expect(error.fields).toEqual([
      {
        path: 'inputs.lesionGldUm',
        message:
          'lesion GLD must be between 100 and 5400 µm (got 5600 µm): its spot (GLD + 1000 µm margin = 6600 µm) would pass the largest spot of 6400 µm',
      },
    ]);
  });

  it('still refuses an oversized spot when a protocol forgot to cap the lesion size', () => {
    // The schema forbids this protocol; the engine must not trust that it was validated.
    const unvalidated = structuredClone(standard);
    if (!unvalidated.inputLimits.lesionGldUm) throw new Error('pdt-standard has no GLD limit');
    unvalidated.inputLimits.lesionGldUm.hard.max = 8000;
    unvalidated.inputLimits.lesionGldUm.soft.max = 8000;

    const error = inputErrorOf(() => computePlan(unvalidated, pdtInputs({ lesionGldUm: 5600 })));

    expect(error.fields[0]?.path).toBe('inputs.lesionGldUm');
    expect(error.fields[0]?.message).toMatch(
      /at most 5400 µm .*\(got 5600 µm\): its spot \(GLD \+ 1000 µm margin = 6600 µm\) would pass the largest spot of 6400 µm/,
    );
  });

  it('says why a lesion above the range is refused: its spot would pass the largest spot, with both figures', () => {
    // pdt-standard v1: spot = GLD + 1000 µm, largest spot 6400 µm (protocol file; margin common practice).
    const error = inputErrorOf(() =>
      computePlan(standard, pdtInputs({ lesionGldUm: 6000, lensMagnification: 99 })),
    );
    const gld = error.fields.filter((f) => f.path === 'inputs.lesionGldUm');
    expect(gld).toHaveLength(1);
    expect(gld[0]?.message).toMatch(
      /between 100 and 5400 µm \(got 6000 µm\): its spot \(GLD \+ 1000 µm margin = 7000 µm\) would pass the largest spot of 6400 µm/,
    );
    // The other bad input of the same form is reported with it, not after it.
    expect(error.fields.map((f) => f.path)).toContain('inputs.lensMagnification');
  });

  it('sets the laser to the retinal spot divided by the lens magnification', () => {
    // Common practice: device spot = retinal spot ÷ contact-lens spot magnification factor.
    const plan = computePlan(standard, pdtInputs({ lesionGldUm: 2000, lensMagnification: 1.5 }));

    expect(plan.spotDiameterUm).toBe(3000);
    expect(plan.deviceSpotDiameterUm).toBe(2000);
    // The irradiance is set on the retina, so power follows the retinal spot, not the device setting.
    expect(plan.powerMw).toBe(42.4);
  });

  it('gives the same BSA from inches-and-pounds inputs as from their metric equivalents', () => {
    const metric = computePlan(
      standard,
      pdtInputs({ height: { value: 177.8, unit: 'cm' }, weight: { value: 69.853225, unit: 'kg' } }),
    );

    const imperial = computePlan(
      standard,
      pdtInputs({ height: { value: 70, unit: 'in' }, weight: { value: 154, unit: 'lb' } }),
    );

    expect(imperial.bsaM2).toBe(metric.bsaM2);
    expect(workingFor(imperial, 'heightCm').value).toBeCloseTo(177.8, 10);
    expect(workingFor(imperial, 'weightKg').value).toBeCloseTo(69.853225, 6);
  });

  it('uses the BSA formula asked for instead of the protocol default', () => {
    // Du Bois D & Du Bois EF, Arch Intern Med 1916: 170 cm/70 kg = 1.8097 → 1.81 m²; 6 × 1.81 = 10.86 mg.
    const plan = computePlan(standard, pdtInputs({ bsaFormula: 'du-bois' }));

    expect(plan.bsaFormula).toBe('du-bois');
    expect(plan.bsaM2).toBe(1.81);
    expect(plan.doseMg).toBe(10.86);
  });

  it('shows its working: formula, inputs, source and the unrounded value beside the rounded one', () => {
    const plan = computePlan(standard, pdtInputs());

    const bsa = workingFor(plan, 'bsaM2');
    expect(bsa.value).toBeCloseTo(1.8181, 4);
    expect(bsa.rounded).toEqual({ value: 1.82, step: 0.01 });
    expect(bsa.formula).toContain('√(heightCm × weightKg ÷ 3600)');
    expect(bsa.source).toContain('Mosteller RD');
    expect(bsa.inputs).toEqual({
      heightCm: { value: 170, unit: 'cm' },
      weightKg: { value: 70, unit: 'kg' },
    });
    // The dose is worked from the rounded BSA, as the pharmacist will repeat it by hand.
    expect(workingFor(plan, 'doseMg').inputs['bsaM2']).toEqual({ value: 1.82, unit: 'm²' });
  });

  it('has a working line for every value it outputs', () => {
    const plan = computePlan(standard, pdtInputs());
    const outputNames = Object.entries(plan)
      .filter(([, value]) => typeof value === 'number')
      .map(([name]) => name);

    const workedNames = new Set(plan.working.map((line) => line.name));

    expect(outputNames.length).toBeGreaterThan(15);
    for (const name of outputNames) expect(workedNames, `working for ${name}`).toContain(name);
  });

  it('stamps the plan with the engine version and the protocol version used', () => {
    const plan = computePlan(standard, pdtInputs());

    expect(plan.engineVersion).toBe(engineVersion);
    expect(plan.protocol).toEqual({ key: 'pdt-standard', version: 1 });
    expect(plan.uvTimeS).toBeNull();
    expect(plan.thicknessOk).toBeNull();
  });

  it('warns, without refusing, when a height lies outside the soft range', () => {
    const plan = computePlan(standard, pdtInputs({ height: { value: 135, unit: 'cm' } }));

    expect(plan.warnings).toEqual([
      expect.objectContaining({
        code: 'soft-limit',
        field: 'inputs.height.value',
        message: expect.stringContaining('140 and 200 cm'),
      }),
    ]);
  });

  it('refuses several bad inputs at once, naming each with its allowed range', () => {
    const error = inputErrorOf(() =>
      computePlan(
        standard,
        pdtInputs({
          height: { value: 20, unit: 'in' },
          weight: { value: 300, unit: 'kg' },
          lensMagnification: undefined,
        }),
      ),
    );

    expect(error.fields).toEqual([
      {
        path: 'inputs.height.value',
        message: 'height must be between 100 and 230 cm (got 20 in = 50.8 cm)',
      },
      { path: 'inputs.weight.value', message: 'weight must be between 25 and 250 kg (got 300 kg)' },
      {
        path: 'inputs.lensMagnification',
        message: 'lens magnification factor is required for a pdt protocol (allowed 0.5–2.5)',
      },
    ]);
  });

  it('refuses a corneal thickness, which has no place in a PDT plan', () => {
    const error = inputErrorOf(() => computePlan(standard, pdtInputs({ stromalThicknessUm: 450 })));

    expect(error.fields.map((field) => field.path)).toEqual(['inputs.stromalThicknessUm']);
  });

  it.each([
    ['zero', 0],
    ['negative', -170],
    ['not a number', Number.NaN],
    ['infinite', Number.POSITIVE_INFINITY],
  ])('refuses a height that is %s, naming the field', (_label, value) => {
    const error = inputErrorOf(() =>
      computePlan(standard, pdtInputs({ height: { value, unit: 'cm' } })),
    );

    expect(error.fields).toEqual([
      {
        path: 'inputs.height.value',
        message: 'height.value must be a number greater than 0 in the unit given',
      },
    ]);
  });

  it('refuses an unknown unit and an unknown field', () => {
    const raw = {
      ...pdtInputs(),
      height: { value: 170, unit: 'ft' },
      eye: 'right',
    } as unknown as PlanInputs;

    const error = inputErrorOf(() => computePlan(standard, raw));

    expect(error.fields.map((field) => field.path).sort()).toEqual([
      'inputs.eye',
      'inputs.height.unit',
    ]);
  });
});

describe('reduced-setting PDT', () => {
  it('half dose gives 3 mg/m² with the standard 49.8 J/cm² light', () => {
    // van Dijk EHC et al., Ophthalmology 2018 (PLACE); Altinel MG et al. (abstract): 3 mg/m² + 50 J/cm².
    // Version 2 draws to the 0.01 mL graduation (common practice): 5.46 mg ÷ 2 mg/mL = 2.73 mL.
    const plan = computePlan(loadProtocol('pdt-half-dose', 2), pdtInputs());

    expect(plan.doseMg).toBe(5.46);
    expect(plan.drugVolumeMl).toBe(2.73);
    expect(plan.fluenceJPerCm2).toBe(49.8);
    expect(plan.powerMw).toBe(42.4);
  });

  it('half fluence keeps 6 mg/m² and gives 300 mW/cm² × 83 s = 24.9 J/cm² at half the power', () => {
    // Altinel MG et al. (abstract): 6 mg/m² + 25 J/cm²; 300 mW/cm² for 83 s from memory.
    const plan = computePlan(loadProtocol('pdt-half-fluence'), pdtInputs());

    expect(plan.doseMg).toBe(10.92);
    expect(plan.fluenceJPerCm2).toBe(24.9);
    expect(plan.powerMw).toBe(21.2);
    expect(plan.lightEndAfterInfusionStartS).toBe(983);
  });

  it('half time keeps 6 mg/m² and 600 mW/cm² for 42 s = 25.2 J/cm²', () => {
    // NCT01797861 names the half-time strategy; 600 mW/cm² for 42 s from memory.
    const plan = computePlan(loadProtocol('pdt-half-time'), pdtInputs());

    expect(plan.doseMg).toBe(10.92);
    expect(plan.exposureS).toBe(42);
    expect(plan.fluenceJPerCm2).toBe(25.2);
    expect(plan.powerMw).toBe(42.4);
    expect(plan.lightEndAfterInfusionStartS).toBe(942);
  });
});
