import { enteredFigureLimits } from '../../../../shared/session/session-events';

/**
 * Reads a figure typed at the bedside (a comma is a decimal point). Returns the number, or the
 * message naming the allowed range. `maxOverride` narrows the upper bound (the bag's final volume).
 */
export function readFigure(
  text: string,
  field: keyof typeof enteredFigureLimits,
  label: string,
  unit: string,
  maxOverride?: number,
): { value: number } | { error: string } {
  const { min } = enteredFigureLimits[field];
  const max = maxOverride ?? enteredFigureLimits[field].max;
  const value = Number(text.trim().replace(',', '.'));
  if (text.trim() === '' || !Number.isFinite(value) || value < min || value > max)
    return { error: `Enter ${label} as a number from ${min} to ${max} ${unit}.` };
  return { value };
}
