import { z } from 'zod';
import { bsaFormulaNames, bsaFormulas } from '../engine/bsa';
import {
  drugVolumeMlForDose,
  maxDrawnDoseShiftPct,
  worstDrawnDoseShiftPct,
} from '../engine/drawn-volume';
import { fluenceJPerCm2, pulsedElapsedS } from '../engine/light-arithmetic';
import { withinPct } from '../engine/tolerance';

/** Two figures that should agree (e.g. irradiance × exposure and the target fluence) may differ by this much. */
export const protocolAgreementPct = 1;

const kebabCase = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

function kebabId(field: string) {
  return z
    .string({ error: `${field} is required` })
    .regex(kebabCase, `${field} must be kebab-case (lower-case letters, digits, single hyphens)`)
    .max(64, `${field} must be at most 64 characters`);
}

function text(field: string) {
  return z
    .string({ error: `${field} is required` })
    .trim()
    .min(1, `${field} must not be empty`);
}

function positive(field: string, unitText: string) {
  const message = `${field} must be a number greater than 0 ${unitText}`.trimEnd();
  return z.number({ error: message }).positive(message);
}

function nonNegative(field: string, unitText: string) {
  const message = `${field} must be a number of at least 0 ${unitText}`.trimEnd();
  return z.number({ error: message }).min(0, message);
}

function wholePositive(field: string, unitText: string) {
  const message = `${field} must be a whole number greater than 0 ${unitText}`.trimEnd();
  return z.number({ error: message }).int(message).positive(message);
}

const rangeSchema = z
  .strictObject({
    min: z.number({ error: 'min must be a number' }),
    max: z.number({ error: 'max must be a number' }),
  })
  .refine((range) => range.min <= range.max, 'min must not exceed max');

/** Soft limits warn and need a reason; hard limits refuse. Soft must sit inside hard. */
const inputLimitSchema = z
  .strictObject({ soft: rangeSchema, hard: rangeSchema })
  .refine((limit) => limit.hard.min > 0, {
    message: 'hard.min must be greater than 0',
    path: ['hard', 'min'],
  })
  .refine((limit) => limit.soft.min >= limit.hard.min && limit.soft.max <= limit.hard.max, {
    message: 'the soft range must lie inside the hard range',
    path: ['soft'],
  });
export type InputLimit = z.infer<typeof inputLimitSchema>;

/**
 * A figure worked out from several inputs (the body-mass index) has only a usual range: each of
 * its inputs already has a hard range, and an unusual combination is for the clinician to confirm.
 */
const softOnlyLimitSchema = z
  .strictObject({ soft: rangeSchema })
  .refine((limit) => limit.soft.min > 0, {
    message: 'soft.min must be greater than 0',
    path: ['soft', 'min'],
  });
export type SoftOnlyLimit = z.infer<typeof softOnlyLimitSchema>;

/**
 * The usual adult body-mass index range for versions approved before the field existed (common
 * practice, no single source). A version without inputLimits.bmiKgPerM2 is checked against this,
 * and the warning says so; a site that wants another range publishes a new version.
 */
export const defaultBmiLimit: SoftOnlyLimit = { soft: { min: 16, max: 45 } };

export const protocolKinds = ['pdt', 'cxl'] as const;
export type ProtocolKind = (typeof protocolKinds)[number];

export const stepKinds = [
  'check',
  'infusion',
  'wait',
  'light',
  'preparation',
  'soak',
  'thickness',
  'swelling',
  'uv',
  'aftercare',
] as const;
export type StepKind = (typeof stepKinds)[number];

const stepKindsByProtocolKind: Record<ProtocolKind, readonly StepKind[]> = {
  pdt: ['check', 'infusion', 'wait', 'light', 'aftercare'],
  cxl: ['check', 'preparation', 'soak', 'thickness', 'swelling', 'wait', 'uv', 'aftercare'],
};

export const sourceStatuses = ['published', 'memory', 'practice'] as const;

const sourceSchema = z.strictObject({
  id: kebabId('sources[].id'),
  citation: text('sources[].citation'),
  /** What this source stands behind in this file. */
  supports: text('sources[].supports'),
  /** published: read in the publication; memory: recalled, unchecked; practice: common practice, no single source. */
  status: z.enum(sourceStatuses, {
    error: `sources[].status must be one of ${sourceStatuses.join(', ')}`,
  }),
});

const approvalSchema = z.strictObject({
  approvedBy: z
    .array(text('approval.approvedBy[]'))
    .min(2, 'approval.approvedBy must name at least two people (two-person approval)')
    .refine(
      (names) => new Set(names).size === names.length,
      'approval.approvedBy must name different people',
    ),
  approvedOn: z.iso.date({ error: 'approval.approvedOn must be an ISO date (YYYY-MM-DD)' }),
  note: text('approval.note'),
});

