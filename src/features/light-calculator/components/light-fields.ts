import type { LightCalculationRequest } from '../../../../shared/schemas/calculation';

export type LightField = keyof LightCalculationRequest;

/** The six figures in the order a person thinks of them: the laser, the spot, then the dose. */
export const lightFieldOrder: readonly LightField[] = [
  'powerMw',
  'spotDiameterUm',
  'irradianceMwPerCm2',
  'exposureS',
  'fluenceJPerCm2',
  'energyJ',
];

/** What the calculator shows, including the spot area it works out on the way. */
export type LightQuantity = LightField | 'spotAreaCm2';

export const quantityText: Record<LightQuantity, { label: string; unit: string }> = {
  powerMw: { label: 'Power', unit: 'mW' },
  spotDiameterUm: { label: 'Spot diameter', unit: 'µm' },
  spotAreaCm2: { label: 'Spot area', unit: 'cm²' },
  irradianceMwPerCm2: { label: 'Irradiance', unit: 'mW/cm²' },
  exposureS: { label: 'Exposure time', unit: 's' },
  fluenceJPerCm2: { label: 'Fluence', unit: 'J/cm²' },
  energyJ: { label: 'Energy', unit: 'J' },
};

const keysLongestFirst = (Object.keys(quantityText) as LightQuantity[]).sort(
  (a, b) => b.length - a.length,
);

/**
 * The engine words its messages and formulas with field names ("powerMw × exposureS ÷ 1000");
 * the screen uses the words on the form instead.
 */
export function namesInWords(text: string): string {
  let result = text;
  for (const key of keysLongestFirst)
    result = result.replaceAll(key, quantityText[key].label.toLowerCase());
  return result;
}

/** A message in words, starting with a capital, as a sentence beside a field. */
export function messageInWords(text: string | undefined): string | undefined {
  if (!text) return text;
  const words = namesInWords(text);
  return words.charAt(0).toUpperCase() + words.slice(1);
}
