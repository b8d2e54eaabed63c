import { z } from 'zod';
import { bsaFormulaNames } from '../../../../shared/engine/bsa';

/**
 * The parts of a protocol version the pharmacist works from; unknown keys are dropped, so the
 * screen sees only what it shows.
 */
const drugParametersSchema = z.object({
  key: z.string(),
  version: z.number(),
  title: z.string(),
  status: z.string(),
  definition: z.object({
    bsaFormulaDefault: z.enum(bsaFormulaNames),
    drug: z
      .object({
        name: z.string(),
        doseMgPerM2: z.number(),
        concentrationMgPerMl: z.number(),
        vialContentMg: z.number(),
        reconstitutionVolumeMl: z.number(),
        reconstitutionFluid: z.string(),
        reconstitutedVolumeMl: z.number(),
        finalVolumeMl: z.number(),
        diluent: z.string(),
        infusionMin: z.number(),
        beyondUseH: z.number(),
        syringeGraduationMl: z.number().optional(),
        withdrawableVolumeMlPerVial: z.number().optional(),
      })
      .nullable(),
    rounding: z.object({
      bsaM2: z.number(),
      doseMg: z.number(),
      volumesMl: z.number(),
      rateMlPerMin: z.number(),
    }),
    tolerances: z.object({
      drugVolumePct: z.number().nullable(),
      doseCheck: z
        .object({ bsaPct: z.number(), dosePct: z.number(), drugVolumePct: z.number() })
        .nullable(),
    }),
    cautions: z.array(z.string()),
  }),
});
export type ProtocolDrugParameters = z.infer<typeof drugParametersSchema>;

/** The pharmacist's reading of a cached protocol version (src/lib/queries/protocols.ts). */
export function drugParameters(version: unknown): ProtocolDrugParameters {
  return drugParametersSchema.parse(version);
}