const drugSchema = z.strictObject({
  name: z.literal('verteporfin', { error: 'drug.name must be verteporfin' }),
  route: z.literal('intravenous', { error: 'drug.route must be intravenous' }),
  doseMgPerM2: positive('drug.doseMgPerM2', 'mg/m²'),
  concentrationMgPerMl: positive('drug.concentrationMgPerMl', 'mg/mL'),
  vialContentMg: positive('drug.vialContentMg', 'mg'),
  /** Fluid added to one vial. */
  reconstitutionVolumeMl: positive('drug.reconstitutionVolumeMl', 'mL'),
  reconstitutionFluid: text('drug.reconstitutionFluid'),
  /** Volume in the vial after reconstitution (the powder adds volume). */
  reconstitutedVolumeMl: positive('drug.reconstitutedVolumeMl', 'mL'),
  finalVolumeMl: positive('drug.finalVolumeMl', 'mL'),
  diluent: text('drug.diluent'),
  infusionMin: positive('drug.infusionMin', 'min'),
  beyondUseH: positive('drug.beyondUseH', 'h'),
  lightPrecautionH: positive('drug.lightPrecautionH', 'h'),
  lightPrecautionSource: text('drug.lightPrecautionSource'),
  /** The syringe's graduation: the volume to draw is rounded to it (absent in versions written before this field). */
  syringeGraduationMl: positive('drug.syringeGraduationMl', 'mL').optional(),
  /** What can really be drawn from one reconstituted vial (dead space stays behind); vials are counted from it. */
  withdrawableVolumeMlPerVial: positive('drug.withdrawableVolumeMlPerVial', 'mL').optional(),
});
export type ProtocolDrug = z.infer<typeof drugSchema>;

const pulseSchema = z.strictObject({
  onS: positive('light.pulse.onS', 's'),
  offS: positive('light.pulse.offS', 's'),
});

const lightSchema = z.strictObject({
  wavelengthNm: positive('light.wavelengthNm', 'nm'),
  irradianceMwPerCm2: positive('light.irradianceMwPerCm2', 'mW/cm²'),
  targetFluenceJPerCm2: positive('light.targetFluenceJPerCm2', 'J/cm²'),
  /** Time the light is on; for a pulsed cycle the sum of the on-periods. */
  exposureS: positive('light.exposureS', 's'),
  spotMarginUm: nonNegative('light.spotMarginUm', 'µm').nullable(),
  maxSpotUm: positive('light.maxSpotUm', 'µm').nullable(),
  pulse: pulseSchema.nullable(),
});

const timingSchema = z.strictObject({
  lightStartAfterInfusionStartMin: positive('timing.lightStartAfterInfusionStartMin', 'min'),
});

const cxlSchema = z.strictObject({
  epitheliumOff: z.boolean({ error: 'cxl.epitheliumOff must be true or false' }),
  soakMin: positive('cxl.soakMin', 'min'),
  dropIntervalSoakMin: positive('cxl.dropIntervalSoakMin', 'min'),
  dropIntervalUvMin: positive('cxl.dropIntervalUvMin', 'min'),
  minStromalThicknessUm: positive('cxl.minStromalThicknessUm', 'µm'),
  swellingAllowed: z.boolean({ error: 'cxl.swellingAllowed must be true or false' }),
  swellingDropIntervalS: positive('cxl.swellingDropIntervalS', 's').nullable(),
  riboflavin: text('cxl.riboflavin'),
  swellingRiboflavin: text('cxl.swellingRiboflavin').nullable(),
});

const roundingSchema = z.strictObject({
  bsaM2: positive('rounding.bsaM2', 'm²'),
  doseMg: positive('rounding.doseMg', 'mg'),
  volumesMl: positive('rounding.volumesMl', 'mL'),
  rateMlPerMin: positive('rounding.rateMlPerMin', 'mL/min'),
  spotUm: positive('rounding.spotUm', 'µm'),
  spotAreaCm2: positive('rounding.spotAreaCm2', 'cm²'),
  powerMw: positive('rounding.powerMw', 'mW'),
  fluenceJPerCm2: positive('rounding.fluenceJPerCm2', 'J/cm²'),
  energyJ: positive('rounding.energyJ', 'J'),
  timeS: positive('rounding.timeS', 's'),
  endothelialIrradianceMwPerCm2: positive('rounding.endothelialIrradianceMwPerCm2', 'mW/cm²'),
  endothelialDoseJPerCm2: positive('rounding.endothelialDoseJPerCm2', 'J/cm²'),
});

