/** Number of decimal places a step such as 0.01 or 0.000001 carries. */
function decimalsOf(step: number): number {
  const [mantissa = '', exponent] = step.toExponential().split('e');
  const mantissaDecimals = (mantissa.split('.')[1] ?? '').length;
  return Math.max(0, mantissaDecimals - Number(exponent));
}

/**
 * Rounds half away from zero to the nearest multiple of `step` (a rule set by the protocol).
 * The quotient is trimmed to 12 significant digits first so that binary noise such as
 * 1.005 / 0.01 = 100.49999999999999 rounds the way a person with a calculator would.
 */
export function roundToStep(value: number, step: number): number {
  if (!Number.isFinite(value)) throw new RangeError(`cannot round ${value}: not a finite number`);
  if (!(step > 0) || !Number.isFinite(step))
    throw new RangeError(`rounding step must be a positive number (got ${step})`);
  const quotient = Number((Math.abs(value) / step).toPrecision(12));
  const rounded = Math.round(quotient) * step * Math.sign(value);
  return Number(rounded.toFixed(Math.min(20, decimalsOf(step))));
}

/** Formats a number for messages: at most six significant digits, no trailing zeros. */
export function formatNumber(value: number): string {
  return String(Number(value.toPrecision(6)));
}
