import type { JsonLeaf } from '../../../../shared/protocol/diff-versions';
import { formatDurationS, formatFigure } from './protocol-labels';

/**
 * What each field of a protocol version is called on screen, with its unit in the label: one
 * table, read by the version page (definition-sections.tsx) and the compare screen, so the two
 * never name a figure differently. Paths are the definition's JSON paths with list positions
 * written `[]`; `shown` says how a value reads when it is not a plain figure or text.
 */
type FieldWords = { label: string; section: string; shown?: 'duration' | 'yes-no' };

const general = 'General';
const drug = 'Drug';
const light = 'Light';
const timing = 'Timing';
const crossLinking = 'Cross-linking';
const rounding = 'Rounding';
const limits = 'Input limits';
const tolerances = 'Tolerances';
const steps = 'Steps of the step clock';
const contraindications = 'Contraindication checklist';
const cautions = 'Cautions';
const sources = 'Sources';
const deviceChecks = 'Device checks';
const followUp = 'Follow-up and outcome';

export const protocolFieldLabels = {
  key: { label: 'Protocol key', section: general },
  version: { label: 'Version', section: general },
  title: { label: 'Title', section: general },
  kind: { label: 'Kind', section: general },
  summary: { label: 'Summary', section: general },
  bsaFormulaDefault: { label: 'Default BSA formula', section: general },
  retreatmentMinDays: { label: 'Shortest interval before re-treatment (days)', section: general },

  drug: { label: 'Drug', section: drug },
  'drug.name': { label: 'Drug', section: drug },
  'drug.route': { label: 'Route', section: drug },
  'drug.doseMgPerM2': { label: 'Dose (mg/m² of body surface area)', section: drug },
  'drug.concentrationMgPerMl': {
    label: 'Concentration after reconstitution (mg/mL)',
    section: drug,
  },
  'drug.vialContentMg': { label: 'Content of one vial (mg)', section: drug },
  'drug.reconstitutionVolumeMl': { label: 'Fluid added to one vial (mL)', section: drug },
  'drug.reconstitutionFluid': { label: 'Reconstitution fluid', section: drug },
  'drug.reconstitutedVolumeMl': {
    label: 'Volume in the vial after reconstitution (mL)',
    section: drug,
  },
  'drug.finalVolumeMl': { label: 'Final volume to infuse (mL)', section: drug },
  'drug.diluent': { label: 'Diluent', section: drug },
  'drug.infusionMin': { label: 'Infusion time (min)', section: drug },
  'drug.beyondUseH': { label: 'Use within, after reconstitution (h)', section: drug },
  'drug.lightPrecautionH': { label: 'Light precautions after the infusion (h)', section: drug },
  'drug.lightPrecautionSource': { label: 'Light precaution period: source', section: drug },
  'drug.syringeGraduationMl': {
    label: 'Syringe graduation the drug volume is rounded to (mL)',
    section: drug,
  },
  'drug.withdrawableVolumeMlPerVial': {
    label: 'Volume that can be drawn from one vial (mL)',
    section: drug,
  },

  'light.wavelengthNm': { label: 'Wavelength (nm)', section: light },
  'light.irradianceMwPerCm2': { label: 'Irradiance (mW/cm²)', section: light },
  'light.targetFluenceJPerCm2': { label: 'Target fluence (J/cm²)', section: light },
  'light.exposureS': { label: 'Light-on time (s)', section: light, shown: 'duration' },
  'light.spotMarginUm': { label: 'Margin added to the lesion GLD (µm)', section: light },
  'light.maxSpotUm': { label: 'Largest spot allowed (µm)', section: light },
  'light.pulse': { label: 'Pulsed cycle, on / off (s)', section: light },
  'light.pulse.onS': { label: 'Pulsed cycle: light on (s)', section: light },
  'light.pulse.offS': { label: 'Pulsed cycle: light off (s)', section: light },

  timing: { label: 'Timing', section: timing },
  'timing.lightStartAfterInfusionStartMin': {
    label: 'Light starts after the start of the infusion (min)',
    section: timing,
  },

  cxl: { label: 'Cross-linking settings', section: crossLinking },
  'cxl.epitheliumOff': { label: 'Epithelium removed', section: crossLinking, shown: 'yes-no' },
  'cxl.riboflavin': { label: 'Riboflavin', section: crossLinking },
  'cxl.soakMin': { label: 'Soak time (min)', section: crossLinking },
  'cxl.dropIntervalSoakMin': { label: 'Drop every, during the soak (min)', section: crossLinking },
  'cxl.dropIntervalUvMin': { label: 'Drop every, during UV (min)', section: crossLinking },
  'cxl.minStromalThicknessUm': { label: 'Minimum stromal thickness (µm)', section: crossLinking },
  'cxl.swellingAllowed': {
    label: 'Swelling of a thin cornea allowed',
    section: crossLinking,
    shown: 'yes-no',
  },
  'cxl.swellingDropIntervalS': { label: 'Swelling drop every (s)', section: crossLinking },
  'cxl.swellingRiboflavin': { label: 'Swelling riboflavin', section: crossLinking },

  'rounding.bsaM2': { label: 'BSA (m²)', section: rounding },
  'rounding.doseMg': { label: 'Dose (mg)', section: rounding },
  'rounding.volumesMl': { label: 'Volumes (mL)', section: rounding },
  'rounding.rateMlPerMin': { label: 'Infusion rate (mL/min)', section: rounding },
  'rounding.spotUm': { label: 'Spot diameter (µm)', section: rounding },
  'rounding.spotAreaCm2': { label: 'Spot area (cm²)', section: rounding },
  'rounding.powerMw': { label: 'Power (mW)', section: rounding },
  'rounding.fluenceJPerCm2': { label: 'Fluence (J/cm²)', section: rounding },
  'rounding.energyJ': { label: 'Energy (J)', section: rounding },
  'rounding.timeS': { label: 'Times (s)', section: rounding },
  'rounding.endothelialIrradianceMwPerCm2': {
    label: 'Endothelial irradiance (mW/cm²)',
    section: rounding,
  },
  'rounding.endothelialDoseJPerCm2': { label: 'Endothelial dose (J/cm²)', section: rounding },

  'inputLimits.heightCm': { label: 'Height (cm)', section: limits },
  'inputLimits.weightKg': { label: 'Weight (kg)', section: limits },
  'inputLimits.bmiKgPerM2': { label: 'Body-mass index (kg/m²)', section: limits },
  'inputLimits.lesionGldUm': {
    label: 'Lesion greatest linear dimension, GLD (µm)',
    section: limits,
  },
  'inputLimits.lensMagnification': {
    label: 'Contact lens spot magnification (×)',
    section: limits,
  },
  'inputLimits.stromalThicknessUm': { label: 'Stromal thickness (µm)', section: limits },

  'tolerances.exposureS': { label: 'Light-on time (± s)', section: tolerances },
  'tolerances.fluencePct': { label: 'Delivered fluence (± %)', section: tolerances },
  'tolerances.infusionDurationMin': { label: 'Infusion duration (± min)', section: tolerances },
  'tolerances.lightStartMin': { label: 'Light start (± min)', section: tolerances },
  'tolerances.drugVolumePct': { label: 'Drug volume prepared (± %)', section: tolerances },
  'tolerances.reconstitutionToInfusionMaxH': {
    label: 'Reconstitution to infusion, at most (h)',
    section: tolerances,
  },
  'tolerances.doseCheck': { label: 'Pharmacist’s blind dose check', section: tolerances },
  'tolerances.doseCheck.bsaPct': { label: 'Blind dose check: BSA (± %)', section: tolerances },
  'tolerances.doseCheck.dosePct': { label: 'Blind dose check: dose (± %)', section: tolerances },
  'tolerances.doseCheck.drugVolumePct': {
    label: 'Blind dose check: drug volume (± %)',
    section: tolerances,
  },
  'tolerances.soakShortfallMin': { label: 'Soak may fall short by (min)', section: tolerances },
  'tolerances.dropGapPct': {
    label: 'Gap between drops beyond the interval (%)',
    section: tolerances,
  },

  deviceChecks: { label: 'Device checks', section: deviceChecks },
  'deviceChecks.outputCheckTolerancePct': {
    label: 'Output check: meter reading against the value set (± %)',
    section: deviceChecks,
  },
  'deviceChecks.settingTolerancePct': {
    label: 'Device setting against the plan (± %)',
    section: deviceChecks,
  },
  'deviceChecks.laserSpotSetting': {
    label: 'The laser is set to (retinal spot or device spot)',
    section: deviceChecks,
  },
  'deviceChecks.lenses': { label: 'Contact lenses cited', section: deviceChecks },
  'deviceChecks.lenses[].name': { label: 'Contact lens', section: deviceChecks },
  'deviceChecks.lenses[].laserSpotFactor': {
    label: 'Contact lens: laser-spot factor (×)',
    section: deviceChecks,
  },
  'deviceChecks.lenses[].imageMagnification': {
    label: 'Contact lens: image magnification (×, not for the spot)',
    section: deviceChecks,
  },
  'deviceChecks.lenses[].source': { label: 'Contact lens: source', section: deviceChecks },
  'deviceChecks.sources[]': { label: 'Sources of the device checks', section: deviceChecks },

  'steps[].id': { label: 'id', section: steps },
  'steps[].kind': { label: 'Kind', section: steps },
  'steps[].title': { label: 'Step', section: steps },
  'steps[].durationS': { label: 'Duration (s)', section: steps, shown: 'duration' },
  'steps[].cueEveryS': { label: 'Cue every (s)', section: steps, shown: 'duration' },
  'steps[].onlyIf': { label: 'Only when', section: steps },

  'contraindications[].id': { label: 'id', section: contraindications },
  'contraindications[].question': { label: 'Question', section: contraindications },
  'contraindications[].severity': { label: 'Severity', section: contraindications },
  'contraindications[].source': { label: 'Source', section: contraindications },
  'contraindications[].measurement': {
    label: 'Checked against a measurement',
    section: contraindications,
  },

  'cautions[]': { label: 'Caution', section: cautions },

  'sources[].id': { label: 'id', section: sources },
  'sources[].citation': { label: 'Citation', section: sources },
  'sources[].supports': { label: 'Supports', section: sources },
  'sources[].status': { label: 'Standing', section: sources },

  followUp: { label: 'Follow-up and outcome', section: followUp },
  'followUp.visits': { label: 'Follow-up visits', section: followUp },
  'followUp.complicationKinds': { label: 'Complications recorded', section: followUp },
  'followUp.outcome': { label: "The treatment's outcome", section: followUp },
  'followUp.visits[].id': { label: 'Visit id', section: followUp },
  'followUp.visits[].label': { label: 'Visit', section: followUp },
  'followUp.visits[].offsetDays': {
    label: 'Visit due after the treatment (days)',
    section: followUp,
  },
  'followUp.visitWindowDays': {
    label: 'A visit not recorded this long after its due date is missed (days)',
    section: followUp,
  },
  'followUp.reminderDaysBefore': {
    label: 'E-mail reminder before a visit (days)',
    section: followUp,
  },
  'followUp.complicationKinds[].id': { label: 'Complication id', section: followUp },
  'followUp.complicationKinds[].label': { label: 'Complication', section: followUp },
  'followUp.outcome.measure': { label: 'Outcome measured', section: followUp },
  'followUp.outcome.label': { label: 'Outcome', section: followUp },
  'followUp.outcome.visitId': { label: 'Outcome read at visit', section: followUp },
  'followUp.outcome.baselineVisitId': { label: 'Outcome compared with visit', section: followUp },
  'followUp.outcome.maxIncreaseD': {
    label: 'Largest Kmax increase still a success (D)',
    section: followUp,
  },
} as const satisfies Record<string, FieldWords>;

