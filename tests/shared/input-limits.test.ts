import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computePlan } from '../../shared/engine/compute-plan';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import type { InputLimit, ProtocolVersion } from '../../shared/protocol/protocol-schema';
import type { PlanInputs } from '../../shared/schemas/calculation';
import { loadProtocol, shippedProtocolFiles } from './support/shipped-protocols';

const protocols = shippedProtocolFiles().map((file) => {
  const [key = '', version = ''] = file.replace(/\.json$/, '').split('.v');
  return loadProtocol(key, Number(version));
});

function required(limit: InputLimit | null, what: string): InputLimit {
  if (limit === null) throw new Error(`protocol has no ${what} limit`);
  return limit;
}

/** Any value inside the hard range; the narrowing keeps a converted value off the exact edge. */
function inside(limit: InputLimit, divisor = 1) {
  const edge = divisor === 1 ? 0 : 1e-9;
  return fc.double({
    min: (limit.hard.min / divisor) * (1 + edge),
    max: (limit.hard.max / divisor) * (1 - edge),
    noNaN: true,
  });
}

function outside(limit: InputLimit) {
  return fc.oneof(
    fc.double({ min: Number.MIN_VALUE, max: limit.hard.min, maxExcluded: true, noNaN: true }),
    fc.double({ min: limit.hard.max, max: limit.hard.max * 10, minExcluded: true, noNaN: true }),
  );
}

function validInputs(protocol: ProtocolVersion): fc.Arbitrary<PlanInputs> {
  const { heightCm, weightKg } = protocol.inputLimits;
  const height = fc.oneof(
    inside(heightCm).map((value) => ({ value, unit: 'cm' as const })),
    inside(heightCm, 2.54).map((value) => ({ value, unit: 'in' as const })),
    inside(heightCm, 100).map((value) => ({ value, unit: 'm' as const })),
  );
  const weight = fc.oneof(
    inside(weightKg).map((value) => ({ value, unit: 'kg' as const })),
    inside(weightKg, 0.45359237).map((value) => ({ value, unit: 'lb' as const })),
  );
  const bsaFormula = fc.constantFrom(
    'mosteller',
    'du-bois',
    'haycock',
    'gehan-george',
    'boyd' as const,
  );
  if (protocol.kind === 'pdt') {
    return fc.record({
      height,
      weight,
      bsaFormula,
      lesionGldUm: inside(required(protocol.inputLimits.lesionGldUm, 'GLD')),
      lensMagnification: inside(required(protocol.inputLimits.lensMagnification, 'lens')),
    });
  }
  return fc
    .record(
      {
        height,
        weight,
        bsaFormula,
        stromalThicknessUm: inside(required(protocol.inputLimits.stromalThicknessUm, 'thickness')),
      },
      { requiredKeys: ['stromalThicknessUm'] },
    )
    .filter((inputs) => (inputs.height === undefined) === (inputs.weight === undefined));
}

/**
 * A plan, or null when a version written before the syringe graduation (v1 of a PDT protocol,
 * rounding volumes to 0.1 mL) is refused because the rounded volume would move the dose by more
 * than 1% — the only refusal such a version may give for inputs inside the hard ranges. Versions
 * with a graduation must always give a plan.
 */
function planOrDrawnVolumeRefusal(protocol: ProtocolVersion, inputs: PlanInputs) {
  try {
    return computePlan(protocol, inputs);
  } catch (error) {
    if (
      protocol.drug !== null &&
      protocol.drug.syringeGraduationMl === undefined &&
      error instanceof PlanInputError &&
      error.fields.every((f) => f.path === 'protocol')
    )
      return null;
    throw error;
  }
}

interface LimitedField {
  path: string;
  label: string;
  unit: string;
  limit: InputLimit;
  place: (inputs: PlanInputs, value: number) => PlanInputs;
}

