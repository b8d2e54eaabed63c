import { PlanInputError } from './plan-input-error';

/**
 * Visual acuity as the clinic writes it, turned into logMAR (the figure outcomes are computed
 * on), with the entry kept as typed.
 *
 * - logMAR = −log10(decimal acuity); a Snellen fraction is a decimal acuity (6/12 = 0.5).
 * - ETDRS letters ≈ 85 − 50 × logMAR, so logMAR = (85 − letters) ÷ 50 (Gregori NZ, Feuer W,
 *   Rosenfeld PJ. Retina 2010;30:1046–1050).
 * - Counting fingers = decimal 0.014 and hand motion = decimal 0.005 (Schulze-Bonsel K, Feltgen
 *   N, Burau H, Hansen L, Bach M. Invest Ophthalmol Vis Sci 2006;47:1236–1240, abstract).
 */
export const acuityNotations = [
  'snellen-m',
  'snellen-ft',
  'decimal',
  'logmar',
  'etdrs-letters',
  'counting-fingers',
  'hand-motion',
] as const;
export type AcuityNotation = (typeof acuityNotations)[number];

export const acuityNotationLabels: Record<AcuityNotation, string> = {
  'snellen-m': 'Snellen, metres (6/12)',
  'snellen-ft': 'Snellen, feet (20/40)',
  decimal: 'Decimal (0.5)',
  logmar: 'logMAR (0.30)',
  'etdrs-letters': 'ETDRS letters (70)',
  'counting-fingers': 'Counting fingers',
  'hand-motion': 'Hand motion',
};

/** Decimal acuity of the two low-vision categories (Schulze-Bonsel K et al., IOVS 2006). */
export const lowVisionDecimal = { 'counting-fingers': 0.014, 'hand-motion': 0.005 } as const;

/**
 * The chart range an entry may fall in: decimal 0.01 to 2.0 (logMAR 2.0 to −0.3). Better than
 * −0.3 logMAR is beyond any chart line; worse than 0.01 is recorded as counting fingers or hand
 * motion (common practice).
 */
export const acuityChartRange = { minDecimal: 0.01, maxDecimal: 2, minLogMar: -0.3, maxLogMar: 2 };
/** ETDRS letters are counted 0 to 100 (85 − 50 × logMAR at logMAR 1.7 and −0.3). */
export const etdrsLetterRange = { min: 0, max: 100 };
/** Snellen distances a chart is read at: metres 1 to 6, feet 3 to 20 (common practice). */
const testDistance = { 'snellen-m': { min: 1, max: 6 }, 'snellen-ft': { min: 3, max: 20 } };

export interface AcuityEntry {
  notation: AcuityNotation;
  /** As typed: "6/12", "20/40", "0.5", "0.30", "70"; empty for counting fingers and hand motion. */
  value: string;
}

export interface Acuity {
  notation: AcuityNotation;
  entry: string;
  /** The stored figure, to 0.01 logMAR. */
  logMar: number;
  /** ETDRS letters equivalent, whole letters (85 − 50 × logMAR). */
  letters: number;
  /** How the figure was worked out, for the person reading it. */
  working: string;
}

const round2 = (value: number): number => Math.round(value * 100) / 100 + 0;

/** ETDRS letters from logMAR (Gregori NZ et al., Retina 2010). */
export function lettersFromLogMar(logMar: number): number {
  return Math.round(85 - 50 * logMar) + 0;
}

/** A change in logMAR as a change in letters: a fall in logMAR is a gain in letters. */
export function letterChangeFromLogMarChange(logMarChange: number): number {
  return -50 * logMarChange + 0;
}

function refuse(path: string, message: string): never {
  throw new PlanInputError([{ path, message }]);
}

function parseNumber(path: string, raw: string, what: string): number {
  const text = raw.trim().replace(',', '.');
  if (!/^[-+]?\d+(\.\d+)?$|^[-+]?\.\d+$/.test(text)) refuse(path, `${what} must be a number`);
  return Number(text);
}

