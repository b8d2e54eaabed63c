// Only the unit factory: a full mathjs import would double the client bundle.
import { create, unitDependencies } from 'mathjs';
import type { HeightUnit, WeightUnit } from '../schemas/calculation';
import { formatNumber, roundToStep } from './rounding';

// mathjs types every dependency map as possibly undefined; fail loudly rather than assert.
if (unitDependencies === undefined) throw new Error('mathjs does not provide unitDependencies');
const math = create({ unitDependencies });

/** Source text for conversions shown in a plan's working. */
export const unitConversionSource =
  'mathjs unit conversion (1 in = 2.54 cm and 1 lb = 0.45359237 kg by international definition)';

export function lengthToCm(value: number, unit: HeightUnit): number {
  return unit === 'cm' ? value : math.unit(value, unit).toNumber('cm');
}

export function massToKg(value: number, unit: WeightUnit): number {
  return unit === 'kg' ? value : math.unit(value, unit).toNumber('kg');
}

export function inchesToCm(inches: number): number {
  return lengthToCm(inches, 'in');
}

export function poundsToKg(pounds: number): number {
  return massToKg(pounds, 'lb');
}

/** The unit a measure is also shown in: metric beside imperial and the other way round. */
const counterpartUnit = { cm: 'in', m: 'in', in: 'cm', kg: 'lb', lb: 'kg' } as const;

/**
 * A typed height or weight with its value in the other system, e.g. "92 lb (41.7 kg)" or
 * "183 cm (72 in)": the one formatter for a measure wherever a figure is checked, so that a
 * value typed in the wrong unit shows itself. The converted value is rounded to 0.1.
 */
export function formatMeasureWithConversion(measure: {
  value: number;
  unit: HeightUnit | WeightUnit;
}): string {
  const other = counterpartUnit[measure.unit];
  const converted = roundToStep(math.unit(measure.value, measure.unit).toNumber(other), 0.1);
  return `${formatNumber(measure.value)} ${measure.unit} (${formatNumber(converted)} ${other})`;
}
