import { roundToStep } from '../engine/rounding';
import { formatDuration, formatPlainNumber, noFigure } from './figures';

/**
 * The precision at which people read each kind of figure, in one place, so that a record, a
 * review, a printed sheet and a CSV export write the same figure the same way. The stored and
 * computed figures keep their full precision; only what is shown or exported is rounded here.
 *
 * Steps (common practice at the bedside and the pharmacy bench, not a published rule):
 * - a volume to the syringe's graduation (the protocol's drug.syringeGraduationMl), else 0.1 mL,
 *   the usual pump and 10 mL syringe reading;
 * - a dose to 0.01 mg (a balance or a calculated dose), a BSA to 0.01 m²;
 * - a duration to the whole second (the clock and the laser display whole seconds);
 * - fluence to 0.1 J/cm², irradiance to 0.1 mW/cm², power and energy to 0.1 mW and 0.1 J;
 * - a spot or a corneal thickness to the whole µm (what the devices display);
 * - a percentage to 0.1 %.
 */
export const readingKinds = [
  'volumeMl',
  'doseMg',
  'bsaM2',
  'durationS',
  'rateMlPerMin',
  'fluenceJPerCm2',
  'irradianceMwPerCm2',
  'powerMw',
  'energyJ',
  'spotUm',
  'thicknessUm',
  'areaCm2',
  'percent',
] as const;
export type ReadingKind = (typeof readingKinds)[number];

/** The unit each kind is written in, spelled the same way everywhere (SI symbols, "²", "µ"). */
export const readingUnits: Record<ReadingKind, string> = {
  volumeMl: 'mL',
  doseMg: 'mg',
  bsaM2: 'm²',
  durationS: 's',
  rateMlPerMin: 'mL/min',
  fluenceJPerCm2: 'J/cm²',
  irradianceMwPerCm2: 'mW/cm²',
  powerMw: 'mW',
  energyJ: 'J',
  spotUm: 'µm',
  thicknessUm: 'µm',
  areaCm2: 'cm²',
  percent: '%',
};

export const readingSteps: Record<ReadingKind, number> = {
  volumeMl: 0.1,
  doseMg: 0.01,
  bsaM2: 0.01,
  durationS: 1,
  rateMlPerMin: 0.1,
  fluenceJPerCm2: 0.1,
  irradianceMwPerCm2: 0.1,
  powerMw: 0.1,
  energyJ: 0.1,
  spotUm: 1,
  thicknessUm: 1,
  areaCm2: 0.0001,
  percent: 0.1,
};

export interface ReadingOptions {
  /** The syringe's graduation (protocol drug.syringeGraduationMl); a volume is read to it. */
  graduationMl?: number | null;
}

function stepOf(kind: ReadingKind, { graduationMl }: ReadingOptions = {}): number {
  if (kind === 'volumeMl' && graduationMl && graduationMl > 0) return graduationMl;
  return readingSteps[kind];
}

/** Decimal places a step such as 0.01 carries (0 for 1 or more). */
function decimalsOf(step: number): number {
  const text = String(step);
  if (text.includes('e-')) return Number(text.split('e-')[1]);
  return (text.split('.')[1] ?? '').length;
}

/**
 * A figure rounded to the precision it is read at; null when it is missing or not finite.
 * Binary noise goes with it: 0.1 + 0.2 reads 0.3, never 0.30000000000000004.
 */
export function roundForReading(
  kind: ReadingKind,
  value: number | null | undefined,
  options?: ReadingOptions,
): number | null {
  if (value === null || value === undefined || !Number.isFinite(value)) return null;
  return roundToStep(value, stepOf(kind, options));
}

/** "30 mL", "49.8 J/cm²", "83 s": a figure at its reading precision with its unit; "—" when missing. */
export function formatReading(
  kind: ReadingKind,
  value: number | null | undefined,
  options?: ReadingOptions,
): string {
  const rounded = roundForReading(kind, value, options);
  if (rounded === null) return noFigure;
  const digits = decimalsOf(stepOf(kind, options));
  return `${formatPlainNumber(rounded, digits)} ${readingUnits[kind]}`;
}

/**
 * A number for a CSV cell or any machine-read export: no binary noise (at most 12 significant
 * digits, so 0.1 × 0.2 is written 0.02), no exponent for ordinary figures, never grouped.
 */
export function exportNumber(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '';
  const clean = Number(value.toPrecision(12));
  if (clean === 0) return '0';
  const abs = Math.abs(clean);
  if (abs < 1e-6 || abs >= 1e15) return String(clean);
  const fixed = clean.toFixed(Math.min(20, Math.max(0, 12 - Math.ceil(Math.log10(abs)))));
  return fixed.includes('.') ? fixed.replace(/\.?0+$/, '') : fixed;
}

