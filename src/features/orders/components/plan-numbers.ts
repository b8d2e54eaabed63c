import { formatDuration, formatPlainNumber } from '../../../../shared/format/figures';
import type { DosePlan } from '../../../../shared/schemas/calculation';

/** A figure as printed in the plan: digits the protocol kept, nothing added, no trailing zeros, no grouping. */
export function formatFigure(value: number): string {
  return formatPlainNumber(value, 6);
}

/** Seconds as "83 s (1 min 23 s)", so a time reads either way at a glance. */
export function formatSeconds(seconds: number): string {
  return formatDuration(seconds, 'seconds-and-words', { maxDecimals: 6 });
}

type Figure = {
  key: keyof DosePlan;
  label: string;
  unit: string;
  time?: boolean;
  main?: boolean;
  estimate?: boolean;
  signed?: boolean;
};

/** The plan's figures in the order a person works through them; a null figure does not apply. */
export const planFigures: readonly Figure[] = [
  { key: 'bsaM2', label: 'Body surface area', unit: 'm²' },
  { key: 'doseMg', label: 'Verteporfin dose', unit: 'mg', main: true },
  { key: 'drugVolumeMl', label: 'Drug volume', unit: 'mL', main: true },
  { key: 'drawnDoseMg', label: 'Dose in the drawn volume', unit: 'mg' },
  { key: 'drawnDoseDifferencePct', label: 'Drawn dose against the dose', unit: '%', signed: true },
  { key: 'vials', label: 'Vials', unit: '' },
  { key: 'drugLeftOverMl', label: 'Drug left over in the vials', unit: 'mL' },
  { key: 'drugLeftOverMg', label: 'Drug left over in the vials', unit: 'mg' },
  { key: 'diluentVolumeMl', label: 'Diluent volume', unit: 'mL' },
  { key: 'infusionRateMlPerMin', label: 'Infusion rate', unit: 'mL/min' },
  { key: 'infusionEndAfterStartS', label: 'Infusion ends after its start', unit: '', time: true },
  {
    key: 'lightStartAfterInfusionStartS',
    label: 'Light starts after infusion start',
    unit: '',
    time: true,
    main: true,
  },
  { key: 'spotDiameterUm', label: 'Spot on the retina', unit: 'µm' },
  { key: 'deviceSpotDiameterUm', label: 'Spot set on the laser', unit: 'µm', main: true },
  { key: 'spotAreaCm2', label: 'Spot area', unit: 'cm²' },
  { key: 'powerMw', label: 'Laser power', unit: 'mW', main: true },
  { key: 'irradianceMwPerCm2', label: 'Irradiance', unit: 'mW/cm²' },
  { key: 'exposureS', label: 'Exposure', unit: '', time: true, main: true },
  { key: 'uvTimeS', label: 'UV on-time', unit: '', time: true, main: true },
  { key: 'uvElapsedS', label: 'UV elapsed time', unit: '', time: true },
  { key: 'fluenceJPerCm2', label: 'Fluence', unit: 'J/cm²', main: true },
  { key: 'energyJ', label: 'Energy', unit: 'J' },
  {
    key: 'lightEndAfterInfusionStartS',
    label: 'Light ends after infusion start',
    unit: '',
    time: true,
  },
  {
    key: 'endothelialIrradianceMwPerCm2',
    label: 'Endothelial irradiance',
    unit: 'mW/cm²',
    estimate: true,
  },
  { key: 'endothelialDoseJPerCm2', label: 'Endothelial dose', unit: 'J/cm²', estimate: true },
];