const inputLimitsSchema = z.strictObject({
  heightCm: inputLimitSchema,
  weightKg: inputLimitSchema,
  lesionGldUm: inputLimitSchema.nullable(),
  lensMagnification: inputLimitSchema.nullable(),
  stromalThicknessUm: inputLimitSchema.nullable(),
  /** Usual body-mass index range; absent in versions approved before it existed (see defaultBmiLimit). */
  bmiKgPerM2: softOnlyLimitSchema.optional(),
});

/** Deviation thresholds. Each is site policy, so it lives here and never in code. */
const tolerancesSchema = z.strictObject({
  /** ± seconds of light (or UV on-time) against the plan. */
  exposureS: nonNegative('tolerances.exposureS', 's'),
  /** ± percent of delivered fluence against the target. */
  fluencePct: nonNegative('tolerances.fluencePct', '%'),
  infusionDurationMin: nonNegative('tolerances.infusionDurationMin', 'min').nullable(),
  lightStartMin: nonNegative('tolerances.lightStartMin', 'min').nullable(),
  /** ± percent of drug volume prepared against the plan. */
  drugVolumePct: nonNegative('tolerances.drugVolumePct', '%').nullable(),
  reconstitutionToInfusionMaxH: positive('tolerances.reconstitutionToInfusionMaxH', 'h').nullable(),
  /** How far the pharmacist's independent figures may differ from the plan, in percent. */
  doseCheck: z
    .strictObject({
      bsaPct: nonNegative('tolerances.doseCheck.bsaPct', '%'),
      dosePct: nonNegative('tolerances.doseCheck.dosePct', '%'),
      drugVolumePct: nonNegative('tolerances.doseCheck.drugVolumePct', '%'),
    })
    .nullable(),
  /** Minutes a soak may fall short of cxl.soakMin before it is a deviation (0: none). */
  soakShortfallMin: nonNegative('tolerances.soakShortfallMin', 'min').nullable(),
  /** A gap between drops longer than the interval plus this percent is a deviation. */
  dropGapPct: nonNegative('tolerances.dropGapPct', '%').nullable(),
});

/** Where the laser's spot setting is read: the retinal spot, or the spot corrected by the lens factor. */
export const laserSpotSettings = ['retinal-spot', 'device-spot'] as const;
export type LaserSpotSetting = (typeof laserSpotSettings)[number];

/**
 * The treatment device's checks (versions 3 and later; absent in older versions): the output
 * check's tolerance, how far a setting may stray from the plan, what the laser's spot setting
 * means, and the contact lenses the protocol's factors come from.
 */
const deviceChecksSchema = z.strictObject({
  /** ± percent of the meter's reading against the value set; outside it the output check fails. */
  outputCheckTolerancePct: positive('deviceChecks.outputCheckTolerancePct', '%'),
  /** ± percent a power, irradiance or spot set on the device may differ from the plan before it is a deviation. */
  settingTolerancePct: positive('deviceChecks.settingTolerancePct', '%'),
  /** PDT: does the laser take the retinal spot, or the device spot (retinal ÷ lens factor)? Null for CXL. */
  laserSpotSetting: z
    .enum(laserSpotSettings, {
      error: `deviceChecks.laserSpotSetting must be one of ${laserSpotSettings.join(', ')}`,
    })
    .nullable(),
  /** The contact lenses whose laser-spot factors this version cites (the register holds the site's own). */
  lenses: z.array(
    z.strictObject({
      name: text('deviceChecks.lenses[].name'),
      laserSpotFactor: positive('deviceChecks.lenses[].laserSpotFactor', '(a factor)'),
      imageMagnification: positive('deviceChecks.lenses[].imageMagnification', '(a factor)'),
      source: kebabId('deviceChecks.lenses[].source'),
    }),
  ),
  /** The ids in `sources` that stand behind these values. */
  sources: z
    .array(kebabId('deviceChecks.sources[]'))
    .min(1, 'deviceChecks.sources must name a source'),
});
export type DeviceChecks = z.infer<typeof deviceChecksSchema>;

const stepSchema = z.strictObject({
  id: kebabId('steps[].id'),
  kind: z.enum(stepKinds, { error: `steps[].kind must be one of ${stepKinds.join(', ')}` }),
  title: text('steps[].title'),
  /** Null for a step that ends when the nurse says so (a check, a measurement). */
  durationS: positive('steps[].durationS', 's').nullable(),
  /** The step clock cues (e.g. a drop) at this interval. */
  cueEveryS: positive('steps[].cueEveryS', 's').optional(),
  /** A step run only in a condition, e.g. swelling when the cornea is too thin. */
  onlyIf: z
    .enum(['thickness-below-minimum'], { error: 'steps[].onlyIf must be thickness-below-minimum' })
    .optional(),
});
export type ProtocolStep = z.infer<typeof stepSchema>;

