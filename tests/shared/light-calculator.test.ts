import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { lightFields, solveLight, type LightField } from '../../shared/engine/light-calculator';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import type { LightCalculationRequest } from '../../shared/schemas/calculation';

function inputErrorOf(run: () => unknown): PlanInputError {
  try {
    run();
  } catch (error) {
    if (error instanceof PlanInputError) return error;
    throw error;
  }
  throw new Error('expected a PlanInputError');
}

function pick(
  source: Record<LightField, number | null>,
  fields: readonly LightField[],
): LightCalculationRequest {
  return Object.fromEntries(fields.map((field) => [field, source[field] ?? undefined]));
}

function triples(): LightField[][] {
  const result: LightField[][] = [];
  lightFields.forEach((a, i) =>
    lightFields
      .slice(i + 1)
      .forEach((b, j) => lightFields.slice(i + j + 2).forEach((c) => result.push([a, b, c]))),
  );
  return result;
}

// Three values tied by one definition cannot fix the other three.
const dependentTriples = [
  'powerMw,spotDiameterUm,irradianceMwPerCm2',
  'irradianceMwPerCm2,exposureS,fluenceJPerCm2',
  'powerMw,exposureS,energyJ',
  'spotDiameterUm,fluenceJPerCm2,energyJ',
];

