import type { InputLimit, ProtocolVersion } from '../protocol/protocol-schema';
import type { PlanInputs, PlanWarning, WorkingEntry } from '../schemas/calculation';
import { recordBodyMassIndex } from './body-mass-index';
import type { FieldProblem } from './plan-input-error';
import { formatNumber } from './rounding';
import { lengthToCm, massToKg, unitConversionSource } from './units';
import { record } from './working';

/** Problems and warnings gathered over all inputs, so that one refusal names every bad field. */
export interface InputReport {
  problems: FieldProblem[];
  warnings: PlanWarning[];
  working: WorkingEntry[];
}

export function newInputReport(): InputReport {
  return { problems: [], warnings: [], working: [] };
}

interface LimitedValue {
  path: string;
  label: string;
  /** Unit the limit is stated in; empty for a plain factor. */
  unit: string;
  value: number;
  /** What the person typed, when it was in another unit. */
  typed?: { value: number; unit: string };
  limit: InputLimit;
}

function withUnit(value: number, unit: string): string {
  return unit ? `${formatNumber(value)} ${unit}` : formatNumber(value);
}

function rangeText(range: { min: number; max: number }, unit: string): string {
  return `${formatNumber(range.min)} and ${withUnit(range.max, unit)}`;
}

function gotText(input: LimitedValue): string {
  const inLimitUnit = withUnit(input.value, input.unit);
  return input.typed
    ? `${withUnit(input.typed.value, input.typed.unit)} = ${inLimitUnit}`
    : inLimitUnit;
}

/** Hard range refuses; soft range warns and asks for a reason. Returns whether the value is usable. */
export function checkLimit(input: LimitedValue, report: InputReport): boolean {
  const { hard, soft } = input.limit;
  if (input.value < hard.min || input.value > hard.max) {
    report.problems.push({
      path: input.path,
      message: `${input.label} must be between ${rangeText(hard, input.unit)} (got ${gotText(input)})`,
    });
    return false;
  }
  if (input.value < soft.min || input.value > soft.max) {
    report.warnings.push({
      code: 'soft-limit',
      field: input.path,
      message: `${input.label} ${gotText(input)} is outside the usual range of ${rangeText(soft, input.unit)}: check the measurement and record a reason to go on`,
    });
  }
  return true;
}

function rangeHint(limit: InputLimit, unit: string): string {
  return `${formatNumber(limit.hard.min)}–${withUnit(limit.hard.max, unit)}`;
}

/** A number input limited by the protocol; undefined when absent or refused. */
export function readLimitedNumber(
  report: InputReport,
  field: 'lesionGldUm' | 'lensMagnification' | 'stromalThicknessUm',
  label: string,
  unit: string,
  value: number | undefined,
  limit: InputLimit,
  kind: ProtocolVersion['kind'],
): number | undefined {
  const path = `inputs.${field}`;
  if (value === undefined) {
    report.problems.push({
      path,
      message: `${label} is required for a ${kind} protocol (allowed ${rangeHint(limit, unit)})`,
    });
    return undefined;
  }
  return checkLimit({ path, label, unit, value, limit }, report) ? value : undefined;
}

/** Inputs that belong to the other kind of protocol are refused rather than quietly ignored. */
export function refuseInputs(
  report: InputReport,
  inputs: PlanInputs,
  fields: (keyof PlanInputs)[],
  kind: ProtocolVersion['kind'],
): void {
  for (const field of fields) {
    if (inputs[field] !== undefined) {
      report.problems.push({
        path: `inputs.${field}`,
        message: `${field} does not apply to a ${kind} protocol; leave it out`,
      });
    }
  }
}

export interface BodyMeasures {
  heightCm: number;
  weightKg: number;
  /** Worked out from the two, once, with its own usual range (see body-mass-index.ts). */
  bmiKgPerM2: number;
}

/**
 * Height and weight in cm and kg, checked against the protocol's limits. Conversions from
 * other units go through mathjs and appear in the working.
 */
export function readBodyMeasures(
  report: InputReport,
  protocol: ProtocolVersion,
  inputs: PlanInputs,
  required: boolean,
): BodyMeasures | undefined {
  const { height, weight } = inputs;
  const { heightCm: heightLimit, weightKg: weightLimit } = protocol.inputLimits;
  if (!required && height === undefined && weight === undefined) return undefined;
  if (height === undefined) {
    report.problems.push({
      path: 'inputs.height',
      message: `height is required${required ? ` for a ${protocol.kind} protocol` : ' when weight is given'} (allowed ${rangeHint(heightLimit, 'cm')})`,
    });
  }
  if (weight === undefined) {
    report.problems.push({
      path: 'inputs.weight',
      message: `weight is required${required ? ` for a ${protocol.kind} protocol` : ' when height is given'} (allowed ${rangeHint(weightLimit, 'kg')})`,
    });
  }
  if (height === undefined || weight === undefined) return undefined;

  const heightCm = lengthToCm(height.value, height.unit);
  const weightKg = massToKg(weight.value, weight.unit);
  const heightOk = checkLimit(
    {
      path: 'inputs.height.value',
      label: 'height',
      unit: 'cm',
      value: heightCm,
      limit: heightLimit,
      ...(height.unit === 'cm' ? {} : { typed: height }),
    },
    report,
  );
  const weightOk = checkLimit(
    {
      path: 'inputs.weight.value',
      label: 'weight',
      unit: 'kg',
      value: weightKg,
      limit: weightLimit,
      ...(weight.unit === 'kg' ? {} : { typed: weight }),
    },
    report,
  );
  if (!heightOk || !weightOk) return undefined;

  if (height.unit !== 'cm') {
    record(report.working, {
      name: 'heightCm',
      value: heightCm,
      unit: 'cm',
      formula: `height ${height.unit} → cm`,
      inputs: { height: { value: height.value, unit: height.unit } },
      source: unitConversionSource,
    });
  }
  if (weight.unit !== 'kg') {
    record(report.working, {
      name: 'weightKg',
      value: weightKg,
      unit: 'kg',
      formula: `weight ${weight.unit} → kg`,
      inputs: { weight: { value: weight.value, unit: weight.unit } },
      source: unitConversionSource,
    });
  }
  const bmiKgPerM2 = recordBodyMassIndex(
    report,
    protocol,
    { height, weight },
    { heightCm, weightKg },
  );
  return { heightCm, weightKg, bmiKgPerM2 };
}
