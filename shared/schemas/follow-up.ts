import { z } from 'zod';
import { acuityNotations } from '../engine/visual-acuity';

/**
 * Follow-up visits, complications and outcomes: what the API takes and gives. The plausible
 * ranges below refuse a slip of the keyboard (a Kmax of 470 D, a CST of 25 µm); they are not
 * clinical thresholds (common practice, no single source).
 */
export const followUpRanges = {
  centralSubfieldThicknessUm: { min: 100, max: 1500 },
  kmaxD: { min: 35, max: 90 },
  thinnestPachymetryUm: { min: 200, max: 800 },
  endothelialCellsPerMm2: { min: 300, max: 4500 },
  /** Corneal haze graded 0 (clear) to 4 (dense) (from memory: a common 0–4 slit-lamp scale). */
  hazeGrade: { min: 0, max: 4 },
} as const;

export const subretinalFluidStates = ['present', 'resolved'] as const;
export const leakageStates = ['none', 'present', 'not-done'] as const;
export const retreatmentDecisions = ['retreat', 'observe', 'discharge'] as const;
export type RetreatmentDecision = (typeof retreatmentDecisions)[number];
export const complicationSeverities = ['mild', 'moderate', 'severe'] as const;
export const complicationOutcomes = [
  'resolved',
  'resolving',
  'ongoing',
  'resolved-with-sequelae',
] as const;

function measure(field: string, range: { min: number; max: number }, unit: string, whole = true) {
  const message = `${field} must be ${whole ? 'a whole number ' : ''}from ${range.min} to ${range.max}${unit ? ` ${unit}` : ''}`;
  const base = z.number({ error: message }).min(range.min, message).max(range.max, message);
  return whole ? base.int(message) : base;
}

const localDate = (field: string) => z.iso.date({ error: `${field} must be a date (YYYY-MM-DD)` });

const note = z
  .string({ error: 'note must be text' })
  .trim()
  .max(1000, 'note must be at most 1000 characters')
  .nullable()
  .optional();

export const acuityEntrySchema = z.strictObject({
  notation: z.enum(acuityNotations, {
    error: `acuity.notation must be one of ${acuityNotations.join(', ')}`,
  }),
  value: z
    .string({ error: 'acuity.value must be text' })
    .max(20, 'acuity.value must be at most 20 characters'),
});

export const pdtFindingsSchema = z.strictObject({
  centralSubfieldThicknessUm: measure(
    'pdt.centralSubfieldThicknessUm',
    followUpRanges.centralSubfieldThicknessUm,
    'µm',
  ),
  subretinalFluid: z.enum(subretinalFluidStates, {
    error: 'pdt.subretinalFluid must be present or resolved',
  }),
  leakage: z.enum(leakageStates, { error: 'pdt.leakage must be none, present or not-done' }),
  retreatmentDecision: z.enum(retreatmentDecisions, {
    error: 'pdt.retreatmentDecision must be retreat, observe or discharge',
  }),
});

export const cxlFindingsSchema = z.strictObject({
  kmaxD: measure('cxl.kmaxD', followUpRanges.kmaxD, 'D', false),
  thinnestPachymetryUm: measure(
    'cxl.thinnestPachymetryUm',
    followUpRanges.thinnestPachymetryUm,
    'µm',
  ),
  endothelialCellsPerMm2: measure(
    'cxl.endothelialCellsPerMm2',
    followUpRanges.endothelialCellsPerMm2,
    'cells/mm²',
  ).nullable(),
  hazeGrade: measure('cxl.hazeGrade', followUpRanges.hazeGrade, ''),
});

/** One visit as the clinician records it: the findings of the treatment's kind, and only those. */
export const recordVisitSchema = z.strictObject({
  seenOn: localDate('seenOn'),
  acuity: acuityEntrySchema,
  pdt: pdtFindingsSchema.optional(),
  cxl: cxlFindingsSchema.optional(),
  note,
});
export type RecordVisit = z.infer<typeof recordVisitSchema>;

export const recordComplicationSchema = z.strictObject({
  orderId: z.number({ error: 'orderId must be an order id' }).int().positive(),
  followUpVisitId: z
    .number({ error: 'followUpVisitId must be a visit id' })
    .int()
    .positive()
    .nullable()
    .optional(),
  kind: z.string({ error: 'kind is required' }).max(64, 'kind must be at most 64 characters'),
  severity: z.enum(complicationSeverities, {
    error: 'severity must be mild, moderate or severe',
  }),
  onsetOn: localDate('onsetOn'),
  outcome: z.enum(complicationOutcomes, {
    error: `outcome must be one of ${complicationOutcomes.join(', ')}`,
  }),
  note,
});
export type RecordComplication = z.infer<typeof recordComplicationSchema>;

const month = (field: string) =>
  z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, `${field} must be a month (YYYY-MM)`);

export const outcomesQuerySchema = z.strictObject({
  from: month('from').optional(),
  to: month('to').optional(),
  protocol: z
    .string()
    .regex(/^[a-z0-9-]{1,64}$/, 'protocol must be a protocol key')
    .optional(),
});
export type OutcomesQuery = z.infer<typeof outcomesQuerySchema>;
