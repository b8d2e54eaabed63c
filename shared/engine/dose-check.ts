import type { DosePlan, WorkingEntry } from '../schemas/calculation';
import { drugVolumeMlForDose } from './drawn-volume';
import { withinPct } from './tolerance';

export const doseCheckFields = ['bsaM2', 'doseMg', 'drugVolumeMl'] as const;
export type DoseCheckField = (typeof doseCheckFields)[number];

export interface DoseCheckTolerance {
  bsaPct: number;
  dosePct: number;
  drugVolumePct: number;
}

const pctFor: Record<DoseCheckField, keyof DoseCheckTolerance> = {
  bsaM2: 'bsaPct',
  doseMg: 'dosePct',
  drugVolumeMl: 'drugVolumePct',
};

/**
 * The figures a pharmacist's own working may rightly arrive at, for each checked field: the
 * plan's rounded figure, the same line before rounding, and the fully unrounded chain (exact BSA
 * × dose per m² ÷ concentration), since a pharmacist who carries every digit is not wrong.
 */
export function doseCheckReferences(plan: DosePlan): Record<DoseCheckField, number[]> {
  const line = (name: string): WorkingEntry | undefined =>
    plan.working.find((entry) => entry.name === name);
  const bsa = line('bsaM2');
  const dose = line('doseMg');
  const volume = line('drugVolumeMl');
  const doseMgPerM2 = dose?.inputs.doseMgPerM2?.value;
  const concentrationMgPerMl = volume?.inputs.concentrationMgPerMl?.value;
  const exactDoseMg = bsa && doseMgPerM2 !== undefined ? bsa.value * doseMgPerM2 : undefined;
  const exactVolumeMl =
    exactDoseMg !== undefined && concentrationMgPerMl
      ? drugVolumeMlForDose(exactDoseMg, concentrationMgPerMl)
      : undefined;
  const known = (...values: (number | null | undefined)[]) => [
    ...new Set(values.filter((v): v is number => typeof v === 'number' && Number.isFinite(v))),
  ];
  return {
    bsaM2: known(plan.bsaM2, bsa?.value),
    doseMg: known(plan.doseMg, dose?.value, exactDoseMg),
    drugVolumeMl: known(plan.drugVolumeMl, volume?.value, exactVolumeMl),
  };
}

/** The checked fields whose entered figure is within tolerance of none of its references. */
export function doseCheckDiffering(
  plan: DosePlan,
  entered: Record<DoseCheckField, number>,
  tolerance: DoseCheckTolerance,
): DoseCheckField[] {
  const references = doseCheckReferences(plan);
  return doseCheckFields.filter((field) => {
    const pct = tolerance[pctFor[field]];
    return (
      references[field].length === 0 ||
      !references[field].some((reference) => withinPct(entered[field], reference, pct))
    );
  });
}
