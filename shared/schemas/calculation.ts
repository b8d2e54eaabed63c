import { z } from 'zod';
import { bsaFormulaNames } from '../engine/bsa';

// Unit names live here, not beside the converters, so that importing a schema never loads mathjs.
export const heightUnits = ['cm', 'in', 'm'] as const;
export type HeightUnit = (typeof heightUnits)[number];
export const weightUnits = ['kg', 'lb'] as const;
export type WeightUnit = (typeof weightUnits)[number];

/**
 * A measured number: finite and above zero. The protocol's own ranges are checked by the
 * engine, which knows them; this is only the shape every protocol shares.
 */
function positiveNumber(field: string, unitText: string) {
  const range = `${field} must be a number greater than 0${unitText ? ` ${unitText}` : ''}`;
  return z.number({ error: range }).positive(range);
}

export const planInputsSchema = z.strictObject(
  {
    height: z
      .strictObject(
        {
          value: positiveNumber('height.value', 'in the unit given'),
          unit: z.enum(heightUnits, {
            error: `height.unit must be one of ${heightUnits.join(', ')}`,
          }),
        },
        { error: 'height must be an object { value, unit }' },
      )
      .optional(),
    weight: z
      .strictObject(
        {
          value: positiveNumber('weight.value', 'in the unit given'),
          unit: z.enum(weightUnits, {
            error: `weight.unit must be one of ${weightUnits.join(', ')}`,
          }),
        },
        { error: 'weight must be an object { value, unit }' },
      )
      .optional(),
    bsaFormula: z
      .enum(bsaFormulaNames, { error: `bsaFormula must be one of ${bsaFormulaNames.join(', ')}` })
      .optional(),
    lesionGldUm: positiveNumber('lesionGldUm', 'µm').optional(),
    lensMagnification: positiveNumber('lensMagnification', '(a factor)').optional(),
    /** An order's lens from the register: the server puts its laser-spot factor in lensMagnification. */
    lensId: z
      .number({ error: 'lensId must be the id of a lens on the register' })
      .int('lensId must be the id of a lens on the register')
      .positive('lensId must be the id of a lens on the register')
      .optional(),
    stromalThicknessUm: positiveNumber('stromalThicknessUm', 'µm').optional(),
  },
  { error: 'inputs must be an object of measurements' },
);
export type PlanInputs = z.infer<typeof planInputsSchema>;

export const calculationRequestSchema = z.strictObject({
  protocol: z.strictObject(
    {
      key: z
        .string({ error: 'protocol.key is required' })
        .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'protocol.key must be kebab-case, e.g. pdt-standard')
        .max(64, 'protocol.key must be at most 64 characters'),
      version: z
        .number({ error: 'protocol.version must be a whole number of at least 1' })
        .int('protocol.version must be a whole number of at least 1')
        .min(1, 'protocol.version must be a whole number of at least 1')
        .optional(),
    },
    { error: 'protocol must be an object { key, version? }' },
  ),
  inputs: planInputsSchema,
});
export type CalculationRequest = z.infer<typeof calculationRequestSchema>;

/** The stand-alone light calculator: any consistent subset of these, each above zero. */
export const lightCalculationRequestSchema = z.strictObject(
  {
    powerMw: positiveNumber('powerMw', 'mW').optional(),
    spotDiameterUm: positiveNumber('spotDiameterUm', 'µm').optional(),
    irradianceMwPerCm2: positiveNumber('irradianceMwPerCm2', 'mW/cm²').optional(),
    exposureS: positiveNumber('exposureS', 's').optional(),
    fluenceJPerCm2: positiveNumber('fluenceJPerCm2', 'J/cm²').optional(),
    energyJ: positiveNumber('energyJ', 'J').optional(),
  },
  { error: 'the light calculation must be an object of measurements' },
);
export type LightCalculationRequest = z.infer<typeof lightCalculationRequestSchema>;

const quantitySchema = z.object({ value: z.number(), unit: z.string() });

/** One line of the working: how a value was reached, from what, on whose authority. */
export const workingEntrySchema = z.object({
  name: z.string(),
  /** The exact value before rounding. */
  value: z.number(),
  unit: z.string(),
  formula: z.string(),
  inputs: z.record(z.string(), quantitySchema),
  source: z.string(),
  /** Present when the protocol rounds this value; `value` here is what the plan uses. */
  rounded: z.object({ value: z.number(), step: z.number() }).optional(),
});
export type WorkingEntry = z.infer<typeof workingEntrySchema>;

export const planWarningSchema = z.object({
  code: z.string(),
  message: z.string(),
  field: z.string().optional(),
});
export type PlanWarning = z.infer<typeof planWarningSchema>;

const nullableNumber = z.number().nullable();

/** The frozen result of one calculation. Fields a protocol kind does not use are null. */
export const dosePlanSchema = z.object({
  engineVersion: z.string(),
  protocol: z.object({ key: z.string(), version: z.number().int() }),
  bsaFormula: z.enum(bsaFormulaNames).nullable(),
  bsaM2: nullableNumber,
  /** Absent in plans frozen before the engine worked it out. */
  bmiKgPerM2: nullableNumber.optional(),
  doseMg: nullableNumber,
  drugVolumeMl: nullableNumber,
  diluentVolumeMl: nullableNumber,
  /** The dose the drawn (rounded) volume holds, and its difference from doseMg in percent; null in plans made before engine 1.1.0. */
  drawnDoseMg: nullableNumber.default(null),
  drawnDoseDifferencePct: nullableNumber.default(null),
  vials: z.number().int().nullable(),
  /** Reconstituted drug left in the vials after drawing; null in plans made before engine 1.1.0. */
  drugLeftOverMl: nullableNumber.default(null),
  drugLeftOverMg: nullableNumber.default(null),
  infusionRateMlPerMin: nullableNumber,
  spotDiameterUm: nullableNumber,
  deviceSpotDiameterUm: nullableNumber,
  spotAreaCm2: nullableNumber,
  powerMw: nullableNumber,
  irradianceMwPerCm2: nullableNumber,
  exposureS: nullableNumber,
  fluenceJPerCm2: nullableNumber,
  energyJ: nullableNumber,
  lightStartAfterInfusionStartS: nullableNumber,
  infusionEndAfterStartS: nullableNumber,
  lightEndAfterInfusionStartS: nullableNumber,
  uvTimeS: nullableNumber,
  uvElapsedS: nullableNumber,
  endothelialIrradianceMwPerCm2: nullableNumber,
  endothelialDoseJPerCm2: nullableNumber,
  thicknessOk: z.boolean().nullable(),
  warnings: z.array(planWarningSchema),
  working: z.array(workingEntrySchema),
});
export type DosePlan = z.infer<typeof dosePlanSchema>;

export const lightSolutionSchema = z.object({
  engineVersion: z.string(),
  /** Each figure, or null when the given ones do not fix it (two figures answer only what they tie). */
  powerMw: z.number().nullable(),
  spotDiameterUm: z.number().nullable(),
  spotAreaCm2: z.number().nullable(),
  irradianceMwPerCm2: z.number().nullable(),
  exposureS: z.number().nullable(),
  fluenceJPerCm2: z.number().nullable(),
  energyJ: z.number().nullable(),
  /** Which of the six fields were given rather than worked out. */
  given: z.array(z.string()),
  working: z.array(workingEntrySchema),
});
export type LightSolution = z.infer<typeof lightSolutionSchema>;