/** Measurements a checklist question can be tied to; each is read from the plan by shared/orders/readiness.ts. */
export const contraindicationMeasurements = ['stromal-thickness-below-minimum'] as const;
export type ContraindicationMeasurement = (typeof contraindicationMeasurements)[number];

const contraindicationSchema = z.strictObject({
  id: kebabId('contraindications[].id'),
  question: text('contraindications[].question'),
  /** absolute: a yes stops the order; caution: a yes needs a clinician's note. */
  severity: z.enum(['absolute', 'caution'], {
    error: 'contraindications[].severity must be absolute or caution',
  }),
  source: text('contraindications[].source'),
  /**
   * The measurement in the same order that answers this question: an answer that contradicts it
   * is refused at signing (absent in versions written before this field).
   */
  measurement: z
    .enum(contraindicationMeasurements, {
      error: `contraindications[].measurement must be one of ${contraindicationMeasurements.join(', ')}`,
    })
    .optional(),
});

/** What a follow-up counts as success, measured at one planned visit. */
export const outcomeMeasures = ['subretinal-fluid-resolved', 'kmax-increase-below'] as const;
export type OutcomeMeasure = (typeof outcomeMeasures)[number];

const followUpVisitSchema = z.strictObject({
  id: kebabId('followUp.visits[].id'),
  label: text('followUp.visits[].label'),
  /** Days after the treatment the visit is due; 0 is the baseline on the day of treatment. */
  offsetDays: z
    .number({ error: 'followUp.visits[].offsetDays must be a whole number from 0 to 730 days' })
    .int('followUp.visits[].offsetDays must be a whole number from 0 to 730 days')
    .min(0, 'followUp.visits[].offsetDays must be a whole number from 0 to 730 days')
    .max(730, 'followUp.visits[].offsetDays must be a whole number from 0 to 730 days'),
});

const followUpSchema = z.strictObject({
  visits: z.array(followUpVisitSchema).min(1, 'followUp.visits must hold at least one visit'),
  /** A visit not recorded this many days after its due date is missed (lost to follow-up). */
  visitWindowDays: wholePositive('followUp.visitWindowDays', 'days'),
  /** Patients who consent to e-mail are reminded this many days before a visit. */
  reminderDaysBefore: wholePositive('followUp.reminderDaysBefore', 'days'),
  complicationKinds: z
    .array(
      z.strictObject({
        id: kebabId('followUp.complicationKinds[].id'),
        label: text('followUp.complicationKinds[].label'),
      }),
    )
    .min(1, 'followUp.complicationKinds must hold at least one kind'),
  outcome: z.strictObject({
    measure: z.enum(outcomeMeasures, {
      error: `followUp.outcome.measure must be one of ${outcomeMeasures.join(', ')}`,
    }),
    label: text('followUp.outcome.label'),
    /** The visit the outcome is read at. */
    visitId: kebabId('followUp.outcome.visitId'),
    /** kmax-increase-below: the visit the increase is measured from, and the limit in dioptres. */
    baselineVisitId: kebabId('followUp.outcome.baselineVisitId').nullable(),
    maxIncreaseD: positive('followUp.outcome.maxIncreaseD', 'D').nullable(),
  }),
});
export type FollowUpPlan = z.infer<typeof followUpSchema>;

const protocolVersionObject = z.strictObject({
  key: kebabId('key'),
  version: wholePositive('version', ''),
  title: text('title'),
  kind: z.enum(protocolKinds, { error: `kind must be one of ${protocolKinds.join(', ')}` }),
  summary: text('summary'),
  /** Shipped files record their (demo) approvers; an imported or cloned draft has null and is approved in Luxtempo by two people. */
  approval: approvalSchema.nullable(),
  drug: drugSchema.nullable(),
  light: lightSchema,
  timing: timingSchema.nullable(),
  cxl: cxlSchema.nullable(),
  rounding: roundingSchema,
  bsaFormulaDefault: z.enum(bsaFormulaNames, {
    error: `bsaFormulaDefault must be one of ${bsaFormulaNames.join(', ')}`,
  }),
  inputLimits: inputLimitsSchema,
  tolerances: tolerancesSchema,
  retreatmentMinDays: wholePositive('retreatmentMinDays', 'days').nullable(),
  steps: z.array(stepSchema).min(1, 'steps must hold at least one step'),
  contraindications: z.array(contraindicationSchema),
  cautions: z.array(text('cautions[]')).min(1, 'cautions must hold at least one caution'),
  sources: z.array(sourceSchema).min(1, 'sources must name at least one source'),
  /** Added in version 3: the device's output check and settings (absent in older versions). */
  deviceChecks: deviceChecksSchema.optional(),
  /** Follow-up visits, complication kinds and the outcome (absent in versions before 3). */
  followUp: followUpSchema.optional(),
});
type ProtocolShape = z.infer<typeof protocolVersionObject>;
type Issue = { message: string; path: (string | number)[] };

