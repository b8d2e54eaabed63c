// Only the unit factory: a full mathjs import would double the client bundle.
import { create, unitDependencies } from 'mathjs';
import type { HeightUnit, WeightUnit } from '../schemas/calculation';

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
