/** What a typed number box holds: blank is "not given"; anything but a plain number is refused. */
export type TypedNumber = number | undefined | 'invalid';

/**
 * A number as staff type it on every form (the order form, the light calculator): blank is "not
 * given"; a decimal comma is accepted as a decimal point ("42,4" is 42.4); a sign, a thousands
 * separator, a unit or a second separator is refused rather than guessed at.
 */
export function parseTypedNumber(raw: string): TypedNumber {
  const trimmed = raw.trim().replace(',', '.');
  if (trimmed === '') return undefined;
  if (!/^[+]?(\d+\.?\d*|\.\d+)$/.test(trimmed)) return 'invalid';
  return Number(trimmed);
}