export type ProtocolField = keyof typeof protocolFieldLabels;

/** A field's label with its unit, as the version page shows it. */
export function fieldLabel(field: ProtocolField): string {
  return protocolFieldLabels[field].label;
}

const limitBounds: Record<string, string> = {
  'soft.min': 'soft range, lowest',
  'soft.max': 'soft range, highest',
  'hard.min': 'hard range, lowest',
  'hard.max': 'hard range, highest',
};

const listWords: Record<string, string> = {
  steps: 'Step',
  contraindications: 'Question',
  cautions: 'Caution',
  sources: 'Source',
};

export type DescribedPath = { section: string; label: string; shown?: FieldWords['shown'] };

/**
 * A definition's JSON path in the version page's words: "Light › Light-on time (s)",
 * "Steps of the step clock › Step 3: Duration (s)", "Input limits › Height (cm), soft range,
 * lowest". A path the table does not know (a field added since) keeps its last name, never
 * the raw path.
 */
export function describeProtocolPath(path: string): DescribedPath {
  const pattern = path.replace(/\[\d+\]/g, '[]');
  const known = (protocolFieldLabels as Record<string, FieldWords>)[pattern];
  const item = /^(\w+)\[(\d+)\]/.exec(path);
  const prefix = item ? `${listWords[item[1]!] ?? item[1]} ${Number(item[2]) + 1}` : null;
  if (known) {
    const label = prefix
      ? pattern.endsWith('[]')
        ? prefix
        : `${prefix}: ${known.label}`
      : known.label;
    return { section: known.section, label, shown: known.shown };
  }
  const limit = /^inputLimits\.(\w+)\.((?:soft|hard)\.(?:min|max))$/.exec(path);
  if (limit) {
    const base = (protocolFieldLabels as Record<string, FieldWords>)[`inputLimits.${limit[1]}`];
    if (base) return { section: limits, label: `${base.label}, ${limitBounds[limit[2]!]}` };
  }
  const last =
    path
      .split(/[.[\]]+/)
      .filter(Boolean)
      .at(-1) ?? path;
  return { section: 'Other', label: prefix ? `${prefix}: ${last}` : last };
}

