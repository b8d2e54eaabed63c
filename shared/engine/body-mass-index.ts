import type { ProtocolVersion } from '../protocol/protocol-schema';
import { defaultBmiLimit } from '../protocol/protocol-schema';
import type { PlanInputs } from '../schemas/calculation';
import type { BodyMeasures, InputReport } from './input-limits';
import { protocolRef } from './plan-parts';
import { formatNumber, roundToStep } from './rounding';
import { formatMeasureWithConversion } from './units';
import { record } from './working';

export const bodyMassIndexSource =
  'common practice: body-mass index = weight in kg ÷ (height in m)², the World Health Organization definition';

/** Body-mass index in kg/m²: weight in kg over the square of the height in metres (WHO). */
export function bodyMassIndexKgPerM2(heightCm: number, weightKg: number): number {
  return (weightKg * 10_000) / (heightCm * heightCm);
}

/** The BMI as messages print it: one decimal, as it is usually quoted. */
export function bmiText(bmiKgPerM2: number): string {
  return `${formatNumber(roundToStep(bmiKgPerM2, 0.1))} kg/m²`;
}

/**
 * Works out the BMI into the working and warns when it lies outside the protocol's usual range
 * (or the default range for a version approved before the field). A weight typed in pounds but
 * meant in kilograms passes every single-field limit; the BMI is where it shows.
 */
export function recordBodyMassIndex(
  report: InputReport,
  protocol: ProtocolVersion,
  inputs: Required<Pick<PlanInputs, 'height' | 'weight'>>,
  body: Pick<BodyMeasures, 'heightCm' | 'weightKg'>,
): number {
  const bmiKgPerM2 = record(report.working, {
    name: 'bmiKgPerM2',
    value: bodyMassIndexKgPerM2(body.heightCm, body.weightKg),
    unit: 'kg/m²',
    formula: 'weightKg ÷ (heightCm ÷ 100)²',
    inputs: {
      heightCm: { value: body.heightCm, unit: 'cm' },
      weightKg: { value: body.weightKg, unit: 'kg' },
    },
    source: bodyMassIndexSource,
  });
  const own = protocol.inputLimits.bmiKgPerM2;
  const { min, max } = (own ?? defaultBmiLimit).soft;
  if (bmiKgPerM2 < min || bmiKgPerM2 > max) {
    const whose = own
      ? `${protocolRef(protocol)}`
      : `the default range, as ${protocolRef(protocol)} has none of its own`;
    report.warnings.push({
      code: 'soft-limit',
      field: 'bmiKgPerM2',
      message: `body-mass index ${bmiText(bmiKgPerM2)} is outside the usual range of ${formatNumber(min)} to ${formatNumber(max)} kg/m² (${whose}): weight ${formatMeasureWithConversion(inputs.weight)}, height ${formatMeasureWithConversion(inputs.height)}; check both and their units`,
    });
  }
  return bmiKgPerM2;
}