function fromDecimal(
  notation: AcuityNotation,
  entry: string,
  decimal: number,
  how: string,
): Acuity {
  const logMar = round2(-Math.log10(decimal));
  return {
    notation,
    entry,
    logMar,
    letters: lettersFromLogMar(logMar),
    working: `logMAR = −log10(${how}) = ${logMar.toFixed(2)}`,
  };
}

function snellen(notation: 'snellen-m' | 'snellen-ft', value: string, path: string): Acuity {
  const unit = notation === 'snellen-m' ? 'm' : 'ft';
  const example = notation === 'snellen-m' ? '6/12' : '20/40';
  const parts = value.trim().split('/');
  if (parts.length !== 2)
    refuse(path, `a Snellen acuity is written test distance/letter size, e.g. ${example}`);
  const distance = parseNumber(path, parts[0]!, `the Snellen test distance (${unit})`);
  const size = parseNumber(path, parts[1]!, `the Snellen letter size (${unit})`);
  const range = testDistance[notation];
  if (distance < range.min || distance > range.max)
    refuse(
      path,
      `the Snellen test distance must be ${range.min} to ${range.max} ${unit} (got ${distance})`,
    );
  // The letter size must put the decimal acuity inside the chart range: 6/0 is no acuity at all.
  const minSize = distance / acuityChartRange.maxDecimal;
  const maxSize = distance / acuityChartRange.minDecimal;
  if (!(size >= minSize && size <= maxSize))
    refuse(
      path,
      `the Snellen letter size must be ${minSize} to ${maxSize} ${unit} at ${distance} ${unit} (got ${size}); below decimal 0.01 record counting fingers or hand motion`,
    );
  return fromDecimal(notation, `${distance}/${size}`, distance / size, `${distance}/${size}`);
}

/**
 * Converts one acuity entry into logMAR, refusing what no eye can read (6/0, negative letters,
 * a logMAR off the chart) with the field and the allowed range.
 */
export function acuityFromEntry(input: AcuityEntry, path = 'acuity.value'): Acuity {
  const { notation, value } = input;
  switch (notation) {
    case 'snellen-m':
    case 'snellen-ft':
      return snellen(notation, value, path);
    case 'decimal': {
      const decimal = parseNumber(path, value, 'a decimal acuity');
      const { minDecimal, maxDecimal } = acuityChartRange;
      if (decimal < minDecimal || decimal > maxDecimal)
        refuse(path, `a decimal acuity must be ${minDecimal} to ${maxDecimal} (got ${decimal})`);
      return fromDecimal(notation, String(decimal), decimal, String(decimal));
    }
    case 'logmar': {
      const logMar = parseNumber(path, value, 'a logMAR acuity');
      const { minLogMar, maxLogMar } = acuityChartRange;
      if (logMar < minLogMar || logMar > maxLogMar)
        refuse(path, `a logMAR acuity must be ${minLogMar} to ${maxLogMar} (got ${logMar})`);
      const stored = round2(logMar);
      return {
        notation,
        entry: value.trim(),
        logMar: stored,
        letters: lettersFromLogMar(stored),
        working: `logMAR entered: ${stored.toFixed(2)}`,
      };
    }
    case 'etdrs-letters': {
      const letters = parseNumber(path, value, 'ETDRS letters');
      if (
        !Number.isInteger(letters) ||
        letters < etdrsLetterRange.min ||
        letters > etdrsLetterRange.max
      )
        refuse(
          path,
          `ETDRS letters must be a whole number from ${etdrsLetterRange.min} to ${etdrsLetterRange.max} (got ${letters})`,
        );
      const logMar = round2((85 - letters) / 50);
      return {
        notation,
        entry: String(letters),
        logMar,
        letters,
        working: `logMAR = (85 − ${letters}) ÷ 50 = ${logMar.toFixed(2)}`,
      };
    }
    case 'counting-fingers':
    case 'hand-motion': {
      if (value.trim() !== '')
        refuse(
          path,
          `${notation === 'hand-motion' ? 'hand motion' : 'counting fingers'} takes no value`,
        );
      const decimal = lowVisionDecimal[notation];
      const label = notation === 'hand-motion' ? 'HM' : 'CF';
      return fromDecimal(
        notation,
        label,
        decimal,
        `${decimal}, the decimal equivalent of ${label}`,
      );
    }
  }
}