/** A value as the version page writes it: figures unrounded, durations with minutes, yes or no. */
export function formatProtocolValue(value: JsonLeaf, shown?: DescribedPath['shown']): string {
  if (value === null) return 'Not used in this protocol';
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  if (typeof value === 'number') {
    if (shown === 'duration') return formatDurationS(value);
    return formatFigure(value);
  }
  if (typeof value === 'string') return value;
  return Array.isArray(value) ? 'None' : 'Empty';
}

/** Names in the sources' texts that are not fields of the version page. */
const otherNames: Record<string, string> = {
  inputLimits: 'input limits',
  'inputs.stromalThicknessUm': 'the stromal thickness entered on the order',
};

/**
 * A source's "supports" text with the definition's field names in the version page's words:
 * "inputLimits.bmiKgPerM2: a BMI outside 16–45…" reads "Input limits › Body-mass index…: a BMI
 * outside 16–45…". The shipped files are never edited; only how they read changes. A name the
 * table does not know stays as written.
 */
export function supportsInPlainWords(text: string): string {
  // Not after a hyphen: "thin-stroma.measurement" is a question's id, not a field.
  return text.replace(/(?<![\w-])[a-z][A-Za-z0-9]*(?:\.[a-z][A-Za-z0-9]*)*\b/g, (name) => {
    if (!/[A-Z.]/.test(name)) return name;
    if (name in otherNames) return otherNames[name]!;
    const known = (protocolFieldLabels as Record<string, FieldWords>)[name];
    if (known) return known.label;
    const described = describeProtocolPath(name);
    return described.section === 'Other' ? name : `${described.section} › ${described.label}`;
  });
}