function duplicates(values: string[]): string[] {
  return [...new Set(values.filter((value, index) => values.indexOf(value) !== index))];
}

function checkFollowUp(p: ProtocolShape, issues: Issue[]): void {
  const plan = p.followUp;
  if (!plan) return;
  const ids = plan.visits.map((visit) => visit.id);
  for (const id of duplicates(ids))
    issues.push({
      path: ['followUp', 'visits'],
      message: `followUp.visits ids must be unique (${id} repeats)`,
    });
  for (const id of duplicates(plan.complicationKinds.map((kind) => kind.id)))
    issues.push({
      path: ['followUp', 'complicationKinds'],
      message: `followUp.complicationKinds ids must be unique (${id} repeats)`,
    });
  const offsets = plan.visits.map((visit) => visit.offsetDays);
  if (offsets.some((offset, i) => i > 0 && offset <= offsets[i - 1]!))
    issues.push({
      path: ['followUp', 'visits'],
      message: 'followUp.visits must be in order of offsetDays, each later than the one before',
    });
  const { outcome } = plan;
  if (!ids.includes(outcome.visitId))
    issues.push({
      path: ['followUp', 'outcome', 'visitId'],
      message: `followUp.outcome.visitId must name one of followUp.visits (${ids.join(', ')})`,
    });
  const expected = p.kind === 'pdt' ? 'subretinal-fluid-resolved' : 'kmax-increase-below';
  if (outcome.measure !== expected)
    issues.push({
      path: ['followUp', 'outcome', 'measure'],
      message: `followUp.outcome.measure must be ${expected} for a ${p.kind} protocol`,
    });
  const needsBaseline = outcome.measure === 'kmax-increase-below';
  if (needsBaseline && (outcome.baselineVisitId === null || outcome.maxIncreaseD === null))
    issues.push({
      path: ['followUp', 'outcome'],
      message: 'kmax-increase-below needs followUp.outcome.baselineVisitId and maxIncreaseD',
    });
  if (!needsBaseline && (outcome.baselineVisitId !== null || outcome.maxIncreaseD !== null))
    issues.push({
      path: ['followUp', 'outcome'],
      message: `followUp.outcome.baselineVisitId and maxIncreaseD must be null for ${outcome.measure}`,
    });
  if (outcome.baselineVisitId !== null && !ids.includes(outcome.baselineVisitId))
    issues.push({
      path: ['followUp', 'outcome', 'baselineVisitId'],
      message: `followUp.outcome.baselineVisitId must name one of followUp.visits (${ids.join(', ')})`,
    });
}

function checkCommon(p: ProtocolShape, issues: Issue[]): void {
  checkFollowUp(p, issues);
  const fluenceFromTime = fluenceJPerCm2(p.light.irradianceMwPerCm2, p.light.exposureS);
  if (!withinPct(fluenceFromTime, p.light.targetFluenceJPerCm2, protocolAgreementPct)) {
    issues.push({
      path: ['light', 'exposureS'],
      message: `light.irradianceMwPerCm2 × light.exposureS gives ${fluenceFromTime} J/cm², more than ${protocolAgreementPct}% from light.targetFluenceJPerCm2 (${p.light.targetFluenceJPerCm2} J/cm²)`,
    });
  }
  for (const [field, values] of [
    ['steps', p.steps.map((step) => step.id)],
    ['sources', p.sources.map((source) => source.id)],
    ['contraindications', p.contraindications.map((item) => item.id)],
  ] as const) {
    for (const id of duplicates(values))
      issues.push({ path: [field], message: `${field} ids must be unique (${id} repeats)` });
  }
  p.contraindications.forEach((item, index) => {
    if (item.measurement !== undefined && p.kind !== 'cxl') {
      issues.push({
        path: ['contraindications', index, 'measurement'],
        message: `contraindications[].measurement ${item.measurement} applies to a cxl protocol only`,
      });
    }
  });
  checkDeviceChecks(p, issues);
  const allowedKinds = stepKindsByProtocolKind[p.kind];
  p.steps.forEach((step, index) => {
    if (!allowedKinds.includes(step.kind)) {
      issues.push({
        path: ['steps', index, 'kind'],
        message: `a ${p.kind} protocol cannot have a ${step.kind} step (allowed: ${allowedKinds.join(', ')})`,
      });
    }
  });
}