describe('the light calculator', () => {
  it('works out power, fluence and energy for a 3000 µm spot at 600 mW/cm² for 83 s', () => {
    // Definitions: area = π d²/4 → 0.070686 cm²; power = 42.4 mW; fluence 600 × 83 = 49.8 J/cm² (TAP Study Group, Arch Ophthalmol 1999).
    const solution = solveLight({ spotDiameterUm: 3000, irradianceMwPerCm2: 600, exposureS: 83 });

    expect(solution.spotAreaCm2).toBeCloseTo(0.070686, 6);
    expect(solution.powerMw).toBeCloseTo(42.41, 2);
    expect(solution.fluenceJPerCm2).toBeCloseTo(49.8, 10);
    expect(solution.energyJ).toBeCloseTo(3.52, 2);
    expect(solution.given).toEqual(['spotDiameterUm', 'irradianceMwPerCm2', 'exposureS']);
  });

  it('finds 83.3 s for 50 J/cm² at 600 mW/cm²', () => {
    // Definition: 50 J/cm² ÷ 0.6 W/cm² = 83.3 s.
    const solution = solveLight({
      fluenceJPerCm2: 50,
      irradianceMwPerCm2: 600,
      spotDiameterUm: 6400,
    });

    expect(solution.exposureS).toBeCloseTo(83.33, 2);
    expect(solution.powerMw).toBeCloseTo(193.0, 1);
  });

  it.each(triples().filter((fields) => !dependentTriples.includes(fields.join(','))))(
    'recovers every value from %s, %s and %s',
    (...fields) => {
      const reference = solveLight({
        spotDiameterUm: 2400,
        irradianceMwPerCm2: 600,
        exposureS: 83,
      });

      const solution = solveLight(pick(reference, fields));

      for (const field of lightFields)
        expect(solution[field], field).toBeCloseTo(reference[field]!, 8);
    },
  );

  it.each(dependentTriples)('says which values are missing when given only %s', (joined) => {
    const reference = solveLight({ spotDiameterUm: 2400, irradianceMwPerCm2: 600, exposureS: 83 });
    const fields = joined.split(',') as LightField[];

    const error = inputErrorOf(() => solveLight(pick(reference, fields)));

    expect(error.fields.map((field) => field.path).sort()).toEqual(
      lightFields.filter((field) => !fields.includes(field)).sort(),
    );
    expect(error.fields[0]?.message).toContain('cannot be worked out from');
    expect(error.fields[0]?.message).toContain('give two figures that one definition ties');
  });

  describe('answers what two figures tie together, and leaves the rest empty', () => {
    it('spot diameter and irradiance give the power: 6400 µm at 600 mW/cm² → 193.0 mW', () => {
      // Definitions (area = π d²/4 = 0.3217 cm²; power = irradiance × area); 600 mW/cm² and the
      // 6400 µm largest spot: TAP Study Group, Arch Ophthalmol 1999.
      const solution = solveLight({ spotDiameterUm: 6400, irradianceMwPerCm2: 600 });

      expect(solution.spotAreaCm2).toBeCloseTo(0.3217, 4);
      expect(solution.powerMw).toBeCloseTo(193.0, 1);
      expect(solution.exposureS).toBeNull();
      expect(solution.fluenceJPerCm2).toBeNull();
      expect(solution.energyJ).toBeNull();
    });

    it('fluence and irradiance give the time: 50 J/cm² at 600 mW/cm² → 83.3 s', () => {
      // Definition: exposure = fluence ÷ irradiance; 50 J/cm², 600 mW/cm²: TAP Study Group 1999.
      const solution = solveLight({ fluenceJPerCm2: 50, irradianceMwPerCm2: 600 });

      expect(solution.exposureS).toBeCloseTo(83.33, 2);
      expect(solution.powerMw).toBeNull();
      expect(solution.spotDiameterUm).toBeNull();
    });

    it('power and spot give the irradiance: 42.4 mW on a 3000 µm spot → 600 mW/cm²', () => {
      // Definition: irradiance = power ÷ area; 3000 µm → 0.070686 cm² (arithmetic of π d²/4).
      const solution = solveLight({ powerMw: 42.4115, spotDiameterUm: 3000 });

      expect(solution.irradianceMwPerCm2).toBeCloseTo(600, 2);
      expect(solution.fluenceJPerCm2).toBeNull();
    });

    it('time and irradiance give the fluence: 1800 s at 3 mW/cm² → 5.4 J/cm²', () => {
      // Caporossi A et al., J Cataract Refract Surg 2006: 3 mW/cm² × 30 min = 5.4 J/cm².
      const solution = solveLight({ exposureS: 1800, irradianceMwPerCm2: 3 });

      expect(solution.fluenceJPerCm2).toBeCloseTo(5.4, 10);
      expect(solution.powerMw).toBeNull();
    });

    it('power and time give the energy: 42.4 mW for 83 s → 3.52 J', () => {
      // Definition: energy = power × time (mW × s ÷ 1000 = J); 83 s: TAP Study Group 1999.
      const solution = solveLight({ powerMw: 42.4, exposureS: 83 });

      expect(solution.energyJ).toBeCloseTo(3.519, 3);
      expect(solution.irradianceMwPerCm2).toBeNull();
    });

    it('two figures no definition ties answer nothing, and say so for each missing field', () => {
      const error = inputErrorOf(() => solveLight({ powerMw: 42.4, fluenceJPerCm2: 50 }));

      expect(error.fields.map((field) => field.path).sort()).toEqual(
        ['spotDiameterUm', 'irradianceMwPerCm2', 'exposureS', 'energyJ'].sort(),
      );
    });
  });

  it('refuses figures that disagree, naming each of them', () => {
    const error = inputErrorOf(() =>
      solveLight({ spotDiameterUm: 3000, irradianceMwPerCm2: 600, powerMw: 50, exposureS: 83 }),
    );

    expect(error.fields.map((field) => field.path)).toEqual([
      'powerMw',
      'spotDiameterUm',
      'irradianceMwPerCm2',
    ]);
    expect(error.fields[0]?.message).toMatch(/gives 42\.4115 mW, but powerMw is 50 mW/);
  });

  it('accepts the published rounding 600 mW/cm² × 83 s ≈ 50 J/cm² as agreeing (0.4% apart)', () => {
    // TAP Study Group, Arch Ophthalmol 1999.
    const solution = solveLight({
      irradianceMwPerCm2: 600,
      exposureS: 83,
      fluenceJPerCm2: 50,
      spotDiameterUm: 3000,
    });

    expect(solution.fluenceJPerCm2).toBe(50);
  });

  it('refuses zero, negative and unknown fields', () => {
    const error = inputErrorOf(() =>
      solveLight({
        powerMw: 0,
        exposureS: -1,
        colour: 'red',
      } as unknown as LightCalculationRequest),
    );

    expect(error.fields.map((field) => field.path).sort()).toEqual([
      'colour',
      'exposureS',
      'powerMw',
    ]);
    expect(error.fields.find((field) => field.path === 'powerMw')?.message).toBe(
      'powerMw must be a number greater than 0 mW',
    );
  });

  it('round-trips fluence = irradiance × time: exposure solved back from the fluence is the exposure put in', () => {
    const positive = (min: number, max: number) => fc.double({ min, max, noNaN: true });
    fc.assert(
      fc.property(
        positive(0.1, 5000),
        positive(0.1, 10_000),
        positive(10, 10_000),
        (irradianceMwPerCm2, exposureS, spotDiameterUm) => {
          const forward = solveLight({ irradianceMwPerCm2, exposureS, spotDiameterUm });

          const back = solveLight({
            irradianceMwPerCm2,
            fluenceJPerCm2: forward.fluenceJPerCm2!,
            spotDiameterUm,
          });

          expect(forward.fluenceJPerCm2).toBeCloseTo((irradianceMwPerCm2 * exposureS) / 1000, 6);
          expect(back.exposureS! / exposureS).toBeCloseTo(1, 10);
          expect(back.energyJ! / forward.energyJ!).toBeCloseTo(1, 10);
        },
      ),
    );
  });
});