function limitedFields(protocol: ProtocolVersion): LimitedField[] {
  const { heightCm, weightKg, lesionGldUm, lensMagnification, stromalThicknessUm } =
    protocol.inputLimits;
  const fields: LimitedField[] = [];
  fields.push(
    {
      path: 'inputs.height.value',
      label: 'height',
      unit: ' cm',
      limit: heightCm,
      place: (inputs, value) => ({
        ...inputs,
        height: { value, unit: 'cm' },
        weight: inputs.weight ?? { value: 70, unit: 'kg' },
      }),
    },
    {
      path: 'inputs.weight.value',
      label: 'weight',
      unit: ' kg',
      limit: weightKg,
      place: (inputs, value) => ({
        ...inputs,
        weight: { value, unit: 'kg' },
        height: inputs.height ?? { value: 170, unit: 'cm' },
      }),
    },
  );
  if (lesionGldUm)
    fields.push({
      path: 'inputs.lesionGldUm',
      label: 'lesion GLD',
      unit: ' µm',
      limit: lesionGldUm,
      place: (inputs, value) => ({ ...inputs, lesionGldUm: value }),
    });
  if (lensMagnification)
    fields.push({
      path: 'inputs.lensMagnification',
      label: 'lens magnification factor',
      unit: '',
      limit: lensMagnification,
      place: (inputs, value) => ({ ...inputs, lensMagnification: value }),
    });
  if (stromalThicknessUm)
    fields.push({
      path: 'inputs.stromalThicknessUm',
      label: 'stromal thickness',
      unit: ' µm',
      limit: stromalThicknessUm,
      place: (inputs, value) => ({ ...inputs, stromalThicknessUm: value }),
    });
  return fields;
}

describe.each(protocols.map((protocol) => [protocol.key, protocol] as const))(
  'input limits of %s',
  (_key, protocol) => {
    it('computes a plan of finite numbers for every input inside the hard ranges, in any unit', () => {
      fc.assert(
        fc.property(validInputs(protocol), (inputs) => {
          const plan = planOrDrawnVolumeRefusal(protocol, inputs);
          if (plan === null) return;

          for (const [name, value] of Object.entries(plan)) {
            // The drawn dose's difference from the prescribed dose is signed; its size is checked below.
            if (name === 'drawnDoseDifferencePct') continue;
            if (typeof value === 'number')
              expect(Number.isFinite(value) && value >= 0, `${name} = ${value}`).toBe(true);
          }
          if (plan.drawnDoseDifferencePct !== null)
            expect(Math.abs(plan.drawnDoseDifferencePct)).toBeLessThanOrEqual(1);
        }),
        { numRuns: 60 },
      );
    });

    it.each(limitedFields(protocol).map((field) => [field.path, field] as const))(
      'refuses %s outside its hard range, naming the field and range',
      (_path, field) => {
        fc.assert(
          fc.property(validInputs(protocol), outside(field.limit), (inputs, value) => {
            let caught: unknown;
            try {
              computePlan(protocol, field.place(inputs, value));
            } catch (error) {
              caught = error;
            }

            expect(caught).toBeInstanceOf(PlanInputError);
            const problems = (caught as PlanInputError).fields;
            expect(problems.map((problem) => problem.path)).toEqual([field.path]);
            expect(problems[0]?.message).toContain(
              `${field.label} must be between ${field.limit.hard.min} and ${field.limit.hard.max}${field.unit}`,
            );
          }),
          { numRuns: 30 },
        );
      },
    );

    it('warns, and does not refuse, for a value between the soft and hard limits', () => {
      const [field] = limitedFields(protocol);
      if (!field) throw new Error('no limited field');
      fc.assert(
        fc.property(
          validInputs(protocol),
          fc.double({
            min: field.limit.hard.min,
            max: field.limit.soft.min,
            maxExcluded: true,
            noNaN: true,
          }),
          (inputs, value) => {
            const plan = planOrDrawnVolumeRefusal(protocol, field.place(inputs, value));
            if (plan === null) return;

            expect(plan.warnings).toContainEqual(
              expect.objectContaining({ code: 'soft-limit', field: field.path }),
            );
          },
        ),
        { numRuns: 30 },
      );
    });
  },
);