/** The device checks name sources the file holds; a PDT laser says how its spot is set, a UV source does not. */
function checkDeviceChecks(p: ProtocolShape, issues: Issue[]): void {
  const checks = p.deviceChecks;
  if (checks === undefined) return;
  const ids = new Set(p.sources.map((source) => source.id));
  const named = [
    ...checks.sources.map((id, index) => ({ id, path: ['deviceChecks', 'sources', index] })),
    ...checks.lenses.map((lens, index) => ({
      id: lens.source,
      path: ['deviceChecks', 'lenses', index, 'source'],
    })),
  ];
  for (const { id, path } of named)
    if (!ids.has(id))
      issues.push({ path, message: `${path.join('.')} names ${id}, which is not in sources` });
  if ((checks.laserSpotSetting === null) !== (p.kind === 'cxl'))
    issues.push({
      path: ['deviceChecks', 'laserSpotSetting'],
      message:
        p.kind === 'cxl'
          ? 'deviceChecks.laserSpotSetting must be null for a cxl protocol'
          : 'deviceChecks.laserSpotSetting is required for a pdt protocol (retinal-spot or device-spot)',
    });
  if (p.kind === 'cxl' && checks.lenses.length > 0)
    issues.push({
      path: ['deviceChecks', 'lenses'],
      message: 'deviceChecks.lenses must be empty for a cxl protocol',
    });
}

/** Fields that must be present for one kind and absent for the other. */
function checkKindFields(p: ProtocolShape, issues: Issue[]): void {
  const isPdt = p.kind === 'pdt';
  const presence: [path: (string | number)[], present: boolean][] = [
    [['drug'], p.drug !== null],
    [['timing'], p.timing !== null],
    [['light', 'spotMarginUm'], p.light.spotMarginUm !== null],
    [['light', 'maxSpotUm'], p.light.maxSpotUm !== null],
    [['inputLimits', 'lesionGldUm'], p.inputLimits.lesionGldUm !== null],
    [['inputLimits', 'lensMagnification'], p.inputLimits.lensMagnification !== null],
    [['tolerances', 'infusionDurationMin'], p.tolerances.infusionDurationMin !== null],
    [['tolerances', 'lightStartMin'], p.tolerances.lightStartMin !== null],
    [['tolerances', 'drugVolumePct'], p.tolerances.drugVolumePct !== null],
    [
      ['tolerances', 'reconstitutionToInfusionMaxH'],
      p.tolerances.reconstitutionToInfusionMaxH !== null,
    ],
    [['tolerances', 'doseCheck'], p.tolerances.doseCheck !== null],
  ];
  const cxlPresence: [path: (string | number)[], present: boolean][] = [
    [['cxl'], p.cxl !== null],
    [['inputLimits', 'stromalThicknessUm'], p.inputLimits.stromalThicknessUm !== null],
    [['tolerances', 'soakShortfallMin'], p.tolerances.soakShortfallMin !== null],
    [['tolerances', 'dropGapPct'], p.tolerances.dropGapPct !== null],
  ];
  for (const [path, present] of presence) {
    if (isPdt && !present)
      issues.push({ path, message: `${path.join('.')} is required for a pdt protocol` });
    if (!isPdt && present)
      issues.push({ path, message: `${path.join('.')} must be null for a cxl protocol` });
  }
  for (const [path, present] of cxlPresence) {
    if (!isPdt && !present)
      issues.push({ path, message: `${path.join('.')} is required for a cxl protocol` });
    if (isPdt && present)
      issues.push({ path, message: `${path.join('.')} must be null for a pdt protocol` });
  }
  if (isPdt && p.light.pulse !== null)
    issues.push({
      path: ['light', 'pulse'],
      message: 'light.pulse must be null for a pdt protocol',
    });
}

function stepIndex(p: ProtocolShape, kind: StepKind): number {
  return p.steps.findIndex((step) => step.kind === kind);
}

