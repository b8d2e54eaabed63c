import {
  lightCalculationRequestSchema,
  type LightCalculationRequest,
  type LightSolution,
  type WorkingEntry,
} from '../schemas/calculation';
import { engineVersion } from './engine-version';
import { lightArithmeticSource, spotAreaCm2, spotDiameterUmFromArea } from './light-arithmetic';
import { PlanInputError, planInputErrorFromZod } from './plan-input-error';
import { formatNumber } from './rounding';
import { withinPct } from './tolerance';

/** Given figures that two relations tie together may differ by this much before they are refused. */
export const lightAgreementPct = 1;

export const lightFields = [
  'powerMw',
  'spotDiameterUm',
  'irradianceMwPerCm2',
  'exposureS',
  'fluenceJPerCm2',
  'energyJ',
] as const;
export type LightField = (typeof lightFields)[number];
type Quantity = LightField | 'spotAreaCm2';

const units: Record<Quantity, string> = {
  powerMw: 'mW',
  spotDiameterUm: 'µm',
  spotAreaCm2: 'cm²',
  irradianceMwPerCm2: 'mW/cm²',
  exposureS: 's',
  fluenceJPerCm2: 'J/cm²',
  energyJ: 'J',
};

/** product = factor × left × right; the factor carries the mJ → J step. */
interface ProductRelation {
  product: Quantity;
  left: Quantity;
  right: Quantity;
  factor: 1 | 0.001;
}

// The three definitions, plus energy = fluence × area, which follows from them but lets a
// set such as {spot, exposure, fluence} be solved by one-step substitution.
const relations: ProductRelation[] = [
  { product: 'powerMw', left: 'irradianceMwPerCm2', right: 'spotAreaCm2', factor: 1 },
  { product: 'fluenceJPerCm2', left: 'irradianceMwPerCm2', right: 'exposureS', factor: 0.001 },
  { product: 'energyJ', left: 'powerMw', right: 'exposureS', factor: 0.001 },
  { product: 'energyJ', left: 'fluenceJPerCm2', right: 'spotAreaCm2', factor: 1 },
];

function scaleText(factor: 1 | 0.001, direction: 'product' | 'factor'): string {
  if (factor === 1) return '';
  return direction === 'product' ? ' ÷ 1000' : ' × 1000';
}

interface Known {
  value: number;
  /** The given fields this value rests on. */
  basis: Set<LightField>;
}

/**
 * Fills in whichever of power, spot diameter, irradiance, exposure, fluence and energy the given
 * figures fix: two tied by one definition already answer it (spot and irradiance → power; fluence
 * and irradiance → exposure), three independent ones answer all six, and more are accepted when
 * they agree within 1%. A figure the given ones do not fix is null.
 * Throws PlanInputError naming the fields when the figures disagree, or when they fix nothing new.
 */
export function solveLight(request: LightCalculationRequest): LightSolution {
  const parsed = lightCalculationRequestSchema.safeParse(request);
  if (!parsed.success) throw planInputErrorFromZod(parsed.error, '');
  const given = lightFields.filter((field) => parsed.data[field] !== undefined);

  const known = new Map<Quantity, Known>();
  for (const field of given)
    known.set(field, { value: parsed.data[field] as number, basis: new Set([field]) });
  const working: WorkingEntry[] = [];
  const derive = (name: Quantity, value: number, formula: string, from: Quantity[]): void => {
    const basis = new Set<LightField>();
    const inputs: WorkingEntry['inputs'] = {};
    for (const source of from) {
      const entry = known.get(source);
      if (!entry) throw new Error(`solveLight: ${source} used before it is known`);
      entry.basis.forEach((field) => basis.add(field));
      inputs[source] = { value: entry.value, unit: units[source] };
    }
    known.set(name, { value, basis });
    working.push({
      name,
      value,
      unit: units[name],
      formula,
      inputs,
      source: lightArithmeticSource,
    });
  };
  const valueOf = (name: Quantity): number | undefined => known.get(name)?.value;

  // Substitute until nothing new can be worked out.
  for (let progress = true; progress;) {
    progress = false;
    const diameter = valueOf('spotDiameterUm');
    const area = valueOf('spotAreaCm2');
    if (diameter !== undefined && area === undefined) {
      derive('spotAreaCm2', spotAreaCm2(diameter), 'π × (spotDiameterUm ÷ 10 000)² ÷ 4', [
        'spotDiameterUm',
      ]);
      progress = true;
    } else if (diameter === undefined && area !== undefined) {
      derive('spotDiameterUm', spotDiameterUmFromArea(area), '√(4 × spotAreaCm2 ÷ π) × 10 000', [
        'spotAreaCm2',
      ]);
      progress = true;
    }
    for (const { product, left, right, factor } of relations) {
      const [p, l, r] = [valueOf(product), valueOf(left), valueOf(right)];
      if (p === undefined && l !== undefined && r !== undefined) {
        derive(product, factor * l * r, `${left} × ${right}${scaleText(factor, 'product')}`, [
          left,
          right,
        ]);
        progress = true;
      } else if (p !== undefined && l === undefined && r !== undefined) {
        derive(left, p / (factor * r), `${product}${scaleText(factor, 'factor')} ÷ ${right}`, [
          product,
          right,
        ]);
        progress = true;
      } else if (p !== undefined && l !== undefined && r === undefined) {
        derive(right, p / (factor * l), `${product}${scaleText(factor, 'factor')} ÷ ${left}`, [
          product,
          left,
        ]);
        progress = true;
      }
    }
  }

  // Every relation must now hold; one that does not was fed figures that disagree.
  for (const { product, left, right, factor } of relations) {
    const [p, l, r] = [known.get(product), known.get(left), known.get(right)];
    if (!p || !l || !r) continue;
    const expected = factor * l.value * r.value;
    if (withinPct(p.value, expected, lightAgreementPct)) continue;
    const involved = lightFields.filter(
      (field) => p.basis.has(field) || l.basis.has(field) || r.basis.has(field),
    );
    const message = `${involved.join(', ')} disagree: ${left} × ${right}${scaleText(factor, 'product')} gives ${formatNumber(expected)} ${units[product]}, but ${product} is ${formatNumber(p.value)} ${units[product]} (more than ${lightAgreementPct}% apart); correct one or leave one out`;
    throw new PlanInputError(involved.map((path) => ({ path, message })));
  }

  const missing = lightFields.filter((field) => !known.has(field));
  const answered = lightFields.filter((field) => known.has(field) && !given.includes(field));
  if (missing.length > 0 && answered.length === 0) {
    const givenText = given.length > 0 ? given.join(', ') : 'nothing';
    throw new PlanInputError(
      missing.map((path) => ({
        path,
        message: `${path} cannot be worked out from ${givenText}: give two figures that one definition ties together (spotDiameterUm and irradianceMwPerCm2 give powerMw; fluenceJPerCm2 and irradianceMwPerCm2 give exposureS), or three independent ones for all six`,
      })),
    );
  }

  const final = (name: Quantity): number | null => known.get(name)?.value ?? null;
  return {
    engineVersion,
    powerMw: final('powerMw'),
    spotDiameterUm: final('spotDiameterUm'),
    spotAreaCm2: final('spotAreaCm2'),
    irradianceMwPerCm2: final('irradianceMwPerCm2'),
    exposureS: final('exposureS'),
    fluenceJPerCm2: final('fluenceJPerCm2'),
    energyJ: final('energyJ'),
    given: [...given],
    working,
  };
}