/** The reading kind a unit as stored on a deviation or a record belongs to, if any. */
const kindOfUnit: Record<string, ReadingKind> = {
  mL: 'volumeMl',
  mg: 'doseMg',
  'm²': 'bsaM2',
  s: 'durationS',
  'mL/min': 'rateMlPerMin',
  'J/cm²': 'fluenceJPerCm2',
  'mW/cm²': 'irradianceMwPerCm2',
  mW: 'powerMw',
  J: 'energyJ',
  µm: 'thicknessUm',
  '%': 'percent',
};
const secondsPerUnit: Record<string, number> = { s: 1, min: 60, h: 3600 };

function durationWords(seconds: number): string {
  const sign = seconds < 0 ? '−' : '';
  return sign + formatDuration(Math.abs(seconds), 'words');
}

/** Seconds with as many decimals as `decimals`, words kept for the whole part: "4 h 0.4 s". */
function durationWithDecimals(seconds: number, decimals: number): string {
  const sign = seconds < 0 ? '−' : '';
  const abs = Math.abs(seconds);
  const whole = Math.floor(abs / 60) * 60;
  const rest = formatPlainNumber(abs - whole, decimals);
  return `${sign}${whole > 0 ? `${formatDuration(whole, 'words').replace(/ 0 s$/, '')} ` : ''}${rest} s`;
}

/**
 * An expected and an actual figure written so that a reader sees why they differ: each at its
 * reading precision (durations in words to the second), and, when both would read the same
 * ("4 h" against "4 h") though they are not equal, with as many more decimals as it takes to
 * tell them apart — at worst the exact stored values.
 */
export function formatFigurePair(
  expected: number | null | undefined,
  actual: number | null | undefined,
  unit: string | null | undefined,
): { expected: string; actual: string } {
  const has = (v: number | null | undefined): v is number => v != null && Number.isFinite(v);
  const perUnitS = unit ? secondsPerUnit[unit] : undefined;
  if (perUnitS !== undefined) {
    const e = has(expected) ? expected * perUnitS : null;
    const a = has(actual) ? actual * perUnitS : null;
    const pair = {
      expected: e === null ? noFigure : durationWords(e),
      actual: a === null ? noFigure : durationWords(a),
    };
    if (e === null || a === null || pair.expected !== pair.actual || e === a) return pair;
    for (let decimals = 1; decimals <= 3; decimals += 1) {
      const next = {
        expected: durationWithDecimals(e, decimals),
        actual: durationWithDecimals(a, decimals),
      };
      if (next.expected !== next.actual) return next;
    }
    return { expected: `${exportNumber(e)} s`, actual: `${exportNumber(a)} s` };
  }
  const kind = unit ? kindOfUnit[unit] : undefined;
  const suffix = unit ? ` ${unit}` : '';
  const text = (v: number | null | undefined, decimals: number) =>
    has(v) ? `${formatPlainNumber(v, decimals)}${suffix}` : noFigure;
  const baseDecimals = kind ? decimalsOf(readingSteps[kind]) : 2;
  const pair = { expected: text(expected, baseDecimals), actual: text(actual, baseDecimals) };
  if (!has(expected) || !has(actual) || pair.expected !== pair.actual || expected === actual)
    return pair;
  for (let decimals = baseDecimals + 1; decimals <= baseDecimals + 4; decimals += 1) {
    const next = { expected: text(expected, decimals), actual: text(actual, decimals) };
    if (next.expected !== next.actual) return next;
  }
  return {
    expected: `${exportNumber(expected)}${suffix}`,
    actual: `${exportNumber(actual)}${suffix}`,
  };
}

/** Actual less expected, signed, written as the pair is ("+2 min", "−0.4 s", "+0.04 J/cm²"). */
export function formatFigureDifference(
  expected: number | null | undefined,
  actual: number | null | undefined,
  unit: string | null | undefined,
): string {
  if (expected == null || actual == null) return noFigure;
  const difference = actual - expected;
  const sign = difference > 0 ? '+' : difference < 0 ? '−' : '';
  return sign + formatFigurePair(0, Math.abs(difference), unit).actual;
}

/**
 * A zone in plain words for a patient's sheet: "Lisbon time" for Europe/Lisbon, from the IANA
 * name's city; the short name (WET, WEST) beside each time says which side of a clock change.
 */
export function zonePlainName(zone: string): string {
  const city = zone.split('/').pop()?.replace(/_/g, ' ');
  return city && city !== zone ? `${city} time` : zone;
}