function checkPdt(p: ProtocolShape, issues: Issue[]): void {
  const { drug, timing } = p;
  const { spotMarginUm, maxSpotUm } = p.light;
  if (drug === null || timing === null || spotMarginUm === null || maxSpotUm === null) return;

  const concentrationFromVial = drug.vialContentMg / drug.reconstitutedVolumeMl;
  if (!withinPct(concentrationFromVial, drug.concentrationMgPerMl, protocolAgreementPct)) {
    issues.push({
      path: ['drug', 'concentrationMgPerMl'],
      message: `drug.vialContentMg ÷ drug.reconstitutedVolumeMl gives ${concentrationFromVial} mg/mL, more than ${protocolAgreementPct}% from drug.concentrationMgPerMl (${drug.concentrationMgPerMl} mg/mL)`,
    });
  }
  if (
    drug.withdrawableVolumeMlPerVial !== undefined &&
    drug.withdrawableVolumeMlPerVial > drug.reconstitutedVolumeMl
  ) {
    issues.push({
      path: ['drug', 'withdrawableVolumeMlPerVial'],
      message: 'drug.withdrawableVolumeMlPerVial cannot exceed drug.reconstitutedVolumeMl',
    });
  }
  if (drug.reconstitutionVolumeMl > drug.reconstitutedVolumeMl) {
    issues.push({
      path: ['drug', 'reconstitutionVolumeMl'],
      message: 'drug.reconstitutionVolumeMl cannot exceed drug.reconstitutedVolumeMl',
    });
  }
  // The largest patient the hard limits admit must still fit the final volume, so that a valid
  // input can never produce a negative diluent volume.
  const { heightCm, weightKg } = p.inputLimits;
  const largestBsaM2 = Math.max(
    ...bsaFormulaNames.map((name) => bsaFormulas[name].bsaM2(heightCm.hard.max, weightKg.hard.max)),
  );
  const largestDrugVolumeMl = drugVolumeMlForDose(
    drug.doseMgPerM2 * largestBsaM2,
    drug.concentrationMgPerMl,
  );
  if (largestDrugVolumeMl > drug.finalVolumeMl) {
    issues.push({
      path: ['drug', 'finalVolumeMl'],
      message: `drug.finalVolumeMl (${drug.finalVolumeMl} mL) is smaller than the drug volume for the largest patient the hard limits admit (${largestDrugVolumeMl.toFixed(1)} mL)`,
    });
  }
  // The syringe graduation must keep the drawn dose within the engine's limit even for the
  // smallest patient the hard limits admit.
  if (drug.syringeGraduationMl !== undefined) {
    const smallestBsaM2 = Math.min(
      ...bsaFormulaNames.map((name) =>
        bsaFormulas[name].bsaM2(heightCm.hard.min, weightKg.hard.min),
      ),
    );
    const smallestDrugVolumeMl = drugVolumeMlForDose(
      drug.doseMgPerM2 * smallestBsaM2,
      drug.concentrationMgPerMl,
    );
    const worstPct = worstDrawnDoseShiftPct(drug.syringeGraduationMl, smallestDrugVolumeMl);
    if (worstPct > maxDrawnDoseShiftPct) {
      issues.push({
        path: ['drug', 'syringeGraduationMl'],
        message: `drug.syringeGraduationMl (${drug.syringeGraduationMl} mL) can move the dose in the syringe by ${worstPct.toFixed(2)}% for the smallest patient the hard limits admit (${smallestDrugVolumeMl.toFixed(2)} mL); at most ${maxDrawnDoseShiftPct}% is allowed`,
      });
    }
  }
  if (timing.lightStartAfterInfusionStartMin < drug.infusionMin) {
    issues.push({
      path: ['timing', 'lightStartAfterInfusionStartMin'],
      message:
        'timing.lightStartAfterInfusionStartMin cannot be earlier than the end of the infusion (drug.infusionMin)',
    });
  }
  const maxReconstitutionH = p.tolerances.reconstitutionToInfusionMaxH;
  if (maxReconstitutionH !== null && maxReconstitutionH > drug.beyondUseH) {
    issues.push({
      path: ['tolerances', 'reconstitutionToInfusionMaxH'],
      message: 'tolerances.reconstitutionToInfusionMaxH cannot exceed drug.beyondUseH',
    });
  }
  const gld = p.inputLimits.lesionGldUm;
  if (gld !== null && gld.hard.max + spotMarginUm > maxSpotUm) {
    issues.push({
      path: ['inputLimits', 'lesionGldUm', 'hard', 'max'],
      message: `inputLimits.lesionGldUm.hard.max + light.spotMarginUm (${gld.hard.max + spotMarginUm} µm) exceeds light.maxSpotUm (${maxSpotUm} µm)`,
    });
  }

  const infusion = stepIndex(p, 'infusion');
  const light = stepIndex(p, 'light');
  if (infusion < 0 || light < 0 || light < infusion) {
    issues.push({
      path: ['steps'],
      message: 'a pdt protocol needs an infusion step followed later by a light step',
    });
    return;
  }
  const infusionStep = p.steps[infusion];
  if (infusionStep && infusionStep.durationS !== drug.infusionMin * 60) {
    issues.push({
      path: ['steps', infusion, 'durationS'],
      message: `the infusion step must last drug.infusionMin × 60 = ${drug.infusionMin * 60} s`,
    });
  }
  const lightStep = p.steps[light];
  if (lightStep && lightStep.durationS !== p.light.exposureS) {
    issues.push({
      path: ['steps', light, 'durationS'],
      message: `the light step must last light.exposureS = ${p.light.exposureS} s`,
    });
  }
  const beforeLightS = p.steps
    .slice(infusion, light)
    .reduce((sum, step) => sum + (step.durationS ?? Number.NaN), 0);
  if (beforeLightS !== timing.lightStartAfterInfusionStartMin * 60) {
    issues.push({
      path: ['steps'],
      message: `the timed steps from the infusion to the light must add up to timing.lightStartAfterInfusionStartMin × 60 = ${timing.lightStartAfterInfusionStartMin * 60} s (they give ${beforeLightS} s)`,
    });
  }
}

function checkCxl(p: ProtocolShape, issues: Issue[]): void {
  const { cxl } = p;
  if (cxl === null) return;
  if (
    cxl.swellingAllowed !== (cxl.swellingDropIntervalS !== null) ||
    cxl.swellingAllowed !== (cxl.swellingRiboflavin !== null)
  ) {
    issues.push({
      path: ['cxl', 'swellingDropIntervalS'],
      message:
        'cxl.swellingDropIntervalS and cxl.swellingRiboflavin are required when cxl.swellingAllowed is true, and must be null otherwise',
    });
  }
  const thicknessLimit = p.inputLimits.stromalThicknessUm;
  if (
    thicknessLimit !== null &&
    (cxl.minStromalThicknessUm < thicknessLimit.hard.min ||
      cxl.minStromalThicknessUm > thicknessLimit.hard.max)
  ) {
    issues.push({
      path: ['cxl', 'minStromalThicknessUm'],
      message: 'cxl.minStromalThicknessUm must lie inside inputLimits.stromalThicknessUm.hard',
    });
  }
  const shortfall = p.tolerances.soakShortfallMin;
  if (shortfall !== null && shortfall >= cxl.soakMin) {
    issues.push({
      path: ['tolerances', 'soakShortfallMin'],
      message: 'tolerances.soakShortfallMin must be less than cxl.soakMin',
    });
  }

  const soak = stepIndex(p, 'soak');
  const thickness = stepIndex(p, 'thickness');
  const uv = stepIndex(p, 'uv');
  if (soak < 0 || thickness < 0 || uv < 0 || !(soak < thickness && thickness < uv)) {
    issues.push({
      path: ['steps'],
      message: 'a cxl protocol needs a soak step, then a thickness step, then a uv step',
    });
    return;
  }
  const soakStep = p.steps[soak];
  if (
    soakStep &&
    (soakStep.durationS !== cxl.soakMin * 60 || soakStep.cueEveryS !== cxl.dropIntervalSoakMin * 60)
  ) {
    issues.push({
      path: ['steps', soak],
      message: `the soak step must last cxl.soakMin × 60 = ${cxl.soakMin * 60} s with a cue every cxl.dropIntervalSoakMin × 60 = ${cxl.dropIntervalSoakMin * 60} s`,
    });
  }
  const uvStep = p.steps[uv];
  const uvElapsedS = pulsedElapsedS(p.light.exposureS, p.light.pulse);
  if (
    uvStep &&
    (uvStep.durationS !== uvElapsedS || uvStep.cueEveryS !== cxl.dropIntervalUvMin * 60)
  ) {
    issues.push({
      path: ['steps', uv],
      message: `the uv step must last the elapsed UV time ${uvElapsedS} s with a cue every cxl.dropIntervalUvMin × 60 = ${cxl.dropIntervalUvMin * 60} s`,
    });
  }
  const swelling = stepIndex(p, 'swelling');
  const swellingStep = p.steps[swelling];
  if (cxl.swellingAllowed) {
    if (!swellingStep || swelling < thickness || swelling > uv) {
      issues.push({
        path: ['steps'],
        message:
          'cxl.swellingAllowed needs a swelling step between the thickness step and the uv step',
      });
    } else if (
      swellingStep.onlyIf !== 'thickness-below-minimum' ||
      swellingStep.cueEveryS !== cxl.swellingDropIntervalS
    ) {
      issues.push({
        path: ['steps', swelling],
        message:
          'the swelling step must run only if the thickness is below the minimum, with a cue every cxl.swellingDropIntervalS',
      });
    }
  } else if (swellingStep) {
    issues.push({
      path: ['steps', swelling],
      message: 'a swelling step needs cxl.swellingAllowed to be true',
    });
  }
}

/** One protocol version as shipped in protocols/<key>.v<version>.json. */
export const protocolVersionSchema = protocolVersionObject.superRefine((protocol, ctx) => {
  const issues: Issue[] = [];
  checkCommon(protocol, issues);
  checkKindFields(protocol, issues);
  if (protocol.kind === 'pdt') checkPdt(protocol, issues);
  else checkCxl(protocol, issues);
  for (const issue of issues)
    ctx.addIssue({ code: 'custom', message: issue.message, path: issue.path });
});
export type ProtocolVersion = z.infer<typeof protocolVersionSchema>;

/** The file name a protocol version is shipped under. */
export function protocolFileName(protocol: { key: string; version: number }): string {
  return `${protocol.key}.v${protocol.version}.json`;
}
